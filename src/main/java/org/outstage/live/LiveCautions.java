package org.outstage.live;

import java.util.List;

/** What to check before the first live start. Our own words; shown once, then the dismissal is remembered in {@link UserSettings}. */
public final class LiveCautions {
    private LiveCautions() {}

    public static final List<String> TEXT = List.of(
            "Live playback drives a real amplifier. Keep its volume down and start the stimulus low; Outstage starts at -20 dBFS or below "
                    + "unless you add --allow-loud.",
            "Connect the soundcard input through an attenuator sized for the amplifier's full output swing; a power amplifier's output "
                    + "destroys a line input.",
            "A bridged (BTL) output has no side at ground: a grounded soundcard or scope across it shorts the amplifier. Use a "
                    + "differential probe or measure each side against ground.",
            "A dummy load takes the full output power as heat: rate it for the power of the test (V rms squared over R) and give it air.");
}
