package org.outstage.analysis;

import java.util.Locale;

/**
 * Conversions between plain ratios (used inside the program) and percent or decibels (used only at
 * the edges: reports, tables, the command line). Amplitude ratios use 20·lg, power ratios 10·lg.
 */
public final class Levels {
    private Levels() {}

    /** Amplitude ratio to dB: {@code 20·lg(ratio)}; {@code -Infinity} for 0. */
    public static double ratioToDb(double ratio) { return 20 * Math.log10(ratio); }

    /** dB to amplitude ratio: {@code 10^(db/20)}. */
    public static double dbToRatio(double db) { return Math.pow(10, db / 20); }

    /** Power ratio to dB: {@code 10·lg(ratio)}. */
    public static double powerRatioToDb(double powerRatio) { return 10 * Math.log10(powerRatio); }

    /** Ratio to percent: {@code 100·ratio}. */
    public static double ratioToPercent(double ratio) { return 100 * ratio; }

    /** Percent to ratio. */
    public static double percentToRatio(double percent) { return percent / 100; }

    /**
     * THD relative to the fundamental (THD_F) to THD relative to the total (THD_R):
     * {@code THD_R = THD_F/√(1+THD_F²)} (docs/references.md §3; both conventions exist in IEC practice).
     */
    public static double thdFToThdR(double thdF) { return thdF / Math.sqrt(1 + thdF * thdF); }

    /** Inverse of {@link #thdFToThdR}: {@code THD_F = THD_R/√(1−THD_R²)}. */
    public static double thdRToThdF(double thdR) { return thdR / Math.sqrt(1 - thdR * thdR); }

    /** dBV: 20·lg(rmsVolts / 1 V). */
    public static double dbv(double rmsVolts) { return 20 * Math.log10(rmsVolts); }

    /** dBu: 20·lg(rmsVolts / 0.7746 V), reference √0.6 V (1 mW into 600 Ω; docs/references.md §3). */
    public static double dbu(double rmsVolts) { return 20 * Math.log10(rmsVolts / Math.sqrt(0.6)); }

    /** dBFS after AES17: the rms of a full-scale sine (peak 1.0, rms 1/√2) is 0 dBFS. */
    public static double dbfs(double rmsFullScale) { return 20 * Math.log10(rmsFullScale * Math.sqrt(2)); }

    /**
     * An rms level in the decibels of its capture unit: dBV for volts ({@code "V"}), dBFS after AES17 for full-scale
     * units ({@code "FS"}), else dB re 1 of the unit. The unit's name is {@link #levelDbUnit}.
     */
    public static double levelDb(double rms, String unit) { return "FS".equals(unit) ? dbfs(rms) : 20 * Math.log10(rms); }

    /** The name of {@link #levelDb}'s decibels: "dBV", "dBFS" or "dB re 1 UNIT". */
    public static String levelDbUnit(String unit) { return "FS".equals(unit) ? "dBFS" : "V".equals(unit) ? "dBV" : "dB re 1 " + unit; }

    /** A frequency for labels: "20 Hz", "22 kHz", "997 Hz", "22.4 kHz". */
    public static String formatHz(double hz) {
        if (hz >= 1000) return trim(hz / 1000) + " kHz";
        return trim(hz) + " Hz";
    }

    private static String trim(double v) {
        String s = String.format(Locale.ROOT, "%.3f", v);
        s = s.replaceAll("0+$", "");
        return s.endsWith(".") ? s.substring(0, s.length() - 1) : s;
    }
}
