package org.outstage.model;

import org.outstage.Require;

/**
 * Tolerances and budget for the solver (passed in; the solver keeps no state between calls).
 *
 * @param voltageToleranceVolts    a Newton solve has converged when a full (undamped) step moves no node by more than this
 * @param maxIterationsPerSolve    Newton iterations allowed for one operating point before the fallbacks start
 * @param maxJunctionStepVolts     largest change of a forward-biased junction voltage in one Newton step (damping)
 * @param maxSubdivisionLevels     continuation: a failed input step is retried in 2, 4, ... 2^levels sub-steps
 */
public record SolverSettings(double voltageToleranceVolts, int maxIterationsPerSolve, double maxJunctionStepVolts, int maxSubdivisionLevels) {
    public SolverSettings {
        Require.positive("voltageToleranceVolts", voltageToleranceVolts);
        Require.positive("maxIterationsPerSolve", maxIterationsPerSolve);
        Require.positive("maxJunctionStepVolts", maxJunctionStepVolts);
        Require.atLeast("maxSubdivisionLevels", maxSubdivisionLevels, 0);
    }

    /** 1 nV, 100 iterations, 0.2 V junction step, up to 64 sub-steps. */
    public static SolverSettings defaults() { return new SolverSettings(1e-9, 100, 0.2, 6); }
}
