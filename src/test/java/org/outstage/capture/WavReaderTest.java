package org.outstage.capture;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.ByteArrayInputStream;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Random;
import javax.sound.sampled.AudioFileFormat;
import javax.sound.sampled.AudioFormat;
import javax.sound.sampled.AudioInputStream;
import javax.sound.sampled.AudioSystem;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

/**
 * WAV reading. Oracle for sample values: the integer code divided by 2^(bits−1) (the convention documented in
 * {@link WavReader}; 8-bit is unsigned with 128 = zero, docs/references.md §10), and floats bit-exact. Layouts follow
 * the RIFF/WAVEFORMATEXTENSIBLE/RF64 descriptions in docs/references.md §10 (EBU Tech 3306 for ds64).
 */
class WavReaderTest {
    @TempDir Path dir;

    private Path write(String name, byte[] bytes) throws IOException {
        Path p = dir.resolve(name);
        Files.write(p, bytes);
        return p;
    }

    /** Seeded random integer codes spanning the full range of a {@code bits}-bit signed code, including both extremes. */
    private static long[][] codes(int channels, int frames, int bits, long seed) {
        Random r = new Random(seed);
        long full = 1L << (bits - 1);
        long[][] c = new long[channels][frames];
        for (int ch = 0; ch < channels; ch++)
            for (int i = 0; i < frames; i++) c[ch][i] = (long) Math.floor(r.nextDouble() * 2 * full) - full;
        c[0][0] = -full;
        c[0][1] = full - 1;
        c[0][2] = 0;
        return c;
    }

    private static double[] expected(long[] codes, int bits) {
        double[] e = new double[codes.length];
        for (int i = 0; i < e.length; i++) e[i] = codes[i] / Math.pow(2, bits - 1);
        return e;
    }

    @ParameterizedTest
    @ValueSource(ints = {8, 16, 24, 32})
    void jdkWrittenPcm_readsCodesOverTwoToBitsMinusOne(int bits) throws Exception {
        int channels = 2, frames = 1000;
        long[][] c = codes(channels, frames, bits, 42 + bits);
        byte[] data = WavBytes.pcm(bits / 8, c);
        AudioFormat af = new AudioFormat(bits == 8 ? AudioFormat.Encoding.PCM_UNSIGNED : AudioFormat.Encoding.PCM_SIGNED,
                44100f, bits, channels, channels * bits / 8, 44100f, false);
        Path p = dir.resolve("jdk" + bits + ".wav");
        try (AudioInputStream in = new AudioInputStream(new ByteArrayInputStream(data), af, frames)) {
            AudioSystem.write(in, AudioFileFormat.Type.WAVE, p.toFile());
        }
        Capture cap = WavReader.read(p);
        assertEquals(44100.0, cap.sampleRateHz());
        assertEquals(channels, cap.channelCount());
        assertEquals(frames, cap.frameCount());
        assertEquals(SampleUnit.FULL_SCALE, cap.unit());
        assertEquals(List.of(), cap.warnings());
        for (int ch = 0; ch < channels; ch++) assertArrayEquals(expected(c[ch], bits), cap.readChannel(ch), "channel " + ch);
        assertEquals(-1.0, cap.readChannel(0)[0]);
    }

    @Test
    void float32_handWritten_bitExact() throws Exception {
        float[] x = {0f, 1f, -1f, 0.5f, 1.5f, -0.123456789f, Float.MIN_VALUE};
        Path p = write("f32.wav", WavBytes.riff().chunk("fmt ", WavBytes.fmt(3, 1, 96000, 4, 32)).chunk("data", WavBytes.floats(x)).bytes());
        double[] got = WavReader.read(p).readChannel(0);
        for (int i = 0; i < x.length; i++) assertEquals((double) x[i], got[i], 0.0);
    }

    @Test
    void float64_stereo_handWritten_bitExact() throws Exception {
        double[] inter = {0.1, -0.2, Math.PI / 4, -1e-300, 1.0, -1.0};
        Path p = write("f64.wav", WavBytes.riff().chunk("fmt ", WavBytes.fmt(3, 2, 192000, 16, 64)).chunk("data", WavBytes.doubles(inter)).bytes());
        Capture c = WavReader.read(p);
        assertEquals(192000.0, c.sampleRateHz());
        assertArrayEquals(new double[] {0.1, Math.PI / 4, 1.0}, c.readChannel(0));
        assertArrayEquals(new double[] {-0.2, -1e-300, -1.0}, c.readChannel(1));
    }

