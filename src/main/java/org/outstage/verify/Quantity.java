package org.outstage.verify;

/** What a spec limit bounds. The keyword is how the spec file names it. */
public enum Quantity {
    /** THD, harmonics relative to the fundamental. */
    THD("thd"),
    /** THD+N in the measurement band relative to the total (AES17). */
    THD_N("thd+n"),
    /** Distortion-limited output power: the power at which THD reaches a stated value (IEC 60268-3 rated output). */
    POWER("power"),
    /** Clipping asymmetry between the two half-waves. */
    CLIP_ASYMMETRY("clip-asymmetry"),
    /** Residual output noise with no test signal, RMS. */
    NOISE("noise"),
    /** Level difference between two channels of one capture. */
    BALANCE("balance"),
    /** Two-tone intermodulation (SMPTE RP120 modulation method or IEC 60268-3 difference frequency). */
    IMD("imd"),
    /** Signal-to-noise ratio 20·lg(√(P·R)/noise) of a noise capture, at a stated power, unweighted or A-weighted. */
    SNR("snr"),
    /** Crosstalk into an undriven channel, 20·lg(V_undriven/V_driven), at a frequency. */
    CROSSTALK("crosstalk"),
    /** Largest |deviation| of the swept response from its 1 kHz gain over the deviation band. */
    RESPONSE_DEVIATION("response-deviation"),
    /** Lower −3 dB point of the swept response. */
    BANDWIDTH_LOW("bandwidth-low"),
    /** Upper −3 dB point of the swept response. */
    BANDWIDTH_HIGH("bandwidth-high"),
    /** Damping factor R_L/Z_out at a frequency. */
    DAMPING_FACTOR("damping-factor");

    private final String keyword;

    Quantity(String keyword) { this.keyword = keyword; }

    public String keyword() { return keyword; }

    static Quantity byKeyword(String k) {
        for (Quantity q : values()) if (q.keyword.equalsIgnoreCase(k)) return q;
        return null;
    }
}
