package org.outstage.analysis;

import org.outstage.Require;

/**
 * Sine-wave fitting after IEEE Std 1057-2017 (clause 4.1.3, three-parameter fit with known frequency,
 * and 4.1.4, four-parameter fit with iterated frequency), as also used by IEEE Std 1241-2010 for
 * SINAD and ENOB.
 *
 * <p>Method: the record is modelled as {@code A·cos ωt + B·sin ωt + C}. The three-parameter fit solves
 * that linear least-squares problem. The four-parameter fit starts from a coarse spectral peak,
 * linearises in ω (adding the column {@code t·(−A sin ωt + B cos ωt)}) and iterates the update of ω.
 * Time is centred on the middle of the record so the normal equations stay well conditioned on
 * records of millions of samples; the normal equations are accumulated in one pass (no N×4 matrix).
 * Sines and cosines come from a rotation recurrence re-anchored every 256 samples (error below 1e-13).
 *
 * <p>Assumptions: one dominant sinusoid; the record spans at least about one cycle (the standard notes
 * that the four-parameter fit can fail on a fraction of a period). Pure functions, thread-safe.
 *
 * <p>Worked example (replayed in {@code SineFitterTest}): 96 kHz, 2.5 s of
 * {@code 0.5·cos(2π·997.3·t + 0.3) + 0.01} comes back as 997.3 Hz, 0.5, 0.3 rad, 0.01.
 */
public final class SineFitter {
    private static final int ANCHOR = 256;
    private static final int MAX_ITERATIONS = 30;
    /** Consecutive frequency steps at the quarter-bin limit after which the iteration gives up (two bins walked). */
    private static final int MAX_CLAMPED_STEPS = 8;

    private SineFitter() {}

    /** Coarse estimate then four-parameter fit. */
    public static SineFit fit(double[] samples, double sampleRateHz) {
        return fourParameter(samples, sampleRateHz, coarseFrequency(samples, sampleRateHz));
    }

    /**
     * Coarse frequency of the strongest spectral line (Hann window, quadratic interpolation of the
     * log-magnitude peak; at most the first 2^20 samples are used). DC and the first bin are ignored.
     */
    public static double coarseFrequency(double[] samples, double sampleRateHz) {
        return coarseFrequency(samples, sampleRateHz, 0, Double.POSITIVE_INFINITY);
    }

    /**
     * As {@link #coarseFrequency(double[], double)}, but the strongest line between {@code loHz} and
     * {@code hiHz} (used with a frequency hint: the line nearest the hint, not the strongest overall).
     */
    static double coarseFrequency(double[] samples, double sampleRateHz, double loHz, double hiHz) {
        Require.positive("sampleRateHz", sampleRateHz);
        Require.atLeast("samples.length", samples.length, 8);
        return coarseFrequency(HannSpectrum.of(samples, Math.min(samples.length, 1 << 20)), sampleRateHz, loHz, hiHz);
    }

    /** As {@link #coarseFrequency(double[], double, double, double)}, from the Hann spectrum of the samples. */
    static double coarseFrequency(HannSpectrum h, double sampleRateHz, double loHz, double hiHz) {
        int n = h.length();
        int bins = n / 2;
        double[] mag = new double[bins + 1];
        // |X| as √(re² + im²): audio spectra are far from overflow, so the slower overflow-safe hypot is not needed
        for (int k = 1; k < bins; k++) mag[k] = Math.sqrt(h.power(k));
        mag[bins] = h.lastMagnitude();
        int kLo = Math.max(2, (int) Math.floor(loHz * n / sampleRateHz));
        int kHi = (int) Math.min(bins - 1, Math.ceil(Math.min(hiHz, sampleRateHz) * n / sampleRateHz));
        if (kHi < kLo) { kLo = 2; kHi = bins - 1; }
        int best = kLo;
        for (int k = kLo; k <= kHi; k++) if (mag[k] > mag[best]) best = k;
        if (best < 2 || mag[best] == 0) return sampleRateHz / n;
        double a = Math.log(mag[best - 1] + 1e-300), b = Math.log(mag[best] + 1e-300), c = Math.log(mag[best + 1] + 1e-300);
        double den = a - 2 * b + c;
        double delta = den == 0 ? 0 : 0.5 * (a - c) / den;
        if (!Double.isFinite(delta) || Math.abs(delta) > 1) delta = 0;
        return (best + delta) * sampleRateHz / n;
    }

