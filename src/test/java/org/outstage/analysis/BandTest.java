package org.outstage.analysis;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;

class BandTest {
    @Test
    void parse_acceptsPlainKiloAndNamedForms() {
        assertEquals(Band.AUDIO_20_20K, Band.parse("20-20000"));
        assertEquals(Band.AUDIO_20_20K, Band.parse("20-20k"));
        assertEquals(Band.BAND_22_22K, Band.parse("22-22k"));
        assertEquals(Band.WIDE_80K, Band.parse("wide"));
        assertEquals(Band.WIDE_80K, Band.parse("80k"));
        assertEquals(Band.NYQUIST, Band.parse("nyquist"));
        assertEquals(new Band(22.4, 22400), Band.parse("22.4-22.4k"));
    }

    @Test
    void parse_rejectsNonsenseWithTheTextInTheMessage() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> Band.parse("20-abc"));
        assertTrue(e.getMessage().contains("20-abc"), e.getMessage());
        assertThrows(IllegalArgumentException.class, () -> Band.parse("20k-20"));
        assertThrows(IllegalArgumentException.class, () -> Band.parse("loud"));
    }

    @Test
    void nyquistBand_isLimitedBySampleRate() {
        assertEquals(24000, Band.NYQUIST.effectiveHighHz(48000), 0);
        assertEquals(20000, Band.AUDIO_20_20K.effectiveHighHz(48000), 0);
        assertEquals(24000, Band.WIDE_80K.effectiveHighHz(48000), 0);
    }

    @Test
    void settings_rejectImpossibleValues() {
        assertThrows(IllegalArgumentException.class, () -> AnalysisSettings.DEFAULT.withHarmonics(1));
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> AnalysisSettings.DEFAULT.withLoadOhms(-8));
        assertEquals("loadOhms=-8.0 must be > 0", e.getMessage());
    }

    /** docs/references.md §3 conversion examples: THD_F 10 % → THD_R 9.95 %; §11: 1 % = −40 dB. */
    @Test
    void levels_conversions() {
        assertEquals(0.0995, Levels.thdFToThdR(0.10), 5e-5);
        assertEquals(0.10, Levels.thdRToThdF(Levels.thdFToThdR(0.10)), 1e-15);
        assertEquals(-40, Levels.ratioToDb(0.01), 1e-12);
        assertEquals(1.0, Levels.ratioToPercent(0.01), 1e-15);
        // docs/references.md §3 worked numbers: 1 W into 8 Ω = 2.828 V rms = +11.25 dBu = +9.03 dBV
        assertEquals(9.03, Levels.dbv(Math.sqrt(8)), 0.005);
        assertEquals(11.25, Levels.dbu(Math.sqrt(8)), 0.005);
        // AES17 / docs/references.md §2: a full-scale sine is 0 dBFS
        assertEquals(0.0, Levels.dbfs(1 / Math.sqrt(2)), 1e-12);
    }
}
