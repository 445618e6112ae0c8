package org.outstage.stimulus;

import java.util.SplittableRandom;

/**
 * TPDF dither at an output word length: the difference of two independent uniform values of one LSB each, so a
 * triangular density spanning ±1 LSB (Vanderkooy and Lipshitz, "Dither in digital audio", JAES 35(12), 1987: TPDF
 * removes the signal dependence of the first two moments of the requantisation error). The LSB is
 * {@code 2^−(bits−1)} of full scale, the step of {@code capture.WavWriter} and of the audio layer's encoder; add the
 * dither, then round. Float output needs no dither. Seeded, so a rendered file is reproducible. Not thread-safe:
 * one instance per stream.
 */
public final class Dither {
    private final SplittableRandom random;

    public Dither(long seed) { this.random = new SplittableRandom(seed); }

    /** One LSB in full-scale units for {@code bits}-bit integer samples. */
    public static double lsb(int bits) {
        if (bits < 2 || bits > 32) throw new IllegalArgumentException("bits=" + bits + " must be in [2, 32]");
        return Math.scalb(1.0, -(bits - 1));
    }

    /** One dither value in full-scale units for {@code bits}-bit output (range ±1 LSB, triangular). */
    public double next(int bits) {
        return (random.nextDouble() - random.nextDouble()) * lsb(bits);
    }

    /** Adds dither for {@code bits}-bit output to {@code samples[offset, offset+length)} in place. */
    public void apply(double[] samples, int offset, int length, int bits) {
        double q = lsb(bits);
        for (int i = offset; i < offset + length; i++) samples[i] += (random.nextDouble() - random.nextDouble()) * q;
    }
}
