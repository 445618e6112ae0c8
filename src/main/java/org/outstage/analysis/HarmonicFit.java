package org.outstage.analysis;

/**
 * Multi-harmonic least-squares fit for short records: {@code y ≈ c + Σ_{k=1..H} (a_k cos kωt + b_k sin kωt)},
 * with ω refined by Gauss-Newton iteration (the IEEE 1057 four-parameter linearisation extended to all
 * harmonics: the extra column is {@code Σ_k k·t·(−a_k sin kωt + b_k cos kωt)}). This is the multiharmonic
 * sine-fit of P. Händel / the IEEE 1057 family (Pintelon &amp; Schoukens, "An improved sine-wave fitting
 * procedure for characterizing data acquisition channels", IEEE TIM 45(2), 1996). Fitting all harmonics
 * together removes the bias that harmonics put on a single-tone fit when the record holds only a few
 * cycles, where spectral lines would overlap.
 *
 * <p>Time is centred on the middle of the record. Normal equations are accumulated in one pass.
 */
final class HarmonicFit {
    final double frequencyHz;
    final double dc;
    final double[] amplitude; // index k = 1..H, peak
    final double[] phaseMid;  // cosine phase at the centre of the record, index k
    final double[] residual;
    final int iterations;
    final boolean converged;
    private final double sampleRate;

    private HarmonicFit(double fs, double f, double dc, double[] amp, double[] ph, double[] residual, int iterations, boolean converged) {
        this.sampleRate = fs;
        this.frequencyHz = f;
        this.dc = dc;
        this.amplitude = amp;
        this.phaseMid = ph;
        this.residual = residual;
        this.iterations = iterations;
        this.converged = converged;
    }

    int orders() { return amplitude.length - 1; }

    /** Phase (radians) of harmonic k's cosine at the first sample. */
    double phaseAtStart(int k) {
        double mid = (residual.length - 1) / 2.0;
        return phaseMid[k] - k * 2 * Math.PI * frequencyHz * mid / sampleRate;
    }

    static HarmonicFit fit(double[] y, double fs, double f0, int orders) {
        double f = f0;
        int n = y.length;
        double bin = fs / n;
        double[] x = solve(y, fs, f, orders, null);
        boolean converged = false;
        int it = 0;
        while (it < 30) {
            it++;
            double[] g = solve(y, fs, f, orders, x);
            double df = g[2 * orders + 1] / (2 * Math.PI);
            double limit = 0.1 * bin;
            if (Math.abs(df) > limit) df = Math.copySign(limit, df);
            double nf = f + df;
            if (!(nf > 0) || nf >= fs / 2) break;
            f = nf;
            x = java.util.Arrays.copyOf(g, 2 * orders + 1);   // the Gauss-Newton step also updates the linear terms
            if (Math.abs(df) < 1e-9 * bin) { converged = true; break; }
        }
        x = solve(y, fs, f, orders, null);
        double[] amp = new double[orders + 1];
        double[] ph = new double[orders + 1];
        for (int k = 1; k <= orders; k++) {
            double a = x[2 * k - 1], b = x[2 * k];
            amp[k] = Math.hypot(a, b);
            ph[k] = Math.atan2(-b, a);
        }
        double[] res = new double[n];
        double mid = (n - 1) / 2.0;
        double w = 2 * Math.PI * f / fs;
        for (int i = 0; i < n; i++) {
            double t = (i - mid) * w;
            double c1 = Math.cos(t), s1 = Math.sin(t);
            double ck = c1, sk = s1;
            double m = x[0];
            for (int k = 1; k <= orders; k++) {
                m += x[2 * k - 1] * ck + x[2 * k] * sk;
                double cn = ck * c1 - sk * s1;
                sk = sk * c1 + ck * s1;
                ck = cn;
            }
            res[i] = y[i] - m;
        }
        return new HarmonicFit(fs, f, x[0], amp, ph, res, it, converged);
    }

    /**
     * Linear fit (prev == null) with columns [1, cos ωt, sin ωt, …, cos Hωt, sin Hωt], or the Gauss-Newton
     * step (prev given) with the extra ω column; then the last entry is Δω in rad/s.
     */
    private static double[] solve(double[] y, double fs, double f, int orders, double[] prev) {
        int n = y.length;
        int p = 2 * orders + 1 + (prev != null ? 1 : 0);
        double[][] ata = new double[p][p];
        double[] aty = new double[p];
        double[] row = new double[p];
        double mid = (n - 1) / 2.0;
        double w = 2 * Math.PI * f / fs;
        double cd = Math.cos(w), sd = Math.sin(w);
        double c1 = 0, s1 = 0;
        for (int i = 0; i < n; i++) {
            double tt = (i - mid);
            if (i % 256 == 0) { c1 = Math.cos(w * tt); s1 = Math.sin(w * tt); }   // rotation recurrence, re-anchored
            row[0] = 1;
            double ck = c1, sk = s1;
            double d = 0;
            for (int k = 1; k <= orders; k++) {
                row[2 * k - 1] = ck;
                row[2 * k] = sk;
                if (prev != null) d += k * (tt / fs) * (-prev[2 * k - 1] * sk + prev[2 * k] * ck);
                double cn = ck * c1 - sk * s1;
                sk = sk * c1 + ck * s1;
                ck = cn;
            }
            if (prev != null) row[p - 1] = d;
            double cn1 = c1 * cd - s1 * sd;
            s1 = s1 * cd + c1 * sd;
            c1 = cn1;
            double yi = y[i];
            for (int a = 0; a < p; a++) {
                double ra = row[a];
                aty[a] += ra * yi;
                double[] ar = ata[a];
                for (int b = a; b < p; b++) ar[b] += ra * row[b];
            }
        }
        for (int a = 0; a < p; a++) for (int b = 0; b < a; b++) ata[a][b] = ata[b][a];
        return LeastSquares.solve(ata, aty);
    }
}
