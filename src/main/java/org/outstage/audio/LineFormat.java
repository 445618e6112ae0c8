package org.outstage.audio;

/**
 * The format of an audio line.
 *
 * @param sampleRateHz frames per second (44100, 48000, 96000, 192000 are the rates offered on the command line)
 * @param sampleFormat encoding of one sample
 * @param channels     1 or 2
 */
public record LineFormat(int sampleRateHz, SampleFormat sampleFormat, int channels) {
    /** The rates Outstage asks a device about. */
    public static final int[] STANDARD_RATES_HZ = {44_100, 48_000, 96_000, 192_000};

    public LineFormat {
        if (sampleRateHz < 8000 || sampleRateHz > 768_000) throw new IllegalArgumentException("sampleRateHz=" + sampleRateHz + " must be in [8000, 768000]");
        if (sampleFormat == null) throw new IllegalArgumentException("sampleFormat must not be null");
        if (channels < 1 || channels > 2) throw new IllegalArgumentException("channels=" + channels + " must be 1 or 2");
    }

    public int frameBytes() { return channels * sampleFormat.bytes(); }

    @Override
    public String toString() { return sampleRateHz + " Hz, " + sampleFormat.label() + (sampleFormat.isFloat() ? "" : "-bit") + ", " + channels + " ch"; }
}
