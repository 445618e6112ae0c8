package org.outstage.plot;

/**
 * Where the plot area sits inside a chart of a given size, shared by the SVG and canvas renderers so
 * both leave the same room for the title, tick labels and axis titles.
 */
public final class ChartLayout {
    private ChartLayout() {}

    public static final double MARGIN_LEFT = 74;
    public static final double MARGIN_RIGHT = 22;
    public static final double MARGIN_TOP = 34;
    public static final double MARGIN_BOTTOM = 50;
    public static final double FONT_SIZE = 12;
    public static final double TITLE_FONT_SIZE = 14;

    /** The viewport of {@code spec} drawn into {@code width × height} pixels over the given ranges. */
    public static Viewport viewport(ChartSpec spec, Range x, Range y, double width, double height) {
        double w = Math.max(1, width - MARGIN_LEFT - MARGIN_RIGHT);
        double h = Math.max(1, height - MARGIN_TOP - MARGIN_BOTTOM);
        return new Viewport(x, y, spec.xAxis().scale(), spec.yAxis().scale(), MARGIN_LEFT, MARGIN_TOP, w, h);
    }

    /** The viewport over the spec's own ranges. */
    public static Viewport viewport(ChartSpec spec, double width, double height) {
        return viewport(spec, spec.xRange(), spec.yRange(), width, height);
    }

    /** About how many major ticks fit along a length in pixels. */
    public static int tickTarget(double pixels, boolean horizontal) {
        return (int) Math.max(2, Math.min(12, pixels / (horizontal ? 90 : 45)));
    }

    /**
     * Whether a marker label centred at (x, y) stays clear of the labels already placed (about 22 × 12 px
     * each); if so it is added to {@code placed}. Crowded markers keep their triangle and lose the label.
     */
    public static boolean labelFits(java.util.List<double[]> placed, double x, double y) {
        for (double[] p : placed) if (Math.abs(p[0] - x) < 22 && Math.abs(p[1] - y) < 12) return false;
        placed.add(new double[] {x, y});
        return true;
    }
}
