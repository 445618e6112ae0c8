package org.outstage.capture;

import java.nio.ByteBuffer;

/**
 * How one sample is stored in a WAV data chunk, and how it becomes a double.
 *
 * <p>Integer convention: a code is divided by 2<sup>bits−1</sup> of its container, so 16-bit −32768 reads
 * −1.0 and +32767 reads 0.999969 (docs/references.md §10; the other common convention, 2<sup>bits−1</sup>−1,
 * differs by 0.00027 dB at 16 bits). 8-bit PCM is unsigned with 128 as zero. Left-justified valid bits in a
 * WAVE_FORMAT_EXTENSIBLE container (e.g. 20 of 24) come out right because their unused low bits are zero.
 */
enum WavCoding {
    PCM_U8(1), PCM_S16(2), PCM_S24(3), PCM_S32(4), FLOAT_32(4), FLOAT_64(8);

    final int bytes;

    WavCoding(int bytes) { this.bytes = bytes; }

    /**
     * Decodes {@code n} samples, {@code stride} bytes apart from byte {@code first} of a heap buffer, into
     * {@code out[off…]} (little-endian; a loop per coding, no per-sample switch).
     */
    void decode(ByteBuffer b, int first, int stride, int n, double[] out, int off) {
        byte[] a = b.array();
        int p = b.arrayOffset() + first;
        switch (this) {
            case PCM_U8:
                for (int i = 0; i < n; i++, p += stride) out[off + i] = ((a[p] & 0xff) - 128) / 128.0;
                break;
            case PCM_S16:
                for (int i = 0; i < n; i++, p += stride) out[off + i] = (short) ((a[p] & 0xff) | a[p + 1] << 8) / 32768.0;
                break;
            case PCM_S24:
                for (int i = 0; i < n; i++, p += stride)
                    out[off + i] = ((a[p] & 0xff) | (a[p + 1] & 0xff) << 8 | a[p + 2] << 16) / 8388608.0;
                break;
            case PCM_S32:
                for (int i = 0; i < n; i++, p += stride) out[off + i] = int32(a, p) / 2147483648.0;
                break;
            case FLOAT_32:
                for (int i = 0; i < n; i++, p += stride) out[off + i] = Float.intBitsToFloat(int32(a, p));
                break;
            case FLOAT_64:
                for (int i = 0; i < n; i++, p += stride)
                    out[off + i] = Double.longBitsToDouble((int32(a, p) & 0xffffffffL) | (long) int32(a, p + 4) << 32);
                break;
            default: throw new AssertionError(this);
        }
    }

    private static int int32(byte[] a, int p) {
        return (a[p] & 0xff) | (a[p + 1] & 0xff) << 8 | (a[p + 2] & 0xff) << 16 | a[p + 3] << 24;
    }

    boolean isFloat() { return this == FLOAT_32 || this == FLOAT_64; }

    int bits() { return bytes * 8; }

    static WavCoding pcm(int containerBits) {
        switch (containerBits) {
            case 8: return PCM_U8;
            case 16: return PCM_S16;
            case 24: return PCM_S24;
            case 32: return PCM_S32;
            default: return null;
        }
    }

    static WavCoding floating(int bits) {
        switch (bits) {
            case 32: return FLOAT_32;
            case 64: return FLOAT_64;
            default: return null;
        }
    }
}
