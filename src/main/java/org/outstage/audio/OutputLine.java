package org.outstage.audio;

import java.io.IOException;

/** An open playback line. One writing thread; {@link #close} may come from any thread. */
public interface OutputLine extends AutoCloseable {
    LineFormat format();

    String deviceName();

    int bufferFrames();

    /**
     * Writes {@code frames} mono samples (full-scale units) to every channel, TPDF-dithered at the line's word length
     * for integer formats; blocks while the line's buffer is full. Returns the frames written (fewer once closed).
     */
    int write(double[] mono, int offset, int frames) throws IOException;

    /** Frames of free space in the buffer (equal to {@link #bufferFrames()} means the buffer ran empty). */
    int available();

    /** Waits until what was written has been played (bounded by the buffer length). */
    void drain();

    @Override
    void close();
}
