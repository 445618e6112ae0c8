package org.outstage.plot;

import java.util.Arrays;
import org.outstage.Require;

/**
 * Screen-space min/max reduction of a series before drawing (style.md §15): the visible x range is cut
 * into pixel columns and each column keeps at most two points, its minimum and its maximum, in the order
 * they occur. Spikes and clipped flats therefore stay visible however many samples fall into one column.
 * A NaN y (or x) is a gap and stays a gap: the output carries one NaN point at that place, and no column
 * merges samples from both sides of it. One point just outside each end of the range is kept so lines
 * reach the edges.
 *
 * <p>Input x must be free of NaN and non-decreasing (time or frequency axes); use {@link #isNonDecreasing}
 * to check. Column edges are found by binary search, so the cost is one pass over the visible y values. When the visible part has no more than two points per column it is returned unchanged.
 * Pure and thread-safe.
 */
public final class Decimator {
    private Decimator() {}

    /** Decimated points; NaN pairs are gaps. */
    public record Result(double[] x, double[] y) {
        public int size() { return x.length; }
    }

    /**
     * True when every x is a number (no NaN) and x never decreases: the condition for {@link #minMax}.
     * Series with NaN x values are drawn without reduction.
     */
    public static boolean isNonDecreasing(double[] x) {
        double last = Double.NEGATIVE_INFINITY;
        for (double v : x) {
            if (!(v >= last)) return false;   // also false for NaN
            last = v;
        }
        return true;
    }

    /**
     * Reduces {@code (x, y)} to at most about {@code 2·columns} points over {@code [xMin, xMax]}.
     *
     * @param scale scale of the x axis; on LOG10 the columns are equal in log10(x) and x ≤ 0 is skipped
     */
    public static Result minMax(double[] x, double[] y, double xMin, double xMax, int columns, Axis.Scale scale) {
        Require.that(x.length == y.length, "x has " + x.length + " values, y has " + y.length);
        Require.positive("columns", columns);
        Require.that(xMax > xMin, "xMax=" + xMax + " must be > xMin=" + xMin);
        boolean log = scale == Axis.Scale.LOG10;
        if (log) Require.that(xMin > 0, "xMin=" + xMin + " must be > 0 on a log axis");
        int n = x.length;
        int from = firstAtOrAbove(x, xMin);      // first index with x >= xMin
        int to = firstAbove(x, xMax);           // first index with x > xMax
        int start = Math.max(0, from - 1);
        int end = Math.min(n, to + 1);          // exclusive
        if (end - start <= 2 * columns + 2) {
            return new Result(Arrays.copyOfRange(x, start, end), Arrays.copyOfRange(y, start, end));
        }
        Buffer out = new Buffer(2 * columns + 8);
        if (start < from) out.add(x[start], y[start]);
        double a = log ? Math.log10(xMin) : xMin;
        double perUnit = columns / ((log ? Math.log10(xMax) : xMax) - a);
        int i = from;
        for (int col = 0; col < columns && i < to; col++) {
            // first index of the next column: binary search with the same column function as a per-sample scan
            int lo = i, hi = to;
            while (lo < hi) {
                int mid = (lo + hi) >>> 1;
                if (column(x[mid], a, perUnit, log, columns) <= col) lo = mid + 1; else hi = mid;
            }
            int next = lo;
            int minI = -1, maxI = -1;
            double minV = 0, maxV = 0;
            for (int k = i; k < next; k++) {
                double yk = y[k];
                if (yk != yk || (log && !(x[k] > 0))) {     // NaN: a gap
                    flush(out, x, y, minI, maxI);
                    minI = maxI = -1;
                    out.gap();
                    continue;
                }
                if (minI < 0) { minI = maxI = k; minV = maxV = yk; }
                else if (yk < minV) { minI = k; minV = yk; }
                else if (yk > maxV) { maxI = k; maxV = yk; }
            }
            flush(out, x, y, minI, maxI);
            i = next;
        }
        if (end > to) out.add(x[to], y[to]);
        return out.result();
    }

    /** Column of a value: floor((f(x) − f(xMin))·columns/(f(xMax) − f(xMin))), clamped to [−1, columns − 1]. */
    private static int column(double xv, double a, double perUnit, boolean log, int columns) {
        if (log && !(xv > 0)) return -1;
        int c = (int) Math.floor(((log ? Math.log10(xv) : xv) - a) * perUnit);
        return c >= columns ? columns - 1 : c;
    }

    private static void flush(Buffer out, double[] x, double[] y, int minI, int maxI) {
        if (minI < 0) return;
        if (minI == maxI) { out.add(x[minI], y[minI]); return; }
        int first = Math.min(minI, maxI), second = Math.max(minI, maxI);
        out.add(x[first], y[first]);
        out.add(x[second], y[second]);
    }

    /** Binary search on a non-decreasing array; NaN x values would break it, so fall back to a scan then. */
    static int firstAtOrAbove(double[] x, double v) {
        int lo = 0, hi = x.length;
        while (lo < hi) {
            int mid = (lo + hi) >>> 1;
            double m = x[mid];
            if (Double.isNaN(m)) return scanAtOrAbove(x, v);
            if (m < v) lo = mid + 1; else hi = mid;
        }
        return lo;
    }

    static int firstAbove(double[] x, double v) {
        int lo = 0, hi = x.length;
        while (lo < hi) {
            int mid = (lo + hi) >>> 1;
            double m = x[mid];
            if (Double.isNaN(m)) return scanAbove(x, v);
            if (m <= v) lo = mid + 1; else hi = mid;
        }
        return lo;
    }

    private static int scanAtOrAbove(double[] x, double v) {
        for (int i = 0; i < x.length; i++) if (x[i] >= v) return i;
        return x.length;
    }

    private static int scanAbove(double[] x, double v) {
        for (int i = x.length - 1; i >= 0; i--) if (x[i] <= v) return i + 1;
        return 0;
    }

    private static final class Buffer {
        double[] x, y;
        int n;

        Buffer(int capacity) { x = new double[capacity]; y = new double[capacity]; }

        void add(double xv, double yv) {
            if (n == x.length) { x = Arrays.copyOf(x, n * 2); y = Arrays.copyOf(y, n * 2); }
            x[n] = xv;
            y[n++] = yv;
        }

        void gap() {
            if (n > 0 && Double.isNaN(y[n - 1])) return;
            add(Double.NaN, Double.NaN);
        }

        Result result() { return new Result(Arrays.copyOf(x, n), Arrays.copyOf(y, n)); }
    }
}
