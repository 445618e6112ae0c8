package org.outstage.plot;

import org.outstage.Require;

/**
 * Maps data coordinates to a pixel rectangle and back, for a given pair of axis scales. Pixel y grows
 * downwards. Shared by both renderers so they place things identically.
 *
 * @param x      visible x range
 * @param y      visible y range
 * @param xScale scale of the x axis
 * @param yScale scale of the y axis
 * @param left   left edge of the plot area in pixels
 * @param top    top edge in pixels
 * @param width  plot area width in pixels
 * @param height plot area height in pixels
 */
public record Viewport(Range x, Range y, Axis.Scale xScale, Axis.Scale yScale,
                       double left, double top, double width, double height) {
    public Viewport {
        Require.positive("width", width);
        Require.positive("height", height);
        if (xScale == Axis.Scale.LOG10) Require.that(x.min() > 0, "log x range must be > 0, got " + x);
        if (yScale == Axis.Scale.LOG10) Require.that(y.min() > 0, "log y range must be > 0, got " + y);
    }

    static double fwd(Axis.Scale s, double v) { return s == Axis.Scale.LOG10 ? Math.log10(v) : v; }
    static double inv(Axis.Scale s, double v) { return s == Axis.Scale.LOG10 ? Math.pow(10, v) : v; }

    /** Pixel x of a data x (NaN for a non-positive value on a log axis). */
    public double px(double dataX) {
        if (xScale == Axis.Scale.LOG10 && !(dataX > 0)) return Double.NaN;
        double a = fwd(xScale, x.min()), b = fwd(xScale, x.max());
        return left + (fwd(xScale, dataX) - a) / (b - a) * width;
    }

    /** Pixel y of a data y (NaN for a non-positive value on a log axis). */
    public double py(double dataY) {
        if (yScale == Axis.Scale.LOG10 && !(dataY > 0)) return Double.NaN;
        double a = fwd(yScale, y.min()), b = fwd(yScale, y.max());
        return top + height - (fwd(yScale, dataY) - a) / (b - a) * height;
    }

    /** Data x at a pixel x. */
    public double dataX(double pixelX) {
        double a = fwd(xScale, x.min()), b = fwd(xScale, x.max());
        return inv(xScale, a + (pixelX - left) / width * (b - a));
    }

    /** Data y at a pixel y. */
    public double dataY(double pixelY) {
        double a = fwd(yScale, y.min()), b = fwd(yScale, y.max());
        return inv(yScale, a + (top + height - pixelY) / height * (b - a));
    }
}
