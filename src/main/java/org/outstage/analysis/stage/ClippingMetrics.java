package org.outstage.analysis.stage;

import java.util.Optional;
import java.util.OptionalDouble;

/**
 * Clipping of the waveform. A side is clipped when the samples within {@code toleranceVolts} of its extreme
 * (the "flat top") span an ideal-output range more than five times the tolerance: the output stays put while
 * the ideal keeps moving (gain under about 0.2 there). A clean sine's peak region spans about one tolerance.
 *
 * <p>{@code asymmetryPercent} = 100·(pos − |neg|)/((pos + |neg|)/2), only when both sides clip (no standard
 * defines clipping asymmetry; docs/references.md §6.3). {@code clipsFirst} compares the ideal output at which each
 * side reaches its flat top; onsets within 1 % of each other are {@code BOTH}.
 *
 * @param detected         any side clipped
 * @param positive         positive flat top, if any
 * @param negative         negative flat top, if any
 * @param asymmetryPercent as above, when both sides clip
 * @param clipsFirst       which side reaches its limit at the lower ideal level
 * @param toleranceVolts   band below the extreme counted as "on the flat top": max(4·noise RMS, 0.1 % of peak)
 */
public record ClippingMetrics(boolean detected, Optional<ClipSide> positive, Optional<ClipSide> negative,
                              OptionalDouble asymmetryPercent, FirstSide clipsFirst, double toleranceVolts) {
    /**
     * What a band-limited capture (a soundcard WAV, whose anti-alias filter keeps the harmonics below about 0.46 of its
     * sample rate) cannot tell about clipping: its flat tops ring above the rail (Gibbs), which moves the measured clip
     * levels and may swap the side that reaches its level first. Said beside the clipping figures of such a capture.
     */
    public static final String BAND_LIMITED_NOTE = "approximate on a soundcard capture: its band-limited flat tops ring above"
            + " the rail, which moves the clip levels and the first side; a scope capture resolves them";

    /** Which side clips first. */
    public enum FirstSide {
        POSITIVE("positive"), NEGATIVE("negative"), BOTH("both"), NONE("none");
        private final String label;
        FirstSide(String label) { this.label = label; }
        public String label() { return label; }
    }
}
