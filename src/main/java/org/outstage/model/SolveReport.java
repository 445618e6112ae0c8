package org.outstage.model;

/**
 * What the solver did for one result.
 *
 * @param operatingPoints   operating points solved
 * @param newtonIterations  Newton iterations in all (including fallbacks)
 * @param subdividedSteps   continuation steps that needed sub-steps
 * @param gminStepping      operating points that needed gmin stepping
 * @param sourceStepping    operating points that needed source stepping
 */
public record SolveReport(int operatingPoints, int newtonIterations, int subdividedSteps, int gminStepping, int sourceStepping) {
    /** Mean Newton iterations per operating point. */
    public double iterationsPerPoint() { return operatingPoints == 0 ? 0 : (double) newtonIterations / operatingPoints; }

    SolveReport plus(SolveReport o) {
        return new SolveReport(operatingPoints + o.operatingPoints, newtonIterations + o.newtonIterations,
                subdividedSteps + o.subdividedSteps, gminStepping + o.gminStepping, sourceStepping + o.sourceStepping);
    }

    static SolveReport none() { return new SolveReport(0, 0, 0, 0, 0); }
}
