package org.outstage.capture;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;

/**
 * The fixture files of src/test/resources/capture (made by make_fixtures.py there). Oracle: a single-bin DFT over
 * the two whole cycles returns each component's peak amplitude (1 V at 1 kHz, 10 mV at 3 kHz, nothing at 2 kHz) by
 * Fourier-series orthogonality; values were printed with 7 significant digits, so amplitudes agree to about 1e-6.
 */
class ScopeCsvFixtureFilesTest {
    private static final double TOL = 2e-6;

    private static Capture open(String name) throws Exception {
        return CaptureReader.open(Path.of(ScopeCsvFixtureFilesTest.class.getResource("/capture/" + name).toURI()), CaptureOptions.none());
    }

    private static void assertContent(Capture c, int channel, double peak) {
        double[] x = c.readChannel(channel);
        assertEquals(200, x.length);
        assertEquals(peak, ScopeCsvReaderTest.amplitude(x, c.sampleRateHz(), 1000), TOL);
        assertEquals(0.01 * peak, ScopeCsvReaderTest.amplitude(x, c.sampleRateHz(), 3000), TOL);
        assertEquals(0.0, ScopeCsvReaderTest.amplitude(x, c.sampleRateHz(), 2000), TOL);
    }

    @Test
    void startIncrement_twoChannelsAt100kHz() throws Exception {
        Capture c = open("start-increment.csv");
        assertEquals(100_000, c.sampleRateHz(), 1e-6);
        assertEquals(2, c.channelCount());
        assertContent(c, 0, 1.0);
        assertContent(c, 1, 0.5);
    }

    @Test
    void pairsBesideData_oneChannelAt100kHz() throws Exception {
        Capture c = open("pairs-beside-data.csv");
        assertEquals(100_000, c.sampleRateHz(), 1e-3);
        assertEquals(1, c.channelCount());
        assertEquals(List.of(), c.warnings());
        assertContent(c, 0, 1.0);
    }

    @Test
    void semicolonDecimalComma_twoChannels() throws Exception {
        Capture c = open("semicolon-decimal-comma.csv");
        assertEquals(100_000, c.sampleRateHz(), 1e-3);
        assertContent(c, 0, 1.0);
        assertContent(c, 1, 0.1);
    }

    @Test
    void unitsMsMv_scaledToSecondsAndVolts() throws Exception {
        Capture c = open("units-ms-mv.csv");
        assertEquals(100_000, c.sampleRateHz(), 1e-3);
        assertContent(c, 0, 1.0);
    }
}
