package org.outstage.capture;

/** What one sample value means. */
public enum SampleUnit {
    /** Volts at the amplifier output (calibrated WAV, or scope CSV). */
    VOLTS("V"),
    /** Full-scale units of an uncalibrated WAV: 1.0 is the digital full-scale peak; a full-scale sine has RMS 0.7071 = 0 dBFS (AES17). */
    FULL_SCALE("FS");

    private final String symbol;

    SampleUnit(String symbol) { this.symbol = symbol; }

    /** The short symbol used in JSON and tables: {@code "V"} or {@code "FS"}. */
    public String symbol() { return symbol; }
}
