package org.outstage.capture;

import java.io.ByteArrayOutputStream;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.charset.StandardCharsets;

/** Builds WAV files byte by byte for tests, following the RIFF / WAVEFORMATEXTENSIBLE / ds64 layouts of docs/references.md §10. */
final class WavBytes {
    private final ByteArrayOutputStream body = new ByteArrayOutputStream();
    private String magic = "RIFF";
    private Long riffSizeOverride;

    static WavBytes riff() { return new WavBytes(); }

    WavBytes magic(String m) { magic = m; return this; }

    WavBytes riffSize(long size) { riffSizeOverride = size; return this; }

    /** A chunk with its true size (pad byte added when odd). */
    WavBytes chunk(String id, byte[] data) { return chunk(id, data.length, data, true); }

    /** A chunk whose size field says {@code claimed}, followed by {@code data} (and a pad byte if {@code pad} and odd). */
    WavBytes chunk(String id, long claimed, byte[] data, boolean pad) {
        body.writeBytes(id.getBytes(StandardCharsets.ISO_8859_1));
        body.writeBytes(le32(claimed));
        body.writeBytes(data);
        if (pad && (data.length & 1) == 1) body.write(0);
        return this;
    }

    WavBytes raw(byte[] data) { body.writeBytes(data); return this; }

    byte[] bytes() {
        byte[] b = body.toByteArray();
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        out.writeBytes(magic.getBytes(StandardCharsets.ISO_8859_1));
        out.writeBytes(le32(riffSizeOverride != null ? riffSizeOverride : b.length + 4));
        out.writeBytes("WAVE".getBytes(StandardCharsets.ISO_8859_1));
        out.writeBytes(b);
        return out.toByteArray();
    }

    static byte[] fmt(int tag, int channels, int rate, int blockAlign, int bits) {
        return buf(16).putShort((short) tag).putShort((short) channels).putInt(rate).putInt(rate * blockAlign)
                .putShort((short) blockAlign).putShort((short) bits).array();
    }

    /** WAVEFORMATEXTENSIBLE: 40 bytes, SubFormat GUID {@code <subTag>-0000-0010-8000-00AA00389B71}. */
    static byte[] fmtExtensible(int channels, int rate, int containerBits, int validBits, int subTag) {
        int blockAlign = channels * containerBits / 8;
        return buf(40).putShort((short) 0xFFFE).putShort((short) channels).putInt(rate).putInt(rate * blockAlign)
                .putShort((short) blockAlign).putShort((short) containerBits).putShort((short) 22).putShort((short) validBits)
                .putInt(channels == 2 ? 3 : 0).putInt(subTag)
                .put(new byte[] {0x00, 0x00, 0x10, 0x00, (byte) 0x80, 0x00, 0x00, (byte) 0xAA, 0x00, 0x38, (byte) 0x9B, 0x71}).array();
    }

    /** Interleaves integer codes (frames × channels) into little-endian samples of {@code bytes} each. */
    static byte[] pcm(int bytes, long[][] codesByChannel) {
        int ch = codesByChannel.length, n = codesByChannel[0].length;
        ByteBuffer b = buf(n * ch * bytes);
        for (int i = 0; i < n; i++)
            for (long[] channel : codesByChannel) {
                long v = channel[i];
                if (bytes == 1) v += 128; // unsigned 8-bit
                for (int k = 0; k < bytes; k++) b.put((byte) (v >> (8 * k)));
            }
        return b.array();
    }

    static byte[] floats(float[] x) {
        ByteBuffer b = buf(4 * x.length);
        for (float v : x) b.putFloat(v);
        return b.array();
    }

    static byte[] doubles(double[] x) {
        ByteBuffer b = buf(8 * x.length);
        for (double v : x) b.putDouble(v);
        return b.array();
    }

    static ByteBuffer buf(int n) { return ByteBuffer.allocate(n).order(ByteOrder.LITTLE_ENDIAN); }

    static byte[] le32(long v) { return buf(4).putInt((int) v).array(); }
}
