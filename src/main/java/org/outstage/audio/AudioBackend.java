package org.outstage.audio;

import java.util.List;
import java.util.Optional;

/**
 * Our own small device layer, so the rest of the program never sees {@code javax.sound}. A native backend can
 * implement it later.
 */
public interface AudioBackend {
    /** Name of the backend, for messages ("Java Sound"). */
    String name();

    /** Capture devices, each with what it accepts (may open lines briefly to find out). */
    List<DeviceInfo> inputs();

    /** Playback devices, each with what it accepts. */
    List<DeviceInfo> outputs();

    /**
     * Opens a capture line.
     *
     * @param device a substring of the device name (case-insensitive); empty for the system default
     * @throws AudioUnavailableException no device, no match, or the format is refused (one line saying which)
     */
    InputLine openInput(Optional<String> device, LineFormat format) throws AudioUnavailableException;

    /** Opens a playback line; see {@link #openInput}. */
    OutputLine openOutput(Optional<String> device, LineFormat format) throws AudioUnavailableException;
}
