package org.outstage.analysis;

/**
 * Small dense linear algebra for normal equations: Gaussian elimination with partial pivoting.
 * Matrices here are at most a few dozen columns (sine fits, harmonic fits, polynomial fits).
 */
public final class LeastSquares {
    private LeastSquares() {}

    /**
     * Solves {@code a·x = b} for a square system. Inputs are not modified.
     * @throws ArithmeticException if the matrix is singular to working precision
     */
    public static double[] solve(double[][] a, double[] b) {
        int n = b.length;
        double[][] m = new double[n][];
        for (int i = 0; i < n; i++) m[i] = a[i].clone();
        double[] y = b.clone();
        double scale = 0;
        for (double[] row : m) for (double v : row) scale = Math.max(scale, Math.abs(v));
        for (int col = 0; col < n; col++) {
            int piv = col;
            for (int r = col + 1; r < n; r++) if (Math.abs(m[r][col]) > Math.abs(m[piv][col])) piv = r;
            if (!(Math.abs(m[piv][col]) > scale * 1e-15)) throw new ArithmeticException("singular system at column " + col);
            double[] t = m[col]; m[col] = m[piv]; m[piv] = t;
            double ty = y[col]; y[col] = y[piv]; y[piv] = ty;
            for (int r = col + 1; r < n; r++) {
                double f = m[r][col] / m[col][col];
                if (f == 0) continue;
                for (int c = col; c < n; c++) m[r][c] -= f * m[col][c];
                y[r] -= f * y[col];
            }
        }
        double[] x = new double[n];
        for (int r = n - 1; r >= 0; r--) {
            double s = y[r];
            for (int c = r + 1; c < n; c++) s -= m[r][c] * x[c];
            x[r] = s / m[r][r];
        }
        return x;
    }
}
