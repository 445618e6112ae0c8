package org.outstage.analysis.stage;

/**
 * Alignment of the generator (reference) channel to the amplifier output: output(t) ≈ gain·reference(t − delay).
 *
 * <p>Method: IEEE Std 1057-2017 three-parameter fits of both channels at the output's fitted frequency; the
 * delay is the difference of the fitted phases divided by 2πf, the gain the ratio of the fitted amplitudes.
 * For an exactly delayed sine this is exact to the fit's precision (far below 0.01 sample). The delay is the
 * fundamental's phase delay, so it is unaffected by distortion products. A steady sine cannot tell a delay
 * from the same delay plus whole periods, nor from half a period more with inversion; the cross-correlation of
 * the channels' non-periodic content (the generator's noise passed on by the amplifier; {@link BroadbandDelay},
 * Knapp &amp; Carter 1976) chooses among those candidates when it stands out, so delays beyond a quarter period
 * are read as delays. Without such evidence (a purely periodic capture) the phase difference is read within ±90°
 * and a larger one as an inverting amplifier.
 *
 * @param delaySeconds          delay of the output behind the reference
 * @param delaySamples          the same in samples (fractional)
 * @param gain                  output/reference amplitude ratio, negative when inverting
 * @param referenceAmplitudePeak fitted peak of the reference channel
 * @param referenceDistortionRatio residual RMS of the reference fit / fitted RMS (the generator's own THD+N)
 * @param correlationDelaySamples  delay read from the broadband cross-correlation peak (parabolic sub-sample
 *                                 refinement); NaN when the capture gave no such evidence
 * @param correlationSignificance  that peak over the robust standard deviation of the correlation (0 when none);
 *                                 it decided the period and the sign when at least 8
 */
public record ReferenceAlignment(double delaySeconds, double delaySamples, double gain, double referenceAmplitudePeak,
                                 double referenceDistortionRatio, double correlationDelaySamples,
                                 double correlationSignificance) {
    /** True when the broadband cross-correlation chose the period and sign of the delay. */
    public boolean resolvedByCorrelation() { return !Double.isNaN(correlationDelaySamples); }

    /** True when the output is inverted relative to the reference. */
    public boolean inverting() { return gain < 0; }
}
