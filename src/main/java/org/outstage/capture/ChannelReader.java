package org.outstage.capture;

import java.io.Closeable;
import java.io.IOException;

/** Sequential reader of one channel of a capture, in the capture's unit (calibration applied). */
public interface ChannelReader extends Closeable {
    /**
     * Reads up to {@code length} samples into {@code buffer} starting at {@code offset}.
     * @return the number of samples read, or -1 at the end of the record
     */
    int read(double[] buffer, int offset, int length) throws IOException;

    @Override
    default void close() throws IOException {}
}
