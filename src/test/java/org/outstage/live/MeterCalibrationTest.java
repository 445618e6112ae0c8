package org.outstage.live;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.outstage.analysis.Analyzer;
import org.outstage.analysis.Measurement;
import org.outstage.capture.SampleUnit;
import org.outstage.stimulus.Generator;
import org.outstage.stimulus.Stimulus;

class MeterCalibrationTest {
    @TempDir Path dir;

    @Test
    void fullScaleVolts_isMeterRmsOverToneRms() {
        // A sine of peak A has rms A/√2 (docs/references.md §2): −20 dBFS peak → 0.070711 FS rms; 12.65 V rms on the
        // meter → 178.90 V at full scale. Independent check through the analyzer on generated blocks.
        Measurement m = Analyzer.analyze(Generator.of(new Stimulus.Sine(997), 48_000, -20, 1, false).render(48_000), 48_000, SampleUnit.FULL_SCALE);
        MeterCalibration.Result r = MeterCalibration.fromMeasurements(List.of(m, m, m), 12.65);
        assertEquals(12.65 / (0.1 / Math.sqrt(2)), r.fullScaleVolts(), 1e-6);
        assertEquals(3, r.blocks());
        assertThrows(IllegalArgumentException.class, () -> MeterCalibration.fullScaleVolts(12.65, 0));
        assertThrows(IllegalArgumentException.class, () -> MeterCalibration.fromMeasurements(List.of(), 1));
    }

    @Test
    void userSettings_rememberPerDeviceAndChannel_andCautions() throws Exception {
        UserSettings u = new UserSettings(dir.resolve("cfg/settings.properties"));
        assertTrue(u.fullScaleVolts("default", 1).isEmpty());
        assertFalse(u.cautionsDismissed());
        u.setFullScaleVolts("default@bench.monitor", 2, 31.5);
        u.dismissCautions();
        UserSettings again = new UserSettings(dir.resolve("cfg/settings.properties"));
        assertEquals(31.5, again.fullScaleVolts("default@bench.monitor", 2).orElseThrow(), 0);
        assertTrue(again.fullScaleVolts("default@bench.monitor", 1).isEmpty());
        assertTrue(again.cautionsDismissed());
        // folder rules: OUTSTAGE_CONFIG, else XDG_CONFIG_HOME/outstage, else ~/.config/outstage
        assertEquals(Path.of("/x/settings.properties"), UserSettings.folder(java.util.Map.of(UserSettings.ENV, "/x")));
        assertEquals(Path.of("/y/outstage/settings.properties"), UserSettings.folder(java.util.Map.of("XDG_CONFIG_HOME", "/y")));
    }
}
