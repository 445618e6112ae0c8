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

    public static void require() {
        String why = null;
        if (System.getenv("PULSE_SERVER") == null) why = "PULSE_SERVER is not set (run: eval \"$(tools/virtual-soundcard start)\")";
        else if (new JavaSoundBackend().inputs().isEmpty()) why = "Java Sound lists no input device (is the PulseAudio daemon of tools/virtual-soundcard running?)";
        if (why == null) return;
        if ("true".equals(System.getenv("CI"))) Assertions.fail("CI=true and no virtual soundcard: " + why);
        Assumptions.abort("no soundcard: " + why);
    }
}
