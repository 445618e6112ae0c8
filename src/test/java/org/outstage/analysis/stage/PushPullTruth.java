package org.outstage.analysis.stage;

/**
 * Test-only oracle: the exact incremental gain of the complementary emitter-follower pair of
 * {@link StageFixtures.Pair} (exponential law Ic = Is·exp(Vbe/VT), emitter resistors Re, load RL; docs/references.md §7),
 * by implicit differentiation of its node equation, not by any class of the project's model or analysis.
 *
 * <p>Node equation at the output v for a drive u: F(v, u) = In − Ip − v/RL = 0 with In = I(u + Vh − v),
 * Ip = I(v − u + Vh), and each device's I(w) solving Re·I + VT·ln(I/Is) = w, so dI/dw = 1/(Re + VT/I).
 * Implicit differentiation: dv/du = −(∂F/∂u)/(∂F/∂v) = (gn + gp)/(gn + gp + 1/RL) with gn = 1/(Re + VT/In),
 * gp = 1/(Re + VT/Ip). At u = 0 both devices idle at Iq and this is RL/(RL + (Re + VT/Iq)/2).
 */
public final class PushPullTruth {
    private PushPullTruth() {}

    /** The pair biased so that each emitter resistor carries Vq (Vq = Iq·Re); Vq = 0 is class B (Vbe = 0 at idle). */
    public static StageFixtures.Pair biasedAt(double vqVolts) {
        double re = 0.22, is = 1e-13;
        double iq = vqVolts > 0 ? vqVolts / re : is;
        return new StageFixtures.Pair(iq, re, 8.0, StageFixtures.VT_300K, is);
    }

    /**
     * Output samples for the drive A·cos(2πf·i/fs + phase), solved per sample by Newton's method on the log-currents
     * (wn, wp) = (ln(In/Is), ln(Ip/Is)) of the node equations Re·In + VT·wn = u + Vh − v, Re·Ip + VT·wp = v − u + Vh,
     * v = RL·(In − Ip), warm-started from the previous sample (steps limited to 2 nepers). Same equations as
     * {@link StageFixtures.Pair#out}, about ten times faster for a record.
     */
    public static double[] drive(StageFixtures.Pair p, int n, double fs, double f, double amplitude, double phase) {
        double is = p.isAmps(), re = p.reOhms(), vt = p.vt(), rl = p.loadOhms(), vh = p.halfBias();
        double wq = Math.log(p.iqAmps() / is), wn = wq, wp = wq;
        double[] y = new double[n];
        for (int i = 0; i < n; i++) {
            double u = amplitude * Math.cos(2 * Math.PI * f * i / fs + phase);
            for (int k = 0; k < 100; k++) {
                double in = is * Math.exp(wn), ip = is * Math.exp(wp), v = rl * (in - ip);
                double f1 = re * in + vt * wn - (u + vh - v), f2 = re * ip + vt * wp - (v - u + vh);
                double a11 = (re + rl) * in + vt, a12 = -rl * ip, a21 = -rl * in, a22 = (re + rl) * ip + vt;
                double det = a11 * a22 - a12 * a21;
                double dn = (f1 * a22 - f2 * a12) / det, dp = (a11 * f2 - a21 * f1) / det;
                dn = Math.max(-2, Math.min(2, dn));
                dp = Math.max(-2, Math.min(2, dp));
                wn -= dn;
                wp -= dp;
                if (Math.abs(dn) < 1e-13 && Math.abs(dp) < 1e-13) break;
            }
            y[i] = rl * is * (Math.exp(wn) - Math.exp(wp));
        }
        return y;
    }

    /** dv/du at drive u, by implicit differentiation (see the class comment). */
    static double incrementalGain(StageFixtures.Pair p, double u) {
        double v = p.out(u), vh = p.halfBias();
        double in = p.device(u + vh - v), ip = p.device(v - u + vh);
        double gn = 1 / (p.reOhms() + p.vt() / in), gp = 1 / (p.reOhms() + p.vt() / ip);
        return (gn + gp) / (gn + gp + 1 / p.loadOhms());
    }

    /**
     * Truth of gain_at_zero for a drive of peak a: the incremental gain at zero over the chord of the curve from
     * 50 % to 90 % of the swing, both sides averaged (the definition in docs/diagnosis.md §5). The ideal output
     * is proportional to the drive (the fundamental of an odd law is in phase with it), so the scale cancels.
     */
    static double gainAtZero(StageFixtures.Pair p, double a) {
        double chord = ((p.out(0.9 * a) - p.out(0.5 * a)) + (p.out(-0.5 * a) - p.out(-0.9 * a))) / (0.8 * a);
        return incrementalGain(p, 0) / chord;
    }

