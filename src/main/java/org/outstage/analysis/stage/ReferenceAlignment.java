package org.outstage.analysis.stage;

/**
 * Alignment of the generator (reference) channel to the amplifier output: output(t) ≈ gain·reference(t − delay).
 *
 * <p>Method: IEEE Std 1057-2017 three-parameter fits of both channels at the output's fitted frequency; the
 * delay is the difference of the fitted phases divided by 2πf, the gain the ratio of the fitted amplitudes.
 * For an exactly delayed sine this is exact to the fit's precision (far below 0.01 sample). The phase
 * difference is read within ±90°: an amplifier with a delay of more than a quarter period is taken as
 * inverting (a real amplifier delays by microseconds). The delay is the fundamental's phase delay, so it is
 * unaffected by distortion products.
 *
 * @param delaySeconds          delay of the output behind the reference
 * @param delaySamples          the same in samples (fractional)
 * @param gain                  output/reference amplitude ratio, negative when inverting
 * @param referenceAmplitudePeak fitted peak of the reference channel
 * @param referenceDistortionRatio residual RMS of the reference fit / fitted RMS (the generator's own THD+N)
 */
public record ReferenceAlignment(double delaySeconds, double delaySamples, double gain, double referenceAmplitudePeak,
                                 double referenceDistortionRatio) {
    /** True when the output is inverted relative to the reference. */
    public boolean inverting() { return gain < 0; }
}
