package org.outstage.model;

import java.util.LinkedHashMap;
import java.util.Locale;
import java.util.Map;

/**
 * Damped Newton on the KCL equations of a {@link Circuit}, with continuation along the input and a ladder of
 * fallbacks: (1) Newton from the previous point; (2) the step split into 2, 4, ... sub-steps; (3) gmin
 * stepping (a shunt conductance from every node to ground, 10 mS down to 1 pS, then removed); (4) source
 * stepping (rails, bias and input scaled up from 5 % to 100 %). Junction-voltage step limiting as in SPICE
 * (a forward-biased junction moves at most {@link SolverSettings#maxJunctionStepVolts()} per step).
 * One instance per call: not shared between threads.
 */
final class Solver {
    final Circuit c;
    final SolverSettings s;
    double biasVolts;
    /**
     * Input offset added to every input: the drive that holds the output at 0 V at rest, as an amplifier's global
     * feedback (or DC servo) does. Inputs given to the solver are relative to it.
     */
    double inputOffsetVolts;
    private final int n, m;
    private final double[] f, j, work, a, rhs, dx;
    private final int[] piv;
    private final double driveLimit;
    int iterations, points, subdivided, gminUsed, sourceUsed;

    Solver(Circuit c, SolverSettings s, double biasVolts, double inputOffsetVolts) {
        this(c, s, biasVolts);
        this.inputOffsetVolts = inputOffsetVolts;
    }

    Solver(Circuit c, SolverSettings s, double biasVolts) {
        this.c = c;
        this.s = s;
        this.biasVolts = biasVolts;
        this.n = c.nodeCount();
        this.m = c.unknownCount();
        f = new double[n];
        j = new double[n * n];
        work = new double[5];
        a = new double[m * m];
        rhs = new double[m];
        dx = new double[m];
        piv = new int[m];
        driveLimit = c.params.railVolts() - c.params.driveSaturationVolts();
    }

    SolveReport report() { return new SolveReport(points, iterations, subdivided, gminUsed, sourceUsed); }

    /** Sets the fixed node voltages for input vin with all sources scaled by lambda. */
    void setFixed(double[] v, double vin, double lambda) {
        v[Circuit.GND] = 0;
        v[Circuit.VPOS] = lambda * c.params.railVolts();
        v[Circuit.VNEG] = -lambda * c.params.railVolts();
        double x = vin + inputOffsetVolts;
        v[Circuit.DRIVE_TOP] = lambda * Math.min(x + biasVolts / 2, driveLimit);
        v[Circuit.DRIVE_BOTTOM] = lambda * Math.max(x - biasVolts / 2, -driveLimit);
    }

    /** Newton at the fixed voltages already in v. Returns true on convergence; v holds the result. */
    boolean newton(double[] v, double gshunt) {
        for (int it = 0; it < s.maxIterationsPerSolve(); it++) {
            iterations++;
            c.assemble(v, gshunt, f, j, work);
            for (int r = 0; r < m; r++) {
                int row = (r + Circuit.FIRST_UNKNOWN) * n + Circuit.FIRST_UNKNOWN;
                System.arraycopy(j, row, a, r * m, m);
                rhs[r] = -f[r + Circuit.FIRST_UNKNOWN];
            }
            if (!solveLinear()) return false;
            double alpha = 1;
            for (Circuit.Bjt q : c.bjts) {
                double sg = q.npn() ? 1 : -1;
                double vbe = sg * (v[q.b()] - v[q.e()]);
                double dvbe = sg * (delta(q.b()) - delta(q.e()));
                if (vbe + dvbe > 0.3 && Math.abs(dvbe) > s.maxJunctionStepVolts())
                    alpha = Math.min(alpha, s.maxJunctionStepVolts() / Math.abs(dvbe));
            }
            double maxStep = 0;
            for (int k = 0; k < m; k++) {
                double d = alpha * dx[k];
                if (!Double.isFinite(d)) return false;
                v[k + Circuit.FIRST_UNKNOWN] += d;
                maxStep = Math.max(maxStep, Math.abs(d));
            }
            if (alpha == 1 && maxStep <= s.voltageToleranceVolts()) return true;
        }
        return false;
    }

    private double delta(int node) { return node >= Circuit.FIRST_UNKNOWN ? dx[node - Circuit.FIRST_UNKNOWN] : 0; }

    /** Gaussian elimination with partial pivoting on a (m×m) and rhs; solution in dx. */
    private boolean solveLinear() {
        for (int k = 0; k < m; k++) piv[k] = k;
        for (int col = 0; col < m; col++) {
            int best = col;
            double bv = Math.abs(a[col * m + col]);
            for (int r = col + 1; r < m; r++) {
                double x = Math.abs(a[r * m + col]);
                if (x > bv) { bv = x; best = r; }
            }
            if (!(bv > 0)) return false;
            if (best != col) {
                for (int k = 0; k < m; k++) {
                    double t = a[col * m + k]; a[col * m + k] = a[best * m + k]; a[best * m + k] = t;
                }
                double t = rhs[col]; rhs[col] = rhs[best]; rhs[best] = t;
            }
            double p = a[col * m + col];
            for (int r = col + 1; r < m; r++) {
                double fct = a[r * m + col] / p;
                if (fct == 0) continue;
                for (int k = col; k < m; k++) a[r * m + k] -= fct * a[col * m + k];
                rhs[r] -= fct * rhs[col];
            }
        }
        for (int r = m - 1; r >= 0; r--) {
            double sum = rhs[r];
            for (int k = r + 1; k < m; k++) sum -= a[r * m + k] * dx[k];
            dx[r] = sum / a[r * m + r];
        }
        return true;
    }

