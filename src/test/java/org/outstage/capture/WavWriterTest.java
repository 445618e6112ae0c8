package org.outstage.capture;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Random;
import javax.sound.sampled.AudioFormat;
import javax.sound.sampled.AudioInputStream;
import javax.sound.sampled.AudioSystem;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.EnumSource;

/** WavWriter round trips; oracle: code/2^(bits−1) values come back bit-exact, floats as stored (docs/references.md §10). */
class WavWriterTest {
    @TempDir Path dir;

    private static double[] gridValues(int bits, int n, long seed) {
        Random r = new Random(seed);
        long full = 1L << (bits - 1);
        double[] x = new double[n];
        for (int i = 0; i < n; i++) x[i] = ((long) Math.floor(r.nextDouble() * 2 * full) - full) / (double) full;
        x[0] = -1.0;
        x[1] = (full - 1) / (double) full;
        return x;
    }

    @ParameterizedTest
    @EnumSource(WavWriter.Encoding.class)
    void writeThenRead_plainAndExtensible_bitExact(WavWriter.Encoding enc) throws Exception {
        for (boolean extensible : new boolean[] {false, true}) {
            double[] a = enc.isFloat() ? randomFloats(301, 1, enc) : gridValues(enc.bitsPerSample(), 301, 1);
            double[] b = enc.isFloat() ? randomFloats(301, 2, enc) : gridValues(enc.bitsPerSample(), 301, 2);
            Path p = dir.resolve(enc + "-" + extensible + ".wav");
            WavWriter.write(p, 96000, enc, extensible, a, b);
            Capture c = WavReader.read(p);
            assertEquals(96000.0, c.sampleRateHz());
            assertEquals(java.util.List.of(), c.warnings());
            assertArrayEquals(a, c.readChannel(0), enc + " extensible=" + extensible);
            assertArrayEquals(b, c.readChannel(1), enc + " extensible=" + extensible);
        }
    }

    private static double[] randomFloats(int n, long seed, WavWriter.Encoding enc) {
        Random r = new Random(seed);
        double[] x = new double[n];
        for (int i = 0; i < n; i++) x[i] = enc == WavWriter.Encoding.FLOAT_32 ? (double) (float) (2 * r.nextDouble() - 1) : 2 * r.nextDouble() - 1;
        return x;
    }

    @Test
    void pcm16_isReadableByTheJdk_withTheSameCodes() throws Exception {
        // Independent reader: javax.sound.sampled parses our header and returns the little-endian codes we meant.
        double[] x = gridValues(16, 64, 3);
        Path p = dir.resolve("jdk.wav");
        WavWriter.write(p, 44100, WavWriter.Encoding.PCM_16, false, x);
        try (AudioInputStream in = AudioSystem.getAudioInputStream(p.toFile())) {
            AudioFormat f = in.getFormat();
            assertEquals(44100f, f.getSampleRate());
            assertEquals(16, f.getSampleSizeInBits());
            assertEquals(1, f.getChannels());
            byte[] bytes = in.readAllBytes();
            assertEquals(128, bytes.length);
            for (int i = 0; i < x.length; i++) {
                short code = (short) ((bytes[2 * i] & 0xff) | bytes[2 * i + 1] << 8);
                assertEquals(x[i] * 32768, code, 0.0);
            }
        }
    }

    @Test
    void valuesBeyondFullScale_clampToTheCodeRange() throws Exception {
        Path p = dir.resolve("clip.wav");
        WavWriter.write(p, 8000, WavWriter.Encoding.PCM_16, false, new double[] {1.5, -1.5, 1.0});
        assertArrayEquals(new double[] {32767 / 32768.0, -1.0, 32767 / 32768.0}, WavReader.read(p).readChannel(0));
    }

    @Test
    void nanSample_refusedAndNothingWritten() throws Exception {
        Path p = dir.resolve("nan.wav");
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> WavWriter.write(p, 8000, WavWriter.Encoding.PCM_24, false, new double[] {0.1, Double.NaN}));
        assertEquals("sample=NaN must be a finite number", e.getMessage());
        assertEquals(false, Files.exists(p));
        try (var files = Files.list(dir)) { assertEquals(0, files.count()); }
    }

    @Test
    void unequalChannels_refused() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> WavWriter.write(dir.resolve("u.wav"), 8000, WavWriter.Encoding.FLOAT_32, false, new double[3], new double[2]));
        assertEquals("channel 2 has 2 samples, channel 1 has 3", e.getMessage());
    }
}
