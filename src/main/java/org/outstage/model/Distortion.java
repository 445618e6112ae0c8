package org.outstage.model;

/**
 * Predicted harmonic distortion at one output level: the static transfer curve driven with a sine of
 * {@link StageModel#SAMPLES_PER_CYCLE} points per cycle, the output transformed by a DFT (radix-2 FFT,
 * Cooley and Tukey 1965). THD = sqrt(Σ_{h≥2} A_h²)/A_1 over harmonics 2 … N/2−1 (harmonics above N/2
 * alias into these bins; for a smooth curve they are negligible).
 *
 * @param outputPeakVolts   peak of the output fundamental (the level asked for)
 * @param inputPeakVolts    the drive amplitude that gives it
 * @param harmonicRatios    A_h/A_1 for h = 0 … N/2−1 (index = harmonic number; [0] is the DC term / A_1, [1] = 1)
 * @param thd               THD as a fraction
 */
public record Distortion(double outputPeakVolts, double inputPeakVolts, double[] harmonicRatios, double thd) {
    public Distortion { harmonicRatios = harmonicRatios.clone(); }

    @Override public double[] harmonicRatios() { return harmonicRatios.clone(); }

    /** A_h/A_1 for harmonic h (1-based; 1 gives 1). */
    public double harmonic(int h) { return harmonicRatios[h]; }
}
