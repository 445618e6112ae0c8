package org.outstage.capture;

import java.io.IOException;

/** Where a capture's samples live (memory or file); opens independent readers, one per channel. */
@FunctionalInterface
public interface SampleStore {
    /** Opens a fresh reader of raw (uncalibrated) values of channel {@code channelIndex} (0-based). */
    ChannelReader open(int channelIndex) throws IOException;
}
