package org.outstage.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.outstage.analysis.Analyzer;
import org.outstage.analysis.Measurement;
import org.outstage.capture.Capture;
import org.outstage.capture.WavReader;

class ToneCommandTest {
    @TempDir Path dir;

    @Test
    void sine24Bit_analysesToItsFrequencyAndLevel_atTheDitheredFloor() throws Exception {
        Path f = dir.resolve("t.wav");
        CliRun r = CliRun.of("tone", "sine:997", "--seconds", "2", "--out", f.toString(), "--bits", "24", "--level-dbfs", "-20");
        assertEquals(0, r.exit(), r.err());
        Capture c = WavReader.read(f);
        assertEquals(192_000, c.frameCount());
        Measurement m = Analyzer.analyze(c, 0, org.outstage.analysis.AnalysisSettings.defaults());
        assertEquals(997.0, m.fundamental().frequencyHz(), 1e-4);
        // Peak −20 dBFS: rms 0.1/√2 (docs/references.md §2)
        assertEquals(-20.0, 20 * Math.log10(m.fundamental().amplitudePeak()), 0.001);
        // 24-bit TPDF-dithered floor: 6.02·24 + 1.76 dB re full scale, −4.8 dB for TPDF, +3.8 dB band (20 k of 48 k),
        // −20 dB level: about −125 dB (docs/references.md §11 identities); the file must reach within 5 dB of it.
        assertTrue(m.thdN().db() < -120, "THD+N " + m.thdN().db());
    }

    @Test
    void sweepFloat_writesItsLength_andBadInputExits2WithNothingWritten() throws Exception {
        Path f = dir.resolve("s.wav");
        assertEquals(0, CliRun.of("tone", "sweep:20-20k", "--seconds", "1.5", "--out", f.toString(), "--bits", "float").exit());
        assertEquals(144_000, WavReader.read(f).frameCount());
        Path bad = dir.resolve("bad.wav");
        CliRun loud = CliRun.of("tone", "sine:1000", "--seconds", "1", "--out", bad.toString(), "--level-dbfs", "-6");
        assertEquals(2, loud.exit());
        assertTrue(loud.err().contains("--allow-loud"), loud.err());
        assertEquals(2, CliRun.of("tone", "saw:100", "--seconds", "1", "--out", bad.toString()).exit());
        assertEquals(2, CliRun.of("tone", "sine:60k", "--seconds", "1", "--out", bad.toString()).exit());
        assertEquals(2, CliRun.of("tone", "sine:1k", "--seconds", "1", "--out", dir.resolve("no/such/dir.wav").toString()).exit());
        assertFalse(Files.exists(bad));
        assertEquals(0, CliRun.of("tone", "sine:1000", "--seconds", "1", "--out", bad.toString(), "--level-dbfs", "-6", "--allow-loud").exit());
    }
}