    /**
     * Solves at vin starting from {@code from} (an operating point at {@code fromVin}); returns a new array.
     * Walks the fallback ladder; throws {@link SolverFailureException} when all fail.
     */
    double[] solve(double vin, double fromVin, double[] from) { return solve(vin, fromVin, from, null); }

    /** As {@link #solve(double, double, double[])}, with Newton started from {@code guess} (a predictor) when given. */
    double[] solve(double vin, double fromVin, double[] from, double[] guess) {
        points++;
        double[] v = (guess != null ? guess : from).clone();
        setFixed(v, vin, 1);
        if (newton(v, 0)) return v;
        // (2) continuation in sub-steps
        for (int level = 1; level <= s.maxSubdivisionLevels(); level++) {
            int steps = 1 << level;
            double[] w = from.clone();
            boolean ok = true;
            for (int k = 1; k <= steps && ok; k++) {
                double x = fromVin + (vin - fromVin) * k / steps;
                setFixed(w, x, 1);
                ok = newton(w, 0);
            }
            if (ok) { subdivided++; return w; }
        }
        // (3) gmin stepping from the starting point
        double[] w = from.clone();
        setFixed(w, vin, 1);
        boolean ok = true;
        for (double g = 1e-2; g >= 1e-12 && ok; g /= 10) ok = newton(w, g);
        if (ok && newton(w, 0)) { gminUsed++; return w; }
        // (4) source stepping from all-zero node voltages
        w = new double[n];
        double lambda = 0, step = 0.05;
        boolean failed = false;
        while (lambda < 1 && !failed) {
            double next = Math.min(1, lambda + step);
            double[] trial = w.clone();
            setFixed(trial, vin, next);
            if (newton(trial, 0)) { w = trial; lambda = next; step = Math.min(step * 2, 0.25); }
            else { step /= 4; failed = step < 1e-4; }
        }
        if (!failed) { sourceUsed++; return w; }
        throw new SolverFailureException(String.format(Locale.ROOT,
                "no operating point at Vin = %.6g V after Newton, up to %d sub-steps, gmin and source stepping (continuation started from Vin = %.6g V, Vout = %.6g V)",
                vin, 1 << s.maxSubdivisionLevels(), fromVin, from[c.out]), vin, fromVin, nodeMap(from));
    }

    Map<String, Double> nodeMap(double[] v) {
        Map<String, Double> mp = new LinkedHashMap<>();
        for (int k = 0; k < n; k++) mp.put(c.nodeNames.get(k), v[k]);
        return mp;
    }

    /** A first guess for the quiescent point: every unknown node at 0 V. */
    double[] initialGuess(double vin) {
        double[] v = new double[n];
        setFixed(v, vin, 1);
        return v;
    }

    /** Solves the quiescent point (Vin = 0) from scratch, or from a nearby point when given. */
    double[] quiescent(double[] near) {
        double[] g = near != null ? near : initialGuess(0);
        return solve(0, 0, g);
    }

    /**
     * The incremental gain dVout/dVin at operating point v, from the Jacobian: J_uu·dx = −J_u,drive·dDrive/dVin.
     */
    double gain(double[] v, double vin) {
        c.assemble(v, 0, f, j, work);
        double x = vin + inputOffsetVolts;
        double dTop = x + biasVolts / 2 < driveLimit ? 1 : 0;
        double dBot = x - biasVolts / 2 > -driveLimit ? 1 : 0;
        for (int r = 0; r < m; r++) {
            int node = r + Circuit.FIRST_UNKNOWN;
            System.arraycopy(j, node * n + Circuit.FIRST_UNKNOWN, a, r * m, m);
            rhs[r] = -(j[node * n + Circuit.DRIVE_TOP] * dTop + j[node * n + Circuit.DRIVE_BOTTOM] * dBot);
        }
        if (!solveLinear()) return Double.NaN;
        return dx[c.out - Circuit.FIRST_UNKNOWN];
    }

    /** dv/dVin at every node from the last {@link #gain} call (zero at the fixed nodes). */
    double[] inputSensitivity() {
        double[] dv = new double[n];
        for (int k = 0; k < m; k++) dv[k + Circuit.FIRST_UNKNOWN] = dx[k];
        return dv;
    }

    /** v + (dv/dVin)·delta using the sensitivities of the last {@link #gain} call: a predictor for continuation. */
    double[] predict(double[] v, double delta) {
        double[] p = v.clone();
        for (int k = 0; k < m; k++) p[k + Circuit.FIRST_UNKNOWN] += dx[k] * delta;
        return p;
    }

    /** dVout/dVbias at v (bias sensitivity), same method as {@link #gain}. */
    double biasDerivative(double[] v, double vin) {
        c.assemble(v, 0, f, j, work);
        double x = vin + inputOffsetVolts;
        double dTop = x + biasVolts / 2 < driveLimit ? 0.5 : 0;
        double dBot = x - biasVolts / 2 > -driveLimit ? -0.5 : 0;
        for (int r = 0; r < m; r++) {
            int node = r + Circuit.FIRST_UNKNOWN;
            System.arraycopy(j, node * n + Circuit.FIRST_UNKNOWN, a, r * m, m);
            rhs[r] = -(j[node * n + Circuit.DRIVE_TOP] * dTop + j[node * n + Circuit.DRIVE_BOTTOM] * dBot);
        }
        if (!solveLinear()) return Double.NaN;
        double[] dv = new double[n];
        for (int k = 0; k < m; k++) dv[k + Circuit.FIRST_UNKNOWN] = dx[k];
        lastBiasDerivative = dv;
        return dx[c.out - Circuit.FIRST_UNKNOWN];
    }

    double[] lastBiasDerivative;
}
