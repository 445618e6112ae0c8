package org.outstage.analysis;

import java.util.Locale;

/**
 * What signal drove the amplifier when a capture was made, as far as the spec-sheet measurements care
 * ({@link SpecConditions}). {@link #AUTO} lets the analysis recognise it from the capture: two strong tones
 * mean an intermodulation test, no tone means a noise capture.
 */
public enum StimulusKind {
    /** Recognise from the capture (the default). */
    AUTO,
    /** Modulation-method two-tone test, SMPTE RP120 practice (60 Hz + 7 kHz at 4:1; DIN variant 250 Hz + 8 kHz). */
    SMPTE,
    /** Difference-frequency (twin-tone) test, IEC 60268-3 / DIN 45403 (two equal tones, e.g. 19 + 20 kHz). */
    TWIN,
    /** One sine: THD and the harmonic profile only. */
    SINE,
    /** An exponential sine sweep (the {@code response} command measures it). */
    SWEEP,
    /** No test signal (input shorted or terminated): output noise and hum. */
    NONE;

    /** Parses {@code smpte|twin|sine|sweep|none|auto} (case-insensitive). */
    public static StimulusKind parse(String text) {
        String t = text == null ? "" : text.trim().toLowerCase(Locale.ROOT);
        return switch (t) {
            case "auto" -> AUTO;
            case "smpte", "modulation" -> SMPTE;
            case "twin", "difference-frequency", "ccif" -> TWIN;
            case "sine" -> SINE;
            case "sweep" -> SWEEP;
            case "none", "noise" -> NONE;
            default -> throw new IllegalArgumentException("stimulus \"" + text + "\" must be smpte, twin, sine, sweep, none or auto");
        };
    }

    /** The lower-case name used on the command line and in JSON. */
    public String label() { return name().toLowerCase(Locale.ROOT); }
}
