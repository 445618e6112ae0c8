package org.outstage.capture;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.OptionalDouble;
import java.util.OptionalInt;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class BenchManifestTest {
    @TempDir Path dir;

    @Test
    void laterRules_overrideEarlierKeys() throws Exception {
        Path f = dir.resolve("bench.txt");
        Files.writeString(f, "# c\n*.wav fs-volts=40 load=8 series=lvl\n\nxy-*.wav reference=1 # generator on 1\n*.csv load=4 probe=10\n");
        BenchManifest m = BenchManifest.forFolder(dir);
        BenchManifest.Entry xy = m.entryFor(Path.of("x/xy-01.wav"));
        assertEquals(OptionalDouble.of(40), xy.captureOptions().fullScaleVolts());
        assertEquals(OptionalDouble.of(8), xy.loadOhms());
        assertEquals(OptionalInt.of(1), xy.referenceChannel());
        assertEquals(java.util.Optional.of("lvl"), xy.series());
        BenchManifest.Entry csv = m.entryFor(Path.of("scope.csv"));
        assertEquals(OptionalDouble.of(10), csv.captureOptions().probeFactor());
        assertEquals(OptionalDouble.of(4), csv.loadOhms());
        assertTrue(m.entryFor(Path.of("other.flac")).loadOhms().isEmpty());
    }

    @Test
    void badLines_nameTheLine() throws Exception {
        Path f = dir.resolve("bench.txt");
        Files.writeString(f, "*.wav fs-volts=40\n*.wav load=-8\n");
        CaptureFormatException e = assertThrows(CaptureFormatException.class, () -> BenchManifest.read(f));
        assertEquals("bench.txt: line 2: load=-8 must be a positive number", e.getMessage());
        Files.writeString(f, "*.wav gain=2\n");
        e = assertThrows(CaptureFormatException.class, () -> BenchManifest.read(f));
        assertEquals("bench.txt: line 1: unknown key \"gain\" (known: fs-volts, probe, sample-rate, load, reference, roles, channel, series)", e.getMessage());
        Files.writeString(f, "*.wav reference=1.5\n");
        e = assertThrows(CaptureFormatException.class, () -> BenchManifest.read(f));
        assertEquals("bench.txt: line 1: reference=1.5 must be a positive number (a channel from 1)", e.getMessage());
    }

    @Test
    void noManifest_isEmpty() throws Exception {
        assertTrue(BenchManifest.forFolder(dir).entryFor(Path.of("a.wav")).captureOptions().fullScaleVolts().isEmpty());
    }
}
