package org.outstage;

/**
 * One place for argument checks, so that every message names the parameter, its value and the rule
 * ({@code "loadOhms=-8.0 must be > 0"}). Throws {@link IllegalArgumentException}.
 */
public final class Require {
    private Require() {}

    public static double finite(String name, double value) {
        if (!Double.isFinite(value)) throw new IllegalArgumentException(name + "=" + value + " must be a finite number");
        return value;
    }

    public static double positive(String name, double value) {
        if (!(value > 0) || !Double.isFinite(value)) throw new IllegalArgumentException(name + "=" + value + " must be > 0");
        return value;
    }

    public static double nonNegative(String name, double value) {
        if (!(value >= 0) || !Double.isFinite(value)) throw new IllegalArgumentException(name + "=" + value + " must be >= 0");
        return value;
    }

    public static int positive(String name, int value) {
        if (value <= 0) throw new IllegalArgumentException(name + "=" + value + " must be > 0");
        return value;
    }

    public static int atLeast(String name, int value, int min) {
        if (value < min) throw new IllegalArgumentException(name + "=" + value + " must be >= " + min);
        return value;
    }

    public static double inRange(String name, double value, double lo, double hi) {
        if (!(value >= lo && value <= hi)) throw new IllegalArgumentException(name + "=" + value + " must be in [" + lo + ", " + hi + "]");
        return value;
    }

    public static <T> T notNull(String name, T value) {
        if (value == null) throw new IllegalArgumentException(name + " must not be null");
        return value;
    }

    public static void that(boolean condition, String message) {
        if (!condition) throw new IllegalArgumentException(message);
    }
}