    @Test
    void extensiblePcm_20bitsLeftJustifiedIn24_readsValidCodeOverTwoToNineteen() throws Exception {
        // 20 valid bits, left-justified: container code = valid code << 4 (Microsoft WAVEFORMATEXTENSIBLE, docs/references.md §10)
        long[] valid = {-(1 << 19), (1 << 19) - 1, 0, 12345, -54321};
        long[] container = new long[valid.length];
        for (int i = 0; i < valid.length; i++) container[i] = valid[i] << 4;
        Path p = write("ext20.wav", WavBytes.riff().chunk("fmt ", WavBytes.fmtExtensible(1, 48000, 24, 20, 1))
                .chunk("data", WavBytes.pcm(3, new long[][] {container})).bytes());
        assertArrayEquals(expected(valid, 20), WavReader.read(p).readChannel(0));
    }

    @Test
    void extensibleFloat_stereo_bitExact() throws Exception {
        float[] inter = {0.25f, -0.75f, 0.125f, 0.0625f};
        Path p = write("extf.wav", WavBytes.riff().chunk("fmt ", WavBytes.fmtExtensible(2, 48000, 32, 32, 3))
                .chunk("data", WavBytes.floats(inter)).bytes());
        Capture c = WavReader.read(p);
        assertArrayEquals(new double[] {0.25, 0.125}, c.readChannel(0));
        assertArrayEquals(new double[] {-0.75, 0.0625}, c.readChannel(1));
    }

    @Test
    void oddUnknownChunkBeforeFmtAndData_andListAfterData_areSkipped() throws Exception {
        long[][] c = codes(3, 101, 16, 7);
        Path p = write("chunks.wav", WavBytes.riff()
                .chunk("JUNK", new byte[] {1, 2, 3})            // odd size: pad byte follows
                .chunk("fmt ", WavBytes.fmt(1, 3, 44100, 6, 16))
                .chunk("bext", new byte[] {9, 9, 9, 9, 9})       // odd, between fmt and data
                .chunk("data", WavBytes.pcm(2, c))
                .chunk("LIST", "INFOISFT\u0004\0\0\0abc\0".getBytes(java.nio.charset.StandardCharsets.ISO_8859_1))
                .bytes());
        Capture cap = WavReader.read(p);
        assertEquals(101, cap.frameCount());
        for (int ch = 0; ch < 3; ch++) assertArrayEquals(expected(c[ch], 16), cap.readChannel(ch));
        assertEquals(List.of(), cap.warnings());
    }

    @ParameterizedTest
    @ValueSource(strings = {"RF64", "BW64"})
    void rf64_sizesFromDs64_read(String magic) throws Exception {
        long[][] c = codes(2, 50, 24, 11);
        byte[] data = WavBytes.pcm(3, c);
        byte[] fmt = WavBytes.fmt(1, 2, 48000, 6, 24);
        long riffSize64 = 4 + (8 + 28) + (8 + fmt.length) + (8 + data.length);
        byte[] ds64 = WavBytes.buf(28).putLong(riffSize64).putLong(data.length).putLong(50).putInt(0).array();
        Path p = write("big." + magic.toLowerCase(), WavBytes.riff().magic(magic).riffSize(0xFFFFFFFFL)
                .chunk("ds64", ds64).chunk("fmt ", fmt).chunk("data", 0xFFFFFFFFL, data, true).bytes());
        Capture cap = WavReader.read(p);
        assertEquals(50, cap.frameCount());
        assertArrayEquals(expected(c[0], 24), cap.readChannel(0));
        assertArrayEquals(expected(c[1], 24), cap.readChannel(1));
    }

    @Test
    void rf64_otherChunkSizedByDs64Table_skipped() throws Exception {
        long[][] c = codes(1, 20, 16, 12);
        byte[] data = WavBytes.pcm(2, c);
        byte[] junk = new byte[6];
        // ds64 with one table entry: chunk id 'JUNK', 64-bit size 6 (EBU Tech 3306 ChunkSize64 table)
        byte[] ds64 = WavBytes.buf(40).putLong(0).putLong(data.length).putLong(20).putInt(1)
                .put("JUNK".getBytes(java.nio.charset.StandardCharsets.ISO_8859_1)).putLong(junk.length).array();
        Path p = write("table.rf64", WavBytes.riff().magic("RF64").riffSize(0xFFFFFFFFL).chunk("ds64", ds64)
                .chunk("JUNK", 0xFFFFFFFFL, junk, true).chunk("fmt ", WavBytes.fmt(1, 1, 8000, 2, 16))
                .chunk("data", 0xFFFFFFFFL, data, true).bytes());
        assertArrayEquals(expected(c[0], 16), WavReader.read(p).readChannel(0));
    }

