package org.outstage.analysis;

import java.util.Locale;
import org.outstage.Require;

/**
 * The measurement band for THD+N, SINAD and the noise floor: a brick-wall band-pass applied in the
 * frequency domain (bins whose centre lies in {@code [lowHz, highHz]} count, the others do not).
 * {@code highHz} may be {@link Double#POSITIVE_INFINITY}, meaning "up to the Nyquist frequency";
 * the effective upper edge is always {@code min(highHz, fs/2)}. DC is never part of the band.
 *
 * <p>The presets follow common practice: 20 Hz–20 kHz (the audio band), 22 Hz–22 kHz (an unweighted
 * band often quoted beside AES17; the AES17 filter numbers are from memory, see docs/methods.md),
 * 20 Hz–80 kHz (wideband) and DC–Nyquist (for the quantisation-noise formula of IEEE 1241).
 *
 * @param lowHz  lower edge, {@code >= 0}
 * @param highHz upper edge, {@code > lowHz}; infinity for Nyquist
 */
public record Band(double lowHz, double highHz) {
    /** 20 Hz to 20 kHz, the default. */
    public static final Band AUDIO_20_20K = new Band(20, 20_000);
    /** 22 Hz to 22 kHz. */
    public static final Band BAND_22_22K = new Band(22, 22_000);
    /** 20 Hz to 80 kHz. */
    public static final Band WIDE_80K = new Band(20, 80_000);
    /** DC (excluded) to the Nyquist frequency of the capture. */
    public static final Band NYQUIST = new Band(0, Double.POSITIVE_INFINITY);

    public Band {
        Require.nonNegative("lowHz", lowHz);
        if (!(highHz > lowHz)) throw new IllegalArgumentException("highHz=" + highHz + " must be > lowHz=" + lowHz);
    }

    /** The upper edge for a capture at {@code sampleRateHz}: {@code min(highHz, fs/2)}. */
    public double effectiveHighHz(double sampleRateHz) {
        return Math.min(highHz, sampleRateHz / 2);
    }

    /** Whether the upper edge is the Nyquist frequency. */
    public boolean toNyquist() { return highHz == Double.POSITIVE_INFINITY; }

    /**
     * Parses a band: {@code "LOW-HIGH"} with plain Hz or a {@code k} suffix ({@code "20-20000"},
     * {@code "20-20k"}, {@code "22-22k"}, {@code "22.4-22.4k"}), or a name: {@code "audio"},
     * {@code "wide"} / {@code "80k"} (20 Hz–80 kHz), {@code "nyquist"}.
     *
     * @throws IllegalArgumentException naming the text and the rule
     */
    public static Band parse(String text) {
        Require.notNull("band", text);
        String t = text.trim().toLowerCase(Locale.ROOT);
        switch (t) {
            case "audio": return AUDIO_20_20K;
            case "wide": case "80k": return WIDE_80K;
            case "nyquist": case "full": return NYQUIST;
            default: break;
        }
        int dash = t.indexOf('-', 1);
        if (dash < 0) throw new IllegalArgumentException("band \"" + text + "\" must be LOW-HIGH in Hz (e.g. 20-20k), 'wide', '80k' or 'nyquist'");
        double lo = parseHz(text, t.substring(0, dash));
        String hiText = t.substring(dash + 1);
        double hi = hiText.equals("nyquist") ? Double.POSITIVE_INFINITY : parseHz(text, hiText);
        if (!(hi > lo)) throw new IllegalArgumentException("band \"" + text + "\": high edge " + hi + " Hz must be above low edge " + lo + " Hz");
        return new Band(lo, hi);
    }

    private static double parseHz(String whole, String s) {
        String v = s.trim();
        if (v.endsWith("hz")) v = v.substring(0, v.length() - 2).trim();
        double mult = 1;
        if (v.endsWith("k")) { mult = 1000; v = v.substring(0, v.length() - 1).trim(); }
        try {
            double x = Double.parseDouble(v) * mult;
            if (!(x >= 0) || !Double.isFinite(x)) throw new NumberFormatException();
            return x;
        } catch (NumberFormatException e) {
            throw new IllegalArgumentException("band \"" + whole + "\": \"" + s + "\" is not a frequency in Hz (e.g. 20, 20000, 20k)");
        }
    }

    /** A short label such as {@code "20 Hz–20 kHz"} or {@code "0 Hz–Nyquist"}. */
    public String label() {
        return Levels.formatHz(lowHz) + "–" + (toNyquist() ? "Nyquist" : Levels.formatHz(highHz));
    }
}
