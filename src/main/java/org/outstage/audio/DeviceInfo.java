package org.outstage.audio;

import java.util.List;

/**
 * One input or output device as the backend names it, with what it was found to accept.
 *
 * @param name           the name to pass to {@code --input}/{@code --output} (a substring is enough)
 * @param description    the backend's description
 * @param channels       the most channels (1 or 2) accepted at any listed rate
 * @param sampleRatesHz  the standard rates at which a line was opened successfully
 * @param sampleFormats  the encodings at which a line was opened successfully
 * @param isDefault      true for the system default device
 */
public record DeviceInfo(String name, String description, int channels, List<Integer> sampleRatesHz, List<SampleFormat> sampleFormats, boolean isDefault) {
    public DeviceInfo {
        sampleRatesHz = List.copyOf(sampleRatesHz);
        sampleFormats = List.copyOf(sampleFormats);
    }
}