    /**
     * Truth of the verdict ratio when it reads the large-current asymptote (docs/diagnosis.md §5): with the local
     * gains g at 50 % and 90 % of the swing, 1/g = A + B/|v| gives A = (0.9/g(0.9a) − 0.5/g(0.5a))/0.4 and the ratio
     * is g(0)·A (the ideal output's scale cancels).
     */
    static double asymptoticRatio(StageFixtures.Pair p, double a) {
        double g5 = 0.5 * (incrementalGain(p, 0.5 * a) + incrementalGain(p, -0.5 * a));
        double g9 = 0.5 * (incrementalGain(p, 0.9 * a) + incrementalGain(p, -0.9 * a));
        return incrementalGain(p, 0) * (0.9 / g9 - 0.5 / g5) / 0.4;
    }

    /** Fundamental amplitude of out(a·cos θ) by the trapezoid rule over one period (spectrally exact for a smooth law). */
    static double fundamental(StageFixtures.Pair p, double a) {
        int k = 4096;
        double sum = 0;
        for (int i = 0; i < k; i++) {
            double th = 2 * Math.PI * i / k;
            sum += p.out(a * Math.cos(th)) * Math.cos(th);
        }
        return 2 * sum / k;
    }

    /**
     * Truth of notch_width for a drive of peak a (docs/diagnosis.md §5): the span of ideal output around zero where
     * |g(u)/chord − 1| exceeds tol, with g the incremental gain in drive units and the chord as in
     * {@link #gainAtZero}; the ideal output is the fundamental b1·cos, so drive u maps to ideal u·b1/a. The edge is
     * found by a scan outwards in steps of a/4000 and bisection; 0 when the gain at zero is within tol.
     */
    static double notchWidth(StageFixtures.Pair p, double a, double tol) {
        double chord = ((p.out(0.9 * a) - p.out(0.5 * a)) + (p.out(-0.5 * a) - p.out(-0.9 * a))) / (0.8 * a);
        java.util.function.DoubleUnaryOperator ex = u -> Math.abs(incrementalGain(p, u) / chord - 1) - tol;
        if (ex.applyAsDouble(0) <= 0) return 0;
        double step = a / 4000, lo = 0, hi = step;
        while (ex.applyAsDouble(hi) > 0 && hi < a) { lo = hi; hi += step; }
        for (int k = 0; k < 60; k++) {
            double mid = 0.5 * (lo + hi);
            if (ex.applyAsDouble(mid) > 0) lo = mid; else hi = mid;
        }
        return 2 * lo * fundamental(p, a) / a;
    }

    /**
     * Truth of notch_depth for a drive of peak a (docs/diagnosis.md §3 and §5): the largest |deviation from the best
     * line| for |ideal| ≤ 50 % of peak. The output over one period is out(a·cos θ) (each point solved by Newton's method
     * to 1e-15 relative, {@link StageFixtures.Pair#out}); the ideal is the fundamental b1·cos θ. The best line is the
     * count-weighted least squares of output on ideal over the (unclipped) swing: samples are uniform in θ, so it is
     * computed here on 4096 equally spaced θ (trapezoid rule, spectrally exact for a smooth periodic law), not assumed.
     * The extremum is bracketed by a scan of 2000 steps over |u| ≤ a/2 and refined by golden-section search to 1e-12 of
     * a; both signs of u are searched. Returns {depth, slope of the line, intercept of the line}.
     */
    static double[] notchDepth(StageFixtures.Pair p, double a) {
        int k = 4096;
        double b1 = fundamental(p, a), sw = 0, sx = 0, sy = 0, sxx = 0, sxy = 0;
        for (int i = 0; i < k; i++) {
            double th = 2 * Math.PI * i / k, xi = b1 * Math.cos(th), yi = p.out(a * Math.cos(th));
            sw++; sx += xi; sy += yi; sxx += xi * xi; sxy += xi * yi;
        }
        double mx = sx / sw, slope = (sxy / sw - mx * sy / sw) / (sxx / sw - mx * mx), icpt = sy / sw - slope * mx;
        // deviation as a function of the drive u (ideal x = u·b1/a)
        java.util.function.DoubleUnaryOperator dev = u -> Math.abs(p.out(u) - (slope * u * b1 / a + icpt));
        double best = 0;
        for (int sgn : new int[] {-1, 1}) {
            int steps = 2000;
            double h = 0.5 * a / steps, bestU = 0, bestD = -1;
            for (int i = 0; i <= steps; i++) {
                double d = dev.applyAsDouble(sgn * i * h);
                if (d > bestD) { bestD = d; bestU = i * h; }
            }
            double lo = Math.max(0, bestU - h), hi = Math.min(0.5 * a, bestU + h), g = (Math.sqrt(5) - 1) / 2;
            while (hi - lo > 1e-12 * a) {
                double c = hi - g * (hi - lo), d = lo + g * (hi - lo);
                if (dev.applyAsDouble(sgn * c) >= dev.applyAsDouble(sgn * d)) hi = d; else lo = c;
            }
            best = Math.max(best, Math.max(bestD, dev.applyAsDouble(sgn * 0.5 * (lo + hi))));
        }
        return new double[] {best, slope, icpt};
    }
}
