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
    BALANCE("balance");

    private final String keyword;

    Quantity(String keyword) { this.keyword = keyword; }

    public String keyword() { return keyword; }

    static Quantity byKeyword(String k) {
        for (Quantity q : values()) if (q.keyword.equalsIgnoreCase(k)) return q;
        return null;
    }
}
