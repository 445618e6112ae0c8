package org.outstage.capture;

import java.io.BufferedOutputStream;
import java.io.IOException;
import java.io.OutputStream;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import org.outstage.Require;

/**
 * Writes small WAV files (plain RIFF) for tests and signal generators: PCM 16/24/32-bit or IEEE float
 * 32/64-bit, optionally as WAVE_FORMAT_EXTENSIBLE. Values are in full-scale units, the inverse of
 * {@link WavReader}: an integer code is {@code round(x·2^(bits−1))}, clamped to the code range, so
 * {@code code / 2^(bits−1)} written and read back is bit-exact. The file is written to a temporary
 * sibling and moved into place, so a failure leaves nothing half-written.
 */
public final class WavWriter {
    /** Sample encodings the writer offers. */
    public enum Encoding {
        PCM_16(WavCoding.PCM_S16), PCM_24(WavCoding.PCM_S24), PCM_32(WavCoding.PCM_S32),
        FLOAT_32(WavCoding.FLOAT_32), FLOAT_64(WavCoding.FLOAT_64);

        final WavCoding coding;

        Encoding(WavCoding coding) { this.coding = coding; }

        public int bitsPerSample() { return coding.bits(); }
        public boolean isFloat() { return coding.isFloat(); }
    }

    private WavWriter() {}

    /**
     * Writes {@code channels} (each the same length, full-scale units) to {@code file}.
     *
     * @param extensible write a WAVE_FORMAT_EXTENSIBLE header (valid bits = container bits, channel mask 0)
     */
    public static void write(Path file, int sampleRateHz, Encoding encoding, boolean extensible, double[]... channels) throws IOException {
        Require.notNull("file", file);
        Require.notNull("encoding", encoding);
        Require.positive("sampleRateHz", sampleRateHz);
        Require.that(channels.length > 0 && channels.length <= 65535, "channels=" + channels.length + " must be in [1, 65535]");
        long frames = channels[0].length;
        for (int c = 0; c < channels.length; c++)
            Require.that(channels[c].length == frames, "channel " + (c + 1) + " has " + channels[c].length + " samples, channel 1 has " + frames);
        WavCoding coding = encoding.coding;
        int blockAlign = channels.length * coding.bytes;
        Require.that(blockAlign <= 65535, "blockAlign=" + blockAlign + " must be <= 65535 (too many channels)");
        long dataBytes = frames * blockAlign;
        int fmtSize = extensible ? 40 : (coding.isFloat() ? 18 : 16);
        long riffSize = 4 + 8 + fmtSize + 8 + dataBytes + (dataBytes & 1);
        Require.that(riffSize <= 0xFFFFFFFFL, "dataBytes=" + dataBytes + " must fit a RIFF file (< 4 GiB)");

        ByteBuffer h = ByteBuffer.allocate(12 + 8 + fmtSize + 8).order(ByteOrder.LITTLE_ENDIAN);
        h.put(ascii("RIFF")).putInt((int) riffSize).put(ascii("WAVE"));
        h.put(ascii("fmt ")).putInt(fmtSize);
        h.putShort((short) (extensible ? 0xFFFE : coding.isFloat() ? 3 : 1));
        h.putShort((short) channels.length).putInt(sampleRateHz).putInt(sampleRateHz * blockAlign);
        h.putShort((short) blockAlign).putShort((short) coding.bits());
        if (extensible) {
            h.putShort((short) 22).putShort((short) coding.bits()).putInt(0);
            h.putInt(coding.isFloat() ? 3 : 1).put(new byte[] {0x00, 0x00, 0x10, 0x00, (byte) 0x80, 0x00, 0x00, (byte) 0xAA, 0x00, 0x38, (byte) 0x9B, 0x71});
        } else if (coding.isFloat()) {
            h.putShort((short) 0);
        }
        h.put(ascii("data")).putInt((int) dataBytes);

        Path dir = file.toAbsolutePath().getParent();
        Path tmp = Files.createTempFile(dir, "." + file.getFileName(), ".part");
        try {
            try (OutputStream out = new BufferedOutputStream(Files.newOutputStream(tmp), 1 << 16)) {
                out.write(h.array());
                ByteBuffer frame = ByteBuffer.allocate(blockAlign).order(ByteOrder.LITTLE_ENDIAN);
                for (int i = 0; i < frames; i++) {
                    frame.clear();
                    for (double[] channel : channels) put(frame, coding, channel[i]);
                    out.write(frame.array());
                }
                if ((dataBytes & 1) != 0) out.write(0);
            }
            Files.move(tmp, file, StandardCopyOption.REPLACE_EXISTING, StandardCopyOption.ATOMIC_MOVE);
        } finally {
            Files.deleteIfExists(tmp);
        }
    }

    private static void put(ByteBuffer b, WavCoding coding, double x) {
        switch (coding) {
            case PCM_S16: b.putShort((short) code(x, 16)); break;
            case PCM_S24: {
                int v = (int) code(x, 24);
                b.put((byte) v).put((byte) (v >> 8)).put((byte) (v >> 16));
                break;
            }
            case PCM_S32: b.putInt((int) code(x, 32)); break;
            case FLOAT_32: b.putFloat((float) x); break;
            case FLOAT_64: b.putDouble(x); break;
            default: throw new AssertionError(coding);
        }
    }

    /** {@code round(x·2^(bits−1))} clamped to [−2^(bits−1), 2^(bits−1)−1]; NaN is refused. */
    static long code(double x, int bits) {
        Require.finite("sample", x);
        long full = 1L << (bits - 1);
        long c = Math.round(x * full);
        return Math.max(-full, Math.min(full - 1, c));
    }

    private static byte[] ascii(String s) { return s.getBytes(java.nio.charset.StandardCharsets.US_ASCII); }
}
