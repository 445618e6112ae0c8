package org.outstage.audio;

import org.outstage.stimulus.Dither;

/**
 * Little-endian interleaved PCM and float samples to and from full-scale doubles. An integer code c of b bits is
 * c / 2^(b−1), the scaling of capture.WavReader; encoding rounds and clamps to the code range after TPDF dither.
 */
final class PcmCodec {
    private PcmCodec() {}

    /** Decodes {@code frames} frames from {@code bytes} into {@code out[channel][offset + i]}. */
    static void decode(byte[] bytes, int frames, LineFormat f, double[][] out, int offset) {
        int ch = f.channels();
        int b = f.sampleFormat().bytes();
        int p = 0;
        for (int i = 0; i < frames; i++) {
            for (int c = 0; c < ch; c++) {
                double v;
                switch (f.sampleFormat()) {
                    case PCM_16 -> v = (short) ((bytes[p] & 0xFF) | (bytes[p + 1] << 8)) / 32768.0;
                    case PCM_24 -> v = ((bytes[p] & 0xFF) | ((bytes[p + 1] & 0xFF) << 8) | (bytes[p + 2] << 16)) / 8388608.0;
                    case PCM_32 -> v = ((bytes[p] & 0xFF) | ((bytes[p + 1] & 0xFF) << 8) | ((bytes[p + 2] & 0xFF) << 16) | (bytes[p + 3] << 24)) / 2147483648.0;
                    case FLOAT_32 -> v = Float.intBitsToFloat((bytes[p] & 0xFF) | ((bytes[p + 1] & 0xFF) << 8) | ((bytes[p + 2] & 0xFF) << 16) | (bytes[p + 3] << 24));
                    default -> throw new AssertionError();
                }
                if (c < out.length) out[c][offset + i] = v;
                p += b;
            }
        }
    }

    /** Encodes {@code frames} mono samples into every channel of {@code bytes}, dithering integer formats. */
    static void encode(double[] mono, int offset, int frames, LineFormat f, Dither dither, byte[] bytes) {
        int ch = f.channels();
        int p = 0;
        SampleFormat sf = f.sampleFormat();
        for (int i = 0; i < frames; i++) {
            double x = mono[offset + i];
            if (sf.isFloat()) {
                int bits = Float.floatToIntBits((float) x);
                for (int c = 0; c < ch; c++) {
                    bytes[p++] = (byte) bits;
                    bytes[p++] = (byte) (bits >> 8);
                    bytes[p++] = (byte) (bits >> 16);
                    bytes[p++] = (byte) (bits >> 24);
                }
                continue;
            }
            int nbits = sf.bits();
            long full = 1L << (nbits - 1);
            double d = x == 0 ? 0 : dither.next(nbits); // digital silence stays silent
            long code = Math.max(-full, Math.min(full - 1, Math.round((x + d) * full)));
            for (int c = 0; c < ch; c++) {
                bytes[p++] = (byte) code;
                bytes[p++] = (byte) (code >> 8);
                if (nbits >= 24) bytes[p++] = (byte) (code >> 16);
                if (nbits == 32) bytes[p++] = (byte) (code >> 24);
            }
        }
    }
}