    @Test
    void dataSizeNotWholeFrames_warnsAndDropsThePartialFrame() throws Exception {
        long[][] c = codes(2, 4, 16, 13);
        byte[] data = java.util.Arrays.copyOf(WavBytes.pcm(2, c), 18); // 4 frames of 4 bytes + 2 stray bytes
        Path p = write("odd.wav", WavBytes.riff().chunk("fmt ", WavBytes.fmt(1, 2, 8000, 4, 16)).chunk("data", data).bytes());
        Capture cap = WavReader.read(p);
        assertEquals(4, cap.frameCount());
        assertEquals(List.of("byte 40: data chunk size 18 is not a whole number of 4-byte frames; the last partial frame is ignored"), cap.warnings());
        assertArrayEquals(expected(c[0], 16), cap.readChannel(0));
    }

    @Test
    void truncatedDataChunk_warnsAndReadsWholeFramesToTheEnd() throws Exception {
        long[][] c = codes(2, 10, 16, 3);
        byte[] data = WavBytes.pcm(2, c);
        byte[] cut = java.util.Arrays.copyOf(data, data.length - 2); // last frame incomplete
        Path p = write("cut.wav", WavBytes.riff().chunk("fmt ", WavBytes.fmt(1, 2, 8000, 4, 16)).chunk("data", data.length, cut, false).bytes());
        Capture cap = WavReader.read(p);
        assertEquals(9, cap.frameCount());
        assertEquals(List.of("byte 40: data chunk claims 40 bytes but the file holds 38 after its header; read 9 whole frames"), cap.warnings());
        assertArrayEquals(java.util.Arrays.copyOf(expected(c[1], 16), 9), cap.readChannel(1));
    }

    @ParameterizedTest
    @ValueSource(longs = {1L << 30, 0xFFFFFFF0L})
    void hugeClaimedDataChunkInTinyFile_readsWhatIsThereWithoutAllocatingTheClaim(long claimed) throws Exception {
        // If the reader sized a buffer from the claim, 4 GiB would not fit an array (and 1 GiB would be a heap-sized
        // allocation); reading must instead stop at the real end of the file.
        long[][] c = codes(1, 5, 16, 5);
        Path p = write("claim.wav", WavBytes.riff().chunk("fmt ", WavBytes.fmt(1, 1, 8000, 2, 16)).chunk("data", claimed, WavBytes.pcm(2, c), false).bytes());
        Capture cap = WavReader.read(p);
        assertEquals(5, cap.frameCount());
        assertArrayEquals(expected(c[0], 16), cap.readChannel(0));
        assertEquals(1, cap.warnings().size());
        assertTrue(cap.warnings().get(0).startsWith("byte 40: data chunk claims " + claimed + " bytes but the file holds 10"), cap.warnings().get(0));
    }

    @Test
    void blockwiseStreaming_multiChannel_matchesWholeRead() throws Exception {
        int channels = 5, frames = 40_000; // 40 000 × 5 × 3 bytes = 600 kB: many 64 KiB blocks
        long[][] c = codes(channels, frames, 24, 99);
        Path p = write("long.wav", WavBytes.riff().chunk("fmt ", WavBytes.fmt(1, channels, 192000, channels * 3, 24)).chunk("data", WavBytes.pcm(3, c)).bytes());
        Capture cap = WavReader.read(p);
        for (int ch = 0; ch < channels; ch++) {
            double[] whole = cap.readChannel(ch);
            assertArrayEquals(expected(c[ch], 24), whole);
            // odd request sizes cross block boundaries at awkward places
            double[] pieces = new double[frames];
            int pos = 0, step = 1;
            try (ChannelReader r = cap.openChannel(ch)) {
                int k;
                while ((k = r.read(pieces, pos, Math.min(step, frames - pos))) > 0) { pos += k; step = step * 3 + 1; if (pos == frames) break; }
                assertEquals(-1, r.read(new double[1], 0, 1));
            }
            assertEquals(frames, pos);
            assertArrayEquals(whole, pieces);
        }
    }

