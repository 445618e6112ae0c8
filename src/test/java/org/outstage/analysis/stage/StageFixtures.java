package org.outstage.analysis.stage;

import java.util.Random;
import java.util.function.DoubleUnaryOperator;

/** Shared synthetic signals and the exponential-law emitter-follower pair used as an oracle. */
public final class StageFixtures {
    private StageFixtures() {}

    /** Thermal voltage at 300 K from the exact 2019 SI constants (docs/references.md §7). */
    static final double VT_300K = 1.380649e-23 * 300 / 1.602176634e-19;

    /** n samples of amplitude·cos(2πft + phase) passed through {@code law}. */
    static double[] drive(int n, double fs, double f, double amplitude, double phase, DoubleUnaryOperator law) {
        double[] y = new double[n];
        for (int i = 0; i < n; i++) y[i] = law.applyAsDouble(amplitude * Math.cos(2 * Math.PI * f * i / fs + phase));
        return y;
    }

    /** Adds seeded white Gaussian noise of the given RMS. */
    static double[] noisy(double[] y, double rms, long seed) {
        Random rnd = new Random(seed);
        double[] out = y.clone();
        for (int i = 0; i < out.length; i++) out[i] += rms * rnd.nextGaussian();
        return out;
    }

    /** Rounds to a mid-tread quantiser of {@code bits} over ±fullScale. */
    static double[] quantise(double[] y, double fullScale, int bits) {
        double q = fullScale / Math.pow(2, bits - 1);
        double[] out = new double[y.length];
        for (int i = 0; i < y.length; i++) out[i] = Math.rint(y[i] / q) * q;
        return out;
    }

    static double clip(double v, double lo, double hi) { return Math.max(lo, Math.min(hi, v)); }

    static double deadZone(double v, double d) { return Math.abs(v) <= d ? 0 : v - Math.copySign(d, v); }

    /**
     * Complementary emitter-follower pair, exponential law Ic = Is·exp(Vbe/VT) (Sedra &amp; Smith; docs/references.md §7),
     * emitter resistors Re, load RL, bias set so that each device idles at Iq. Base currents neglected.
     * Solved per point by Newton with a bisection safeguard.
     */
    public record Pair(double iqAmps, double reOhms, double loadOhms, double vt, double isAmps) {
        static Pair of(double iqAmps) { return new Pair(iqAmps, 0.22, 8.0, VT_300K, 1e-13); }

        double halfBias() { return vt * Math.log(iqAmps / isAmps) + iqAmps * reOhms; }

        /** Device current for a branch drive u: Re·I + VT·ln(I/Is) = u. */
        double device(double u) {
            double lnIs = Math.log(isAmps);
            double w = Math.min(lnIs + u / vt, u > 0 ? Math.log(u / reOhms) : Double.POSITIVE_INFINITY);
            for (int k = 0; k < 200; k++) {
                double e = Math.exp(w);
                double f = reOhms * e + vt * (w - lnIs) - u;
                double dw = f / (reOhms * e + vt);
                w -= dw;
                if (Math.abs(dw) < 1e-14) break;
            }
            return Math.exp(w);
        }

        double out(double vin) {
            double vh = halfBias();
            double lo = -Math.abs(vin) - 2, hi = Math.abs(vin) + 2;
            double v = vin * loadOhms / (loadOhms + reOhms);
            for (int k = 0; k < 200; k++) {
                double in = device(vin + vh - v), ip = device(v - vin + vh);
                double g = in - ip - v / loadOhms;
                if (g > 0) lo = v; else hi = v;
                double dg = -1 / (reOhms + vt / in) - 1 / (reOhms + vt / ip) - 1 / loadOhms;
                double nv = v - g / dg;
                if (!(nv > lo && nv < hi)) nv = 0.5 * (lo + hi);
                if (Math.abs(nv - v) < 1e-15 * Math.max(1, Math.abs(v))) { v = nv; break; }
                v = nv;
            }
            return v;
        }

        /** Exact small-signal gain at zero: both halves conduct at Iq, Zout = (Re + VT/Iq)/2. */
        double gainAtZero() { return loadOhms / (loadOhms + (reOhms + vt / iqAmps) / 2); }

        /** Truth of gain_at_zero for drive amplitude a: g(0)·0.4a/(y(0.9a) − y(0.5a)) (ideal ∝ drive). */
        double gainAtZeroRatio(double a) {
            double outer = ((out(0.9 * a) - out(0.5 * a)) + (out(-0.5 * a) - out(-0.9 * a))) / (0.8 * a);
            return gainAtZero() / outer;
        }
    }

    static double oliverAmps() { return VT_300K / 0.22; }
}
