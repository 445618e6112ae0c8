package org.outstage.capture;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.util.List;
import java.util.Objects;
import org.outstage.Require;

/**
 * One recorded waveform: several channels at one sample rate, with a unit and a calibration.
 * Samples are not held here: a {@link SampleStore} (memory or the file itself) hands them out in
 * blocks, so a ten-minute 192 kHz capture never has to sit in the heap. Immutable and thread-safe
 * as long as the store is (both built-in stores are).
 *
 * <p>Channel indices in this API are 0-based; the command line and JSON number channels from 1.
 *
 * <p>Calibration: {@link #scale()} multiplies every raw value. A WAV read with {@code --fs-volts V}
 * has scale V and unit {@link SampleUnit#VOLTS}; without it, scale 1 and unit
 * {@link SampleUnit#FULL_SCALE}. A scope CSV is in volts, and {@code --probe X} sets scale X.
 */
public final class Capture {
    private final String name;
    private final double sampleRateHz;
    private final int channelCount;
    private final long frameCount;
    private final SampleUnit unit;
    private final double scale;
    private final List<String> warnings;
    private final SampleStore store;
    private final java.util.OptionalInt bitDepth;

    public Capture(String name, double sampleRateHz, int channelCount, long frameCount,
                   SampleUnit unit, double scale, List<String> warnings, SampleStore store) {
        this(name, sampleRateHz, channelCount, frameCount, unit, scale, warnings, store, java.util.OptionalInt.empty());
    }

    /**
     * @param bitDepth resolution of integer PCM samples (the valid bits), empty for float samples and for scope CSV
     */
    public Capture(String name, double sampleRateHz, int channelCount, long frameCount,
                   SampleUnit unit, double scale, List<String> warnings, SampleStore store, java.util.OptionalInt bitDepth) {
        this.bitDepth = Objects.requireNonNull(bitDepth, "bitDepth");
        this.name = Objects.requireNonNull(name, "name");
        this.sampleRateHz = Require.positive("sampleRateHz", sampleRateHz);
        this.channelCount = Require.positive("channelCount", channelCount);
        this.frameCount = frameCount;
        Require.that(frameCount >= 0, "frameCount=" + frameCount + " must be >= 0");
        this.unit = Objects.requireNonNull(unit, "unit");
        this.scale = Require.positive("scale", scale);
        this.warnings = List.copyOf(warnings);
        this.store = Objects.requireNonNull(store, "store");
    }

    /** A capture held in memory; {@code channels[c][i]} is sample i of channel c, already in {@code unit}. */
    public static Capture inMemory(String name, double sampleRateHz, SampleUnit unit, double[]... channels) {
        Require.that(channels.length > 0, "a capture needs at least one channel");
        int n = channels[0].length;
        double[][] copy = new double[channels.length][];
        for (int c = 0; c < channels.length; c++) {
            Require.that(channels[c].length == n, "channel " + (c + 1) + " has " + channels[c].length + " samples, channel 1 has " + n);
            copy[c] = channels[c].clone();
        }
        return new Capture(name, sampleRateHz, channels.length, n, unit, 1.0, List.of(), index -> arrayReader(copy[index]));
    }

    static ChannelReader arrayReader(double[] data) {
        return new ChannelReader() {
            private int pos;

            @Override
            public int read(double[] buffer, int offset, int length) {
                if (pos >= data.length) return -1;
                int k = Math.min(length, data.length - pos);
                System.arraycopy(data, pos, buffer, offset, k);
                pos += k;
                return k;
            }
        };
    }

    public String name() { return name; }
    public double sampleRateHz() { return sampleRateHz; }
    public int channelCount() { return channelCount; }
    public long frameCount() { return frameCount; }
    public double durationSeconds() { return frameCount / sampleRateHz; }
    public SampleUnit unit() { return unit; }
    /** Factor applied to raw values by {@link #openChannel} and {@link #readChannel}. */
    public double scale() { return scale; }
    /** Reader warnings (for example a truncated data chunk): place and problem, without the file name (the caller adds it); empty when the file was clean. */
    public List<String> warnings() { return warnings; }
    /** Resolution of integer PCM samples in bits (the quantisation floor follows from it); empty for float WAV and scope CSV. */
    public java.util.OptionalInt bitDepth() { return bitDepth; }

    /** The same samples multiplied by {@code factor} (on top of the present scale) and labelled {@code newUnit}. */
    public Capture calibrated(double factor, SampleUnit newUnit) {
        return new Capture(name, sampleRateHz, channelCount, frameCount, newUnit, scale * Require.positive("calibration factor", factor), warnings, store, bitDepth);
    }

    /** The same capture with extra warnings appended. */
    public Capture withWarnings(List<String> more) {
        List<String> all = new java.util.ArrayList<>(warnings);
        all.addAll(more);
        return new Capture(name, sampleRateHz, channelCount, frameCount, unit, scale, all, store, bitDepth);
    }

    /** Opens a sequential reader of one channel (0-based), calibration applied. */
    public ChannelReader openChannel(int channelIndex) throws IOException {
        checkChannel(channelIndex);
        ChannelReader raw = store.open(channelIndex);
        if (scale == 1.0) return raw;
        return new ChannelReader() {
            @Override
            public int read(double[] buffer, int offset, int length) throws IOException {
                int k = raw.read(buffer, offset, length);
                for (int i = 0; i < k; i++) buffer[offset + i] *= scale;
                return k;
            }

            @Override
            public void close() throws IOException { raw.close(); }
        };
    }

    /**
     * Reads {@code maxFrames} samples (or the whole record if shorter) of one channel into memory.
     * Analysis that needs a whole record uses this with a bounded span.
     */
    public double[] readChannel(int channelIndex, int maxFrames) {
        int n = (int) Math.min(frameCount, maxFrames);
        double[] out = new double[n];
        try (ChannelReader r = openChannel(channelIndex)) {
            int pos = 0;
            while (pos < n) {
                int k = r.read(out, pos, n - pos);
                if (k < 0) break;
                pos += k;
            }
            return pos == n ? out : java.util.Arrays.copyOf(out, pos);
        } catch (IOException e) {
            throw new UncheckedIOException(name + ": " + e.getMessage(), e);
        }
    }

    /** Reads one whole channel; use only for records known to be short. */
    public double[] readChannel(int channelIndex) {
        Require.that(frameCount <= Integer.MAX_VALUE - 16, name + " is too long to read whole (" + frameCount + " frames)");
        return readChannel(channelIndex, (int) frameCount);
    }

    private void checkChannel(int channelIndex) {
        if (channelIndex < 0 || channelIndex >= channelCount)
            throw new IllegalArgumentException("channel " + (channelIndex + 1) + " does not exist in " + name + " (it has " + channelCount + ")");
    }

    @Override
    public String toString() {
        return name + " (" + channelCount + " ch, " + sampleRateHz + " Hz, " + frameCount + " frames, " + unit.symbol() + ")";
    }
}
