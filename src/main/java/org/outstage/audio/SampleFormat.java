package org.outstage.audio;

import java.util.Locale;

/** Sample encodings a line may use: little-endian signed PCM of 16, 24 or 32 bits, or 32-bit IEEE float. */
public enum SampleFormat {
    PCM_16(16, false, "16"), PCM_24(24, false, "24"), PCM_32(32, false, "32"), FLOAT_32(32, true, "float");

    private final int bits;
    private final boolean floating;
    private final String label;

    SampleFormat(int bits, boolean floating, String label) {
        this.bits = bits;
        this.floating = floating;
        this.label = label;
    }

    public int bits() { return bits; }
    public int bytes() { return bits / 8; }
    public boolean isFloat() { return floating; }
    /** The command-line spelling: 16, 24, 32 or float. */
    public String label() { return label; }

    /** Reads 16, 24, 32 or float; the message names the value and the choices. */
    public static SampleFormat parse(String text) {
        String t = text == null ? "" : text.trim().toLowerCase(Locale.ROOT);
        for (SampleFormat f : values()) if (f.label.equals(t)) return f;
        throw new IllegalArgumentException("bits \"" + text + "\" must be 16, 24, 32 or float");
    }
}
