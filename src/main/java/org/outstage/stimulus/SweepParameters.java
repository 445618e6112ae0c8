package org.outstage.stimulus;

/**
 * What an analysis needs to rebuild an exponential sweep and its inverse filter (Farina, "Simultaneous measurement
 * of impulse response and distortion with a swept-sine technique", AES 108th Convention, 2000, preprint 5093;
 * docs/references.md §13).
 *
 * <p>The sweep is {@code x(t) = sin(2π·f1·L·(exp(t/L) − 1))} for {@code 0 ≤ t < T}, with the rate
 * {@code L = T / ln(f2/f1)} in seconds (the time the instantaneous frequency {@code f1·exp(t/L)} takes to grow by a
 * factor e). In the notation of docs/references.md §13, {@code L_there = ln(f2/f1) = T / L_here}. The inverse
 * filter is the time-reversed sweep with the envelope {@code exp(−t/L)} (−6 dB/octave), normalised so that a
 * straight wire gives 0 dB; the N-th harmonic's response appears {@code L·ln(N)} seconds before the linear one.
 *
 * <p>Fades: a half-Hann rise over {@link #fadeInSeconds} at the start and a half-Hann fall over
 * {@link #fadeOutSeconds} at the end (common practice: they keep the sweep's spectrum from splattering at its ends).
 *
 * @param sampleRateHz   sample rate of the rendered sweep
 * @param startHz        f1
 * @param endHz          f2
 * @param lengthSeconds  T, the length of one sweep (it repeats when played longer)
 * @param rateSeconds    L = T / ln(f2/f1)
 * @param fadeInSeconds  half-Hann fade-in length: min(T/20, 0.1 s)
 * @param fadeOutSeconds half-Hann fade-out length: min(T/100, 0.01 s)
 * @param peakAmplitude  peak amplitude in full-scale units (10^(level/20))
 */
public record SweepParameters(double sampleRateHz, double startHz, double endHz, double lengthSeconds, double rateSeconds,
                              double fadeInSeconds, double fadeOutSeconds, double peakAmplitude) {
    public SweepParameters {
        positive("sampleRateHz", sampleRateHz);
        positive("startHz", startHz);
        positive("endHz", endHz);
        positive("lengthSeconds", lengthSeconds);
        positive("rateSeconds", rateSeconds);
        if (!(fadeInSeconds >= 0 && fadeOutSeconds >= 0 && fadeInSeconds + fadeOutSeconds <= lengthSeconds))
            throw new IllegalArgumentException("fades " + fadeInSeconds + " s + " + fadeOutSeconds + " s must fit the sweep length " + lengthSeconds + " s");
        if (!(endHz > startHz)) throw new IllegalArgumentException("endHz=" + endHz + " must be above startHz=" + startHz);
        if (!(peakAmplitude >= 0 && Double.isFinite(peakAmplitude))) throw new IllegalArgumentException("peakAmplitude=" + peakAmplitude + " must be >= 0");
    }

    /** The parameters of a sweep from {@code startHz} to {@code endHz} lasting {@code lengthSeconds}, with the fades stated above. */
    public static SweepParameters of(double sampleRateHz, double startHz, double endHz, double lengthSeconds, double peakAmplitude) {
        positive("startHz", startHz);
        positive("lengthSeconds", lengthSeconds);
        if (!(endHz > startHz)) throw new IllegalArgumentException("endHz=" + endHz + " must be above startHz=" + startHz);
        double rate = lengthSeconds / Math.log(endHz / startHz);
        return new SweepParameters(sampleRateHz, startHz, endHz, lengthSeconds, rate,
                Math.min(lengthSeconds / 20, 0.1), Math.min(lengthSeconds / 100, 0.01), peakAmplitude);
    }

    /** Instantaneous frequency {@code f1·exp(t/L)} at {@code tSeconds} from the start of the sweep. */
    public double frequencyAtHz(double tSeconds) { return startHz * Math.exp(tSeconds / rateSeconds); }

    /** Phase in cycles, {@code f1·L·(exp(t/L) − 1)}, at {@code tSeconds}; its derivative is {@link #frequencyAtHz}. */
    public double phaseCycles(double tSeconds) { return startHz * rateSeconds * Math.expm1(tSeconds / rateSeconds); }

    /** Fade envelope (0..1) at {@code tSeconds}: half-Hann rise, flat, half-Hann fall. */
    public double envelope(double tSeconds) {
        if (tSeconds < 0 || tSeconds >= lengthSeconds) return 0;
        if (fadeInSeconds > 0 && tSeconds < fadeInSeconds) return 0.5 * (1 - Math.cos(Math.PI * tSeconds / fadeInSeconds));
        double toEnd = lengthSeconds - tSeconds;
        if (fadeOutSeconds > 0 && toEnd < fadeOutSeconds) return 0.5 * (1 - Math.cos(Math.PI * toEnd / fadeOutSeconds));
        return 1;
    }

    /** Delay, in seconds before the linear response, at which the N-th harmonic's response appears: {@code L·ln(N)}. */
    public double harmonicAdvanceSeconds(int order) {
        if (order < 1) throw new IllegalArgumentException("order=" + order + " must be 1 or more");
        return rateSeconds * Math.log(order);
    }

    private static void positive(String name, double v) {
        if (!(v > 0 && Double.isFinite(v))) throw new IllegalArgumentException(name + "=" + v + " must be a positive number");
    }
}
