package org.outstage.audio;

import java.io.IOException;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.channels.FileChannel;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;

/**
 * Keeps a live input in a 32-bit float WAV file (WAVE_FORMAT_IEEE_FLOAT; 16- and 24-bit input fits it exactly).
 * The header is written first with both sizes set to 0xFFFFFFFF and finalised by {@link #close()}, which the live
 * session calls on every exit path (normal end, error, Ctrl-C through a shutdown hook). After a kill -9 the sizes stay
 * 0xFFFFFFFF and capture.WavReader reads every whole frame the file holds, with a warning that the data chunk claims
 * more than the file has (layout: docs/references.md §10). Thread-safe: writes and close are synchronized.
 */
public final class WavRecorder implements AutoCloseable {
    private static final int HEADER_BYTES = 12 + 8 + 18 + 8;
    private final Path file;
    private final FileChannel ch;
    private final int channels;
    private long frames;
    private boolean closed;
    private ByteBuffer buf = ByteBuffer.allocate(0);

    private WavRecorder(Path file, FileChannel ch, int channels) {
        this.file = file;
        this.ch = ch;
        this.channels = channels;
    }

    /** Creates (or replaces) {@code file} and writes the provisional header. */
    public static WavRecorder create(Path file, int sampleRateHz, int channels) throws IOException {
        if (channels < 1 || channels > 2) throw new IllegalArgumentException("channels=" + channels + " must be 1 or 2");
        FileChannel ch = FileChannel.open(file, StandardOpenOption.CREATE, StandardOpenOption.TRUNCATE_EXISTING, StandardOpenOption.WRITE);
        WavRecorder r = new WavRecorder(file, ch, channels);
        try {
            ch.write(header(sampleRateHz, channels, -1), 0);
        } catch (IOException e) {
            ch.close();
            throw e;
        }
        return r;
    }

    public Path file() { return file; }

    public synchronized long frames() { return frames; }

    /** Appends {@code count} frames of {@code data[channel][offset...]} (full-scale units). */
    public synchronized void write(double[][] data, int offset, int count) throws IOException {
        if (closed) return;
        int need = count * channels * 4;
        if (buf.capacity() < need) buf = ByteBuffer.allocate(need).order(ByteOrder.LITTLE_ENDIAN);
        buf.clear();
        for (int i = 0; i < count; i++)
            for (int c = 0; c < channels; c++) buf.putFloat((float) data[c][offset + i]);
        buf.flip();
        long pos = HEADER_BYTES + frames * channels * 4L;
        while (buf.hasRemaining()) pos += ch.write(buf, pos);
        frames += count;
    }

    /** Writes the true sizes into the header and closes the file; later calls do nothing. */
    @Override
    public synchronized void close() throws IOException {
        if (closed) return;
        closed = true;
        try {
            long dataBytes = frames * channels * 4L;
            if (HEADER_BYTES - 8 + dataBytes <= 0xFFFFFFFFL) {
                ByteBuffer riff = ByteBuffer.allocate(4).order(ByteOrder.LITTLE_ENDIAN).putInt((int) (HEADER_BYTES - 8 + dataBytes));
                riff.flip();
                ch.write(riff, 4);
                ByteBuffer data = ByteBuffer.allocate(4).order(ByteOrder.LITTLE_ENDIAN).putInt((int) dataBytes);
                data.flip();
                ch.write(data, HEADER_BYTES - 4);
            }
            ch.force(true);
        } finally {
            ch.close();
        }
    }

    /** RIFF/WAVE header, IEEE float 32-bit; {@code dataBytes} −1 writes the 0xFFFFFFFF placeholders. */
    static ByteBuffer header(int rate, int channels, long dataBytes) {
        ByteBuffer h = ByteBuffer.allocate(HEADER_BYTES).order(ByteOrder.LITTLE_ENDIAN);
        int blockAlign = channels * 4;
        h.put("RIFF".getBytes(StandardCharsets.US_ASCII)).putInt(dataBytes < 0 ? -1 : (int) (HEADER_BYTES - 8 + dataBytes));
        h.put("WAVE".getBytes(StandardCharsets.US_ASCII));
        h.put("fmt ".getBytes(StandardCharsets.US_ASCII)).putInt(18).putShort((short) 3).putShort((short) channels)
                .putInt(rate).putInt(rate * blockAlign).putShort((short) blockAlign).putShort((short) 32).putShort((short) 0);
        h.put("data".getBytes(StandardCharsets.US_ASCII)).putInt(dataBytes < 0 ? -1 : (int) dataBytes);
        h.flip();
        return h;
    }
}