    @Test
    void twoReadersOfOneCapture_interleaved_areIndependent() throws Exception {
        long[][] c = codes(2, 30_000, 16, 1);
        Path p = write("two.wav", WavBytes.riff().chunk("fmt ", WavBytes.fmt(1, 2, 48000, 4, 16)).chunk("data", WavBytes.pcm(2, c)).bytes());
        Capture cap = WavReader.read(p);
        double[] a = new double[30_000], b = new double[30_000];
        try (ChannelReader ra = cap.openChannel(0); ChannelReader rb = cap.openChannel(0)) {
            int pa = 0, pb = 0;
            while (pa < a.length || pb < b.length) {
                if (pa < a.length) pa += ra.read(a, pa, Math.min(7000, a.length - pa));
                if (pb < b.length) pb += rb.read(b, pb, Math.min(3000, b.length - pb));
            }
        }
        assertArrayEquals(expected(c[0], 16), a);
        assertArrayEquals(a, b);
    }

    @Test
    void fourThreadsReadingOneCapture_eachGetsTheWholeChannel() throws Exception {
        long[][] c = codes(4, 50_000, 32, 8);
        Path p = write("mt.wav", WavBytes.riff().chunk("fmt ", WavBytes.fmt(1, 4, 96000, 16, 32)).chunk("data", WavBytes.pcm(4, c)).bytes());
        Capture cap = WavReader.read(p);
        java.util.concurrent.ExecutorService pool = java.util.concurrent.Executors.newFixedThreadPool(4);
        try {
            List<java.util.concurrent.Future<double[]>> results = new java.util.ArrayList<>();
            for (int k = 0; k < 8; k++) {
                int ch = k % 4;
                results.add(pool.submit(() -> cap.readChannel(ch)));
            }
            for (int k = 0; k < 8; k++) assertArrayEquals(expected(c[k % 4], 32), results.get(k).get(), "task " + k);
        } finally {
            pool.shutdownNow();
        }
    }

    // ------------------------------------------------------------------ malformed files: exact messages

    private String error(String name, byte[] bytes) throws IOException {
        Path p = write(name, bytes);
        return assertThrows(CaptureFormatException.class, () -> WavReader.read(p)).getMessage();
    }

    private static final byte[] DATA4 = {1, 0, 2, 0};

    @Test
    void missingFmt_named() throws Exception {
        assertEquals("x.wav: byte 24: no fmt chunk before the end of the file",
                error("x.wav", WavBytes.riff().chunk("LIST", new byte[4]).bytes()));
    }

    @Test
    void dataBeforeFmt_named() throws Exception {
        assertEquals("x.wav: byte 12: data chunk comes before any fmt chunk",
                error("x.wav", WavBytes.riff().chunk("data", DATA4).chunk("fmt ", WavBytes.fmt(1, 1, 8000, 2, 16)).bytes()));
    }

    @Test
    void noDataChunk_named() throws Exception {
        assertEquals("x.wav: byte 36: no data chunk before the end of the file",
                error("x.wav", WavBytes.riff().chunk("fmt ", WavBytes.fmt(1, 1, 8000, 2, 16)).bytes()));
    }

    @Test
    void badBlockAlign_named() throws Exception {
        assertEquals("x.wav: byte 32: block align is 2, expected 4 for 2 channel(s) of 16 bits",
                error("x.wav", WavBytes.riff().chunk("fmt ", WavBytes.fmt(1, 2, 8000, 2, 16)).chunk("data", DATA4).bytes()));
    }

    @Test
    void zeroChannels_named() throws Exception {
        assertEquals("x.wav: byte 22: fmt chunk declares 0 channels",
                error("x.wav", WavBytes.riff().chunk("fmt ", WavBytes.fmt(1, 0, 8000, 0, 16)).chunk("data", DATA4).bytes()));
    }

    @Test
    void mp3FormatTag_unsupported() throws Exception {
        assertEquals("x.wav: byte 20: format tag 0x0055 is not supported (PCM 0x0001, IEEE float 0x0003 or extensible 0xFFFE expected)",
                error("x.wav", WavBytes.riff().chunk("fmt ", WavBytes.fmt(0x55, 1, 8000, 2, 16)).chunk("data", DATA4).bytes()));
    }