    /** Three-parameter fit at a known frequency (IEEE 1057 clause 4.1.3). */
    public static SineFit threeParameter(double[] y, double sampleRateHz, double frequencyHz) {
        Require.positive("sampleRateHz", sampleRateHz);
        Require.positive("frequencyHz", frequencyHz);
        Require.atLeast("samples.length", y.length, 4);
        double[] abc = solve(y, sampleRateHz, frequencyHz, false, 0, 0);
        return finish(y, sampleRateHz, frequencyHz, abc, 0, true);
    }

    /**
     * Four-parameter fit (IEEE 1057 clause 4.1.4) from an initial frequency. The frequency step is
     * limited to a quarter of a spectral bin per iteration; if the iteration does not settle, the fit is
     * restarted from a few neighbouring start values and the one with the smallest residual wins.
     */
    public static SineFit fourParameter(double[] y, double sampleRateHz, double initialFrequencyHz) {
        Require.positive("sampleRateHz", sampleRateHz);
        Require.positive("initialFrequencyHz", initialFrequencyHz);
        Require.atLeast("samples.length", y.length, 8);
        double bin = sampleRateHz / y.length;
        SineFit best = iterate(y, sampleRateHz, initialFrequencyHz, bin);
        if (!best.converged()) {
            for (double off : new double[] {-0.3, 0.3, -0.6, 0.6}) {
                double f0 = initialFrequencyHz + off * bin;
                if (f0 <= 0) continue;
                SineFit alt = iterate(y, sampleRateHz, f0, bin);
                if (alt.converged() && (!best.converged() || alt.residualRms() < best.residualRms())) best = alt;
            }
        }
        return best;
    }

    /**
     * Four-parameter fit with each sample weighted by a window (weighted least squares). The window's low
     * sidelobes keep other spectral lines (harmonics, hum, a second tone) from biasing the frequency, which
     * an unweighted fit on a non-integer number of cycles suffers from. The residual and DC of the result
     * are those of the unweighted three-parameter fit at the found frequency. Package-private: used by
     * {@link Analyzer} on long records.
     */
    static SineFit fourParameterWeighted(double[] y, double sampleRateHz, double initialFrequencyHz, double[] weights) {
        if (weights.length != y.length) throw new IllegalArgumentException("weights.length=" + weights.length + " must equal samples.length=" + y.length);
        return iterate(y, sampleRateHz, initialFrequencyHz, sampleRateHz / y.length, weights);
    }

    private static SineFit iterate(double[] y, double fs, double f0, double bin) {
        return iterate(y, fs, f0, bin, null);
    }

    private static SineFit iterate(double[] y, double fs, double f0, double bin, double[] wt) {
        double f = f0;
        double[] abc = solve(y, fs, f, false, 0, 0, wt);
        boolean converged = false;
        int it = 0, clamped = 0;
        while (it < MAX_ITERATIONS) {
            it++;
            double[] x = solve(y, fs, f, true, abc[0], abc[1], wt);
            double dOmega = x[3];
            double df = dOmega / (2 * Math.PI);
            double limit = 0.25 * bin;
            if (Math.abs(df) > limit) {
                df = Math.copySign(limit, df);
                // a start within a fraction of a bin needs a few full steps at most; walking further finds no line
                // near the start (a sweep or noise), and the remaining iterations would not settle either
                if (++clamped > MAX_CLAMPED_STEPS) break;
            } else {
                clamped = 0;
            }
            f += df;
            if (!(f > 0) || f >= fs / 2) break;
            abc = new double[] {x[0], x[1], x[2]};
            if (Math.abs(df) < 1e-9 * bin + 1e-12 * f) { converged = true; break; }
        }
        if (!(f > 0) || f >= fs / 2) f = f0;
        abc = solve(y, fs, f, false, 0, 0);
        return finish(y, fs, f, abc, it, converged);
    }

    /**
     * Accumulates and solves the normal equations on centred time. With {@code four} the fourth
     * column is t·(−a·sin ωt + b·cos ωt) and the result's 4th entry is Δω (rad/s).
     */
    private static double[] solve(double[] y, double fs, double f, boolean four, double a, double b) {
        return solve(y, fs, f, four, a, b, null);
    }

