package org.outstage.audio;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.outstage.capture.Capture;
import org.outstage.capture.WavReader;
import org.outstage.stimulus.Dither;

/** The recorder's files read back through the project's WAV reader (layout: docs/references.md §10). */
class WavRecorderTest {
    @TempDir Path dir;

    private static double[][] frames(int n) {
        double[][] d = new double[2][n];
        for (int i = 0; i < n; i++) {
            d[0][i] = Math.sin(i * 0.01) * 0.5;
            d[1][i] = -d[0][i] / 2;
        }
        return d;
    }

    @Test
    void closed_fileHasTrueSizes_andTheSamples() throws Exception {
        Path f = dir.resolve("a.wav");
        double[][] d = frames(1000);
        try (WavRecorder r = WavRecorder.create(f, 48_000, 2)) {
            r.write(d, 0, 600);
            r.write(d, 600, 400);
        }
        Capture c = WavReader.read(f);
        assertTrue(c.warnings().isEmpty(), c.warnings().toString());
        assertEquals(1000, c.frameCount());
        assertEquals(48_000, c.sampleRateHz());
        double[] expect = new double[1000];
        for (int i = 0; i < 1000; i++) expect[i] = (float) d[1][i];
        assertArrayEquals(expect, c.readChannel(1), 0.0);
    }

    @Test
    void neverClosed_asAfterKill9_isSalvagedWithAWarning() throws Exception {
        Path f = dir.resolve("b.wav");
        WavRecorder r = WavRecorder.create(f, 96_000, 2);
        r.write(frames(777), 0, 777);
        // no close: the header keeps its 0xFFFFFFFF sizes, as after kill -9
        Capture c = WavReader.read(f);
        assertEquals(777, c.frameCount());
        assertFalse(c.warnings().isEmpty());
        assertEquals(46 + 777 * 8, Files.size(f));
    }

    @Test
    void pcmCodec_roundTrip_isExactForCodes_andDitherStaysWithinOneLsb() {
        for (SampleFormat sf : SampleFormat.values()) {
            LineFormat f = new LineFormat(48_000, sf, 2);
            double[] x = {0, 0.25, -0.5, 0.123456, -0.999};
            byte[] bytes = new byte[x.length * f.frameBytes()];
            PcmCodec.encode(x, 0, x.length, f, new Dither(1), bytes);
            double[][] back = new double[2][x.length];
            PcmCodec.decode(bytes, x.length, f, back, 0);
            // TPDF dither spans ±1 LSB and rounding adds ½ LSB (Vanderkooy and Lipshitz 1987); float is exact to float.
            double tol = sf.isFloat() ? 1e-7 : 1.5 * Dither.lsb(sf.bits());
            for (int i = 0; i < x.length; i++) {
                assertEquals(x[i], back[0][i], tol, sf + " sample " + i);
                assertEquals(back[0][i], back[1][i], 0.0, "same on both channels");
            }
            assertEquals(0.0, back[0][0], 0.0, "digital silence stays silent");
        }
    }
}
