package org.outstage.audio;

import java.io.IOException;

/** An open capture line. One reading thread; {@link #close} may come from any thread. */
public interface InputLine extends AutoCloseable {
    LineFormat format();

    /** The device's name. */
    String deviceName();

    /** Capacity of the line's buffer in frames (the longest pause in reading it can absorb). */
    int bufferFrames();

    /**
     * Blocks until {@code frames} frames have been read into {@code out[channel][offset...]} (full-scale units) or
     * the line is closed; returns the frames read.
     */
    int read(double[][] out, int offset, int frames) throws IOException;

    /** Frames the line holds that have not been read yet. */
    int available();

    @Override
    void close();
}
