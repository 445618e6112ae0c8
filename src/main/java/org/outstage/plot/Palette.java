package org.outstage.plot;

/**
 * Outstage's own colours, as "#rrggbb" text so that no renderer type leaks in here. Chosen for contrast on
 * white and for telling measurement (cool colours, solid) from prediction (warm colours, dashed).
 */
public final class Palette {
    private Palette() {}

    public static final String BACKGROUND = "#ffffff";
    public static final String PLOT_AREA = "#fbfbf8";
    public static final String AXIS = "#3a3a3a";
    public static final String GRID_MAJOR = "#d5d8dc";
    public static final String GRID_MINOR = "#eceef0";
    public static final String TEXT = "#222222";
    public static final String BAND = "#e3eefa";
    public static final String MARKER = "#5a3d7a";

    /** Colour of a series by its role; {@code index} counts earlier series of the same role. */
    public static String colour(Series.Role role, int index) {
        String[] set = switch (role) {
            case MEASURED -> new String[] {"#1d5a8a", "#2f8c7c", "#4b4fa6"};
            case MEASURED_ALT -> new String[] {"#c2582b", "#b08a1e", "#9a3a6a"};
            case MODEL -> new String[] {"#d9822b", "#a8509c", "#7a8a2a"};
            case FIT -> new String[] {"#5c9c3a", "#3f7a8c", "#8c6a3f"};
            case RESIDUAL -> new String[] {"#7b3fa0", "#a03f6e", "#3f5fa0"};
            case LIMIT -> new String[] {"#b8322a", "#8a2a25", "#d0503f"};
        };
        return set[Math.floorMod(index, set.length)];
    }

    /** Dash pattern in pixels (empty = solid) by role. */
    public static double[] dash(Series.Role role) {
        return switch (role) {
            case MODEL -> new double[] {7, 4};
            case FIT -> new double[] {5, 3};
            case LIMIT -> new double[] {5, 3};
            default -> new double[0];
        };
    }

    /** Line width in pixels by role. */
    public static double lineWidth(Series.Role role) {
        return switch (role) {
            case MODEL -> 1.8;
            case FIT -> 1.3;
            case LIMIT -> 1.4;
            default -> 1.4;
        };
    }
}