    private static double[] solve(double[] y, double fs, double f, boolean four, double a, double b, double[] wt) {
        int n = y.length;
        int p = four ? 4 : 3;
        double[][] ata = new double[p][p];
        double[] aty = new double[p];
        double mid = (n - 1) / 2.0;
        double omega = 2 * Math.PI * f;
        double dPhi = omega / fs;
        double cd = Math.cos(dPhi), sd = Math.sin(dPhi);
        double s00 = 0, s01 = 0, s02 = 0, s03 = 0, s11 = 0, s12 = 0, s13 = 0, s22 = 0, s23 = 0, s33 = 0;
        double r0 = 0, r1 = 0, r2 = 0, r3 = 0;
        double invFs = 1 / fs;
        // blocks of ANCHOR samples, each re-anchored with Math.cos/sin; inside a block the rotation recurrence.
        // The four loop bodies are the same sums, split so the loops carry no per-sample branch.
        for (int start = 0; start < n; start += ANCHOR) {
            int end = Math.min(n, start + ANCHOR);
            double ph = dPhi * (start - mid);
            double c = Math.cos(ph), s = Math.sin(ph);
            if (!four && wt == null) {
                for (int i = start; i < end; i++) {
                    double yi = y[i];
                    s00 += c * c; s01 += c * s; s02 += c; s11 += s * s; s12 += s;
                    r0 += c * yi; r1 += s * yi; r2 += yi;
                    double cn = c * cd - s * sd;
                    s = s * cd + c * sd;
                    c = cn;
                }
                s22 += end - start;
            } else if (!four) {
                for (int i = start; i < end; i++) {
                    double yi = y[i], wi = wt[i];
                    double cw = c * wi, sw = s * wi;
                    s00 += cw * c; s01 += cw * s; s02 += cw; s11 += sw * s; s12 += sw; s22 += wi;
                    r0 += cw * yi; r1 += sw * yi; r2 += wi * yi;
                    double cn = c * cd - s * sd;
                    s = s * cd + c * sd;
                    c = cn;
                }
            } else if (wt == null) {
                for (int i = start; i < end; i++) {
                    double yi = y[i];
                    double d = (i - mid) * invFs * (-a * s + b * c);
                    s00 += c * c; s01 += c * s; s02 += c; s11 += s * s; s12 += s;
                    r0 += c * yi; r1 += s * yi; r2 += yi;
                    s03 += c * d; s13 += s * d; s23 += d; s33 += d * d; r3 += d * yi;
                    double cn = c * cd - s * sd;
                    s = s * cd + c * sd;
                    c = cn;
                }
                s22 += end - start;
            } else {
                for (int i = start; i < end; i++) {
                    double yi = y[i], wi = wt[i];
                    double cw = c * wi, sw = s * wi;
                    double d = (i - mid) * invFs * (-a * s + b * c);
                    double dw = d * wi;
                    s00 += cw * c; s01 += cw * s; s02 += cw; s11 += sw * s; s12 += sw; s22 += wi;
                    r0 += cw * yi; r1 += sw * yi; r2 += wi * yi;
                    s03 += cw * d; s13 += sw * d; s23 += dw; s33 += dw * d; r3 += dw * yi;
                    double cn = c * cd - s * sd;
                    s = s * cd + c * sd;
                    c = cn;
                }
            }
        }
        ata[0][0] = s00; ata[0][1] = s01; ata[0][2] = s02;
        ata[1][0] = s01; ata[1][1] = s11; ata[1][2] = s12;
        ata[2][0] = s02; ata[2][1] = s12; ata[2][2] = s22;
        aty[0] = r0; aty[1] = r1; aty[2] = r2;
        if (four) {
            ata[0][3] = ata[3][0] = s03;
            ata[1][3] = ata[3][1] = s13;
            ata[2][3] = ata[3][2] = s23;
            ata[3][3] = s33;
            aty[3] = r3;
        }
        return LeastSquares.solve(ata, aty);
    }

    private static SineFit finish(double[] y, double fs, double f, double[] abc, int iterations, boolean converged) {
        int n = y.length;
        double mid = (n - 1) / 2.0;
        double a = abc[0], b = abc[1], dc = abc[2];
        double amp = Math.hypot(a, b);
        double thetaMid = Math.atan2(-b, a);
        double theta0 = thetaMid - 2 * Math.PI * f * mid / fs;
        theta0 = Math.IEEEremainder(theta0, 2 * Math.PI);
        double dPhi = 2 * Math.PI * f / fs;
        double cd = Math.cos(dPhi), sd = Math.sin(dPhi);
        double ss = 0;
        for (int start = 0; start < n; start += ANCHOR) {
            int end = Math.min(n, start + ANCHOR);
            double ph = dPhi * (start - mid);
            double c = Math.cos(ph), s = Math.sin(ph);
            for (int i = start; i < end; i++) {
                double r = y[i] - (a * c + b * s + dc);
                ss += r * r;
                double cn = c * cd - s * sd;
                s = s * cd + c * sd;
                c = cn;
            }
        }
        return new SineFit(f, amp, theta0, dc, Math.sqrt(ss / n), iterations, converged);
    }
}
