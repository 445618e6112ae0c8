package org.outstage.live;

import org.junit.jupiter.api.Assertions;
import org.junit.jupiter.api.Assumptions;
import org.outstage.audio.JavaSoundBackend;

/**
 * Gate of the tests that need a soundcard: the virtual one of tools/virtual-soundcard (PulseAudio null sinks
 * {@code bench} and {@code dut}). Without it the tests are skipped with the reason, except under {@code CI=true},
 * where they fail: CI must start the virtual soundcard (.ci/run does).
 */
public final class Soundcard {
    private Soundcard() {}

    private static String missing;
    private static boolean checked;

    /** Why there is no soundcard, or null; found once per test JVM (listing devices opens lines and takes a second). */
    private static synchronized String missing() {
        if (!checked) {
            checked = true;
            if (System.getenv("PULSE_SERVER") == null) missing = "PULSE_SERVER is not set (run: eval \"$(tools/virtual-soundcard start)\")";
            else if (new JavaSoundBackend().inputs().isEmpty())
                missing = "Java Sound lists no input device (is the PulseAudio daemon of tools/virtual-soundcard running?)";
        }
        return missing;
    }

    public static void require() {
        String why = missing();
        if (why == null) return;
        if ("true".equals(System.getenv("CI"))) Assertions.fail("CI=true and no virtual soundcard: " + why);
        Assumptions.abort("no soundcard: " + why);
    }
}
