package org.outstage.analysis;

/**
 * Frequency weighting applied to the noise and distortion of THD+N (never to the fundamental, never to
 * THD or the harmonic list).
 *
 * <p>{@link #A} is the analytic A-weighting of IEC 61672-1:2013, Annex E (equations E.1, E.6), with
 * poles f1, f4 derived from the design constants fL = 10^1.5 Hz, fH = 10^3.9 Hz, D = √½ and f2, f3 from
 * fA = 10^2.45 Hz, and the normalisation computed exactly so that the gain at 1 kHz is 0.000 dB (the
 * printed constant −2.000 dB is a rounding of −1.99966 dB).
 */
public enum Weighting {
    /** No weighting: gain 1 at every frequency. */
    NONE,
    /** IEC 61672-1 A-weighting (analytic, Annex E). */
    A;

    private static final double F1, F2, F3, F4, A_NORM;

    static {
        // IEC 61672-1:2013 Annex E, E.2–E.5: design constants and pole frequencies.
        double fr = 1000, fl = Math.pow(10, 1.5), fh = Math.pow(10, 3.9), fa = Math.pow(10, 2.45), d = Math.sqrt(0.5);
        double b = (1 / (1 - d)) * (fr * fr + fl * fl * fh * fh / (fr * fr) - d * (fl * fl + fh * fh));
        double c = fl * fl * fh * fh;
        F1 = Math.sqrt((-b - Math.sqrt(b * b - 4 * c)) / 2);
        F4 = Math.sqrt((-b + Math.sqrt(b * b - 4 * c)) / 2);
        F2 = (3 - Math.sqrt(5)) / 2 * fa;
        F3 = (3 + Math.sqrt(5)) / 2 * fa;
        A_NORM = 1 / rawA(1000);
    }

    private static double rawA(double f) {
        double f2 = f * f;
        return F4 * F4 * f2 * f2 / ((f2 + F1 * F1) * Math.sqrt(f2 + F2 * F2) * Math.sqrt(f2 + F3 * F3) * (f2 + F4 * F4));
    }

    /** Linear amplitude gain at {@code frequencyHz} (1 at 1 kHz for A). */
    public double gainAt(double frequencyHz) {
        if (this == NONE) return 1.0;
        return rawA(Math.abs(frequencyHz)) * A_NORM;
    }

    /** Gain in dB at {@code frequencyHz}. */
    public double db(double frequencyHz) {
        return 20 * Math.log10(gainAt(frequencyHz));
    }

    /** The pole frequencies f1, f2, f3, f4 in Hz (for documentation and tests). */
    static double[] polesHz() { return new double[] {F1, F2, F3, F4}; }
}
