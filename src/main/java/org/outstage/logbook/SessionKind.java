package org.outstage.logbook;

import java.util.Locale;

/** What a session was for. The label is what the logbook and the exports store. */
public enum SessionKind {
    BIAS_ADJUSTMENT("bias-adjustment"), VERIFICATION("verification"), EVALUATION("evaluation");

    private final String label;

    SessionKind(String label) { this.label = label; }

    public String label() { return label; }

    public static SessionKind parse(String text) {
        String t = text.trim().toLowerCase(Locale.ROOT);
        for (SessionKind k : values()) if (k.label.equals(t)) return k;
        throw new IllegalArgumentException("session kind '" + text + "' must be one of bias-adjustment, verification, evaluation");
    }
}
