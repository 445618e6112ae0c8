package org.outstage.analysis;

/**
 * Result of a sine fit: {@code y(t) = amplitudePeak·cos(2π·frequencyHz·t + phaseRadians) + dcOffset},
 * with t = 0 at the first sample. Values are in the capture's unit.
 *
 * @param frequencyHz     fitted frequency
 * @param amplitudePeak   peak amplitude (RMS is {@code amplitudePeak/√2})
 * @param phaseRadians    phase of the cosine at the first sample, in (−π, π]
 * @param dcOffset        fitted constant term
 * @param residualRms     RMS of the record minus the fitted sine (IEEE 1241 "NAD", noise and distortion)
 * @param iterations      iterations the four-parameter fit took (0 for a three-parameter fit)
 * @param converged       whether the frequency update fell below tolerance within the budget
 */
public record SineFit(double frequencyHz, double amplitudePeak, double phaseRadians, double dcOffset,
                      double residualRms, int iterations, boolean converged) {

    /** RMS of the fitted sine. */
    public double rms() { return amplitudePeak / Math.sqrt(2.0); }

    /** Value of the fitted sine (with DC) at time {@code tSeconds} from the first sample. */
    public double valueAt(double tSeconds) {
        return amplitudePeak * Math.cos(2 * Math.PI * frequencyHz * tSeconds + phaseRadians) + dcOffset;
    }
}
