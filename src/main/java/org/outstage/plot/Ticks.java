package org.outstage.plot;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;

/**
 * Tick positions and labels for an axis. Linear and dB axes get "nice" steps (1, 2 or 5 times a power
 * of ten); log axes get a labelled major tick on each decade and unlabelled minor ticks at 2…9.
 * Labels use SI prefixes (k, M, m, µ) so "20000" reads "20k".
 */
public final class Ticks {
    private Ticks() {}

    /** One tick: its value, its label (empty for a minor tick) and whether it is major. */
    public record Tick(double value, String label, boolean major) {}

    /** Ticks for the given range and scale, aiming at about {@code target} major ticks on linear axes. */
    public static List<Tick> of(Range r, Axis.Scale scale, int target) {
        if (scale == Axis.Scale.LOG10) return log(r, true);
        return linear(r, Math.max(2, target));
    }

    /**
     * As {@link #of(Range, Axis.Scale, int)} for an axis in {@code unit}: percent, dB and plain numbers get
     * plain decimals on log axes ("0.01", "0.1", "1") instead of SI prefixes.
     */
    public static List<Tick> of(Range r, Axis.Scale scale, int target, String unit) {
        boolean plain = unit.isEmpty() || unit.equals("%") || unit.startsWith("dB");
        if (scale == Axis.Scale.LOG10) return log(r, !plain);
        List<Tick> ticks = linear(r, Math.max(2, target));
        if (plain) return ticks;
        // unit-aware labels: "0.5 ms", not "0.5m" (the prefix alone reads as metres or is missed)
        List<Tick> out = new ArrayList<>(ticks.size());
        for (Tick t : ticks) out.add(new Tick(t.value(), withUnitLabel(t.label(), unit), t.major()));
        return out;
    }

    /** "0.5m" + "s" → "0.5 ms"; "20" + "V" → "20 V"; "0" stays "0". */
    static String withUnitLabel(String label, String unit) {
        if (label.isEmpty() || label.equals("0")) return label;
        char last = label.charAt(label.length() - 1);
        if ("nµmkMG".indexOf(last) >= 0) return label.substring(0, label.length() - 1) + " " + last + unit;
        return label + " " + unit;
    }

    /** A nice step (1, 2 or 5 × 10^k) giving about {@code target} intervals over {@code span}. */
    public static double niceStep(double span, int target) {
        double raw = span / target;
        double p = Math.pow(10, Math.floor(Math.log10(raw)));
        double m = raw / p;
        double nice = m < 1.5 ? 1 : m < 3.5 ? 2 : m < 7.5 ? 5 : 10;
        return nice * p;
    }

    static List<Tick> linear(Range r, int target) {
        double step = niceStep(r.span(), target);
        List<Tick> out = new ArrayList<>();
        double first = Math.ceil(r.min() / step - 1e-9) * step;
        double ref = Math.max(Math.abs(r.min()), Math.abs(r.max()));
        for (int i = 0; i < 1000; i++) {
            double v = first + i * step;
            if (v > r.max() + step * 1e-9) break;
            if (Math.abs(v) < step * 1e-9) v = 0;
            out.add(new Tick(v, format(v, step, ref), true));
        }
        return out;
    }

    static List<Tick> log(Range r, boolean siPrefix) {
        List<Tick> out = new ArrayList<>();
        int d0 = (int) Math.floor(Math.log10(r.min()) + 1e-9);
        int d1 = (int) Math.ceil(Math.log10(r.max()) - 1e-9);
        int decades = d1 - d0;
        boolean labelMinor = decades <= 3;
        for (int d = d0; d <= d1; d++) {
            double dec = Math.pow(10, d);
            for (int m = 1; m <= 9; m++) {
                double v = m * dec;
                if (v < r.min() * (1 - 1e-9) || v > r.max() * (1 + 1e-9)) continue;
                boolean major = m == 1;
                String label = major || (labelMinor && (m == 2 || m == 5)) ? (siPrefix ? format(v, v) : plain(v)) : "";
                out.add(new Tick(v, label, major));
            }
        }
        return out;
    }

    /** A positive decade value in plain decimal notation ("0.001", "20", "5000"). */
    static String plain(double v) {
        return new java.math.BigDecimal(v).round(new java.math.MathContext(1)).stripTrailingZeros().toPlainString();
    }

    /** Formats {@code v} with an SI prefix, with as many decimals as {@code step} needs. */
    public static String format(double v, double step) {
        return format(v, step, Math.abs(v));
    }

    /** As {@link #format(double, double)}, with the prefix chosen for magnitude {@code ref} (one prefix per axis). */
    public static String format(double v, double step, double ref) {
        if (v == 0) return "0";
        double a = Math.max(ref, Math.abs(step) * 0.999);
        String[] prefixes = {"n", "µ", "m", "", "k", "M", "G"};
        int e3 = (int) Math.floor(Math.log10(a) / 3);
        e3 = Math.max(-3, Math.min(3, e3));
        double scale = Math.pow(1000, e3);
        double sv = v / scale;
        double sstep = Math.abs(step) / scale;
        int decimals = sstep >= 1 ? 0 : Math.min(6, (int) Math.ceil(-Math.log10(sstep) - 1e-9));
        String s = String.format(Locale.ROOT, "%." + decimals + "f", sv);
        if (s.equals("-0")) s = "0";
        return s + prefixes[e3 + 3];
    }

    /** A value with an SI prefix and a unit, about 4 significant digits ("1.234 kHz", "-3.5 mV"). */
    public static String withUnit(double v, String unit) {
        if (!Double.isFinite(v)) return "—";
        if (unit.startsWith("dB") || unit.equals("%") || unit.isEmpty()) {
            return String.format(Locale.ROOT, "%.4g", v) + (unit.isEmpty() ? "" : " " + unit);
        }
        if (v == 0) return "0 " + unit;
        String[] prefixes = {"n", "µ", "m", "", "k", "M", "G"};
        int e3 = (int) Math.floor(Math.log10(Math.abs(v)) / 3);
        e3 = Math.max(-3, Math.min(3, e3));
        return String.format(Locale.ROOT, "%.4g", v / Math.pow(1000, e3)) + " " + prefixes[e3 + 3] + unit;
    }
}