    @Test
    void twelveBitPlainPcm_unsupported() throws Exception {
        assertEquals("x.wav: byte 34: PCM with 12 bits per sample is not supported (8, 16, 24 or 32 expected; other depths need WAVE_FORMAT_EXTENSIBLE)",
                error("x.wav", WavBytes.riff().chunk("fmt ", WavBytes.fmt(1, 1, 8000, 2, 12)).chunk("data", DATA4).bytes()));
    }

    @Test
    void hugeClaimedFmtSize_refusedWithoutReading() throws Exception {
        assertEquals("x.wav: byte 16: fmt chunk claims 2147483648 bytes, more than the 1024 a format description may use",
                error("x.wav", WavBytes.riff().chunk("fmt ", 0x80000000L, WavBytes.fmt(1, 1, 8000, 2, 16), false).bytes()));
    }

    @Test
    void shortFmt_named() throws Exception {
        assertEquals("x.wav: byte 16: fmt chunk is 12 bytes, at least 16 needed",
                error("x.wav", WavBytes.riff().chunk("fmt ", new byte[12]).chunk("data", DATA4).bytes()));
    }

    @Test
    void fileShorterThanHeader_named() throws Exception {
        assertEquals("x.wav: byte 7: file ends after 7 bytes, inside the 12-byte RIFF header",
                error("x.wav", new byte[] {'R', 'I', 'F', 'F', 0, 0, 0}));
    }

    @Test
    void notRiff_named() throws Exception {
        assertEquals("x.wav: byte 0: not a WAV file: starts with 'OggS', expected RIFF, RF64 or BW64",
                error("x.wav", "OggS\0\0\0\0\0\0\0\0\0\0".getBytes(java.nio.charset.StandardCharsets.ISO_8859_1)));
    }

    @Test
    void riffButNotWave_named() throws Exception {
        byte[] b = WavBytes.riff().bytes();
        b[8] = 'A'; b[9] = 'V'; b[10] = 'I'; b[11] = ' ';
        assertEquals("x.wav: byte 8: form type is 'AVI ', expected WAVE", error("x.wav", b));
    }

    @Test
    void rf64WithoutDs64_named() throws Exception {
        assertEquals("x.wav: byte 12: RF64 file must have a ds64 chunk first, found 'fmt '",
                error("x.wav", WavBytes.riff().magic("RF64").chunk("fmt ", WavBytes.fmt(1, 1, 8000, 2, 16)).chunk("data", DATA4).bytes()));
    }

    @Test
    void unknownExtensibleSubFormat_named() throws Exception {
        assertEquals("x.wav: byte 44: SubFormat 0x0055 is not supported (PCM 0x0001 or IEEE float 0x0003 expected)",
                error("x.wav", WavBytes.riff().chunk("fmt ", WavBytes.fmtExtensible(1, 8000, 16, 16, 0x55)).chunk("data", DATA4).bytes()));
    }

    @Test
    void secondFmtChunk_named() throws Exception {
        byte[] fmt = WavBytes.fmt(1, 1, 8000, 2, 16);
        assertEquals("x.wav: byte 36: second fmt chunk (the first is at byte 12)",
                error("x.wav", WavBytes.riff().chunk("fmt ", fmt).chunk("fmt ", fmt).chunk("data", DATA4).bytes()));
    }

    @Test
    void validBitsAboveContainer_named() throws Exception {
        assertEquals("x.wav: byte 38: valid bits 20 exceed the container of 16 bits",
                error("x.wav", WavBytes.riff().chunk("fmt ", WavBytes.fmtExtensible(1, 8000, 16, 20, 1)).chunk("data", DATA4).bytes()));
    }

    @Test
    void unknownSizeWithoutDs64Entry_named() throws Exception {
        byte[] ds64 = WavBytes.buf(28).putLong(0).putLong(4).putLong(2).putInt(0).array();
        assertEquals("x.wav: byte 52: chunk 'LIST' has size 0xFFFFFFFF but ds64 gives no size for it",
                error("x.wav", WavBytes.riff().magic("BW64").chunk("ds64", ds64).chunk("LIST", 0xFFFFFFFFL, new byte[0], false).bytes()));
    }

    @Test
    void missingFile_named() {
        Path p = dir.resolve("gone.wav");
        CaptureFormatException e = assertThrows(CaptureFormatException.class, () -> WavReader.read(p));
        assertEquals("gone.wav: file: not found (" + p.toAbsolutePath() + ")", e.getMessage());
    }
}
