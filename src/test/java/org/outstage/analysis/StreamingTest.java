package org.outstage.analysis;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.concurrent.atomic.AtomicInteger;
import java.util.concurrent.atomic.AtomicLong;
import org.junit.jupiter.api.Test;
import org.outstage.capture.Capture;
import org.outstage.capture.ChannelReader;
import org.outstage.capture.SampleStore;
import org.outstage.capture.SampleUnit;

/** Long captures are read in blocks: the heap is bounded by the block, not by the capture. */
class StreamingTest {

    /**
     * A 10-minute, 192 kHz capture whose samples are generated on the fly (never held anywhere). The
     * analysis must never ask for more than one block (2^20 samples) in a single read (reading the whole
     * channel would ask for 115 200 000), and it must still measure the known −80 dBc H3.
     */
    @Test
    void tenMinuteCapture_isAnalysedInBlocks() {
        double fs = 192000, f = 1000.37;
        long frames = (long) (600 * fs);
        AtomicInteger largestRequest = new AtomicInteger();
        AtomicLong samplesServed = new AtomicLong();
        double h3 = Levels.dbToRatio(-80);
        SampleStore store = channel -> new ChannelReader() {
            long pos;
            final double w = 2 * Math.PI * f / fs;

            @Override
            public int read(double[] buffer, int offset, int length) {
                largestRequest.accumulateAndGet(length, Math::max);
                if (pos >= frames) return -1;
                int k = (int) Math.min(length, frames - pos);
                for (int i = 0; i < k; i++) {
                    double ph = w * (pos + i);
                    double c = Math.cos(ph);
                    buffer[offset + i] = c + h3 * (4 * c * c * c - 3 * c);   // cos 3θ = 4cos³θ − 3cosθ (Chebyshev T3)
                }
                pos += k;
                samplesServed.addAndGet(k);
                return k;
            }
        };
        Capture capture = new Capture("ten-minutes", fs, 1, frames, SampleUnit.FULL_SCALE, 1.0, List.of(), store);
        Measurement m = Analyzer.analyze(capture, 0, AnalysisSettings.DEFAULT);
        assertTrue(m.measured(), m.notMeasuredReason().orElse(""));
        assertTrue(largestRequest.get() <= Analyzer.MAX_BLOCK, "largest single read " + largestRequest.get());
        assertTrue(samplesServed.get() >= frames, "the whole capture was read");
        assertTrue(m.spectrum().blocks() > 100, "blocks " + m.spectrum().blocks());
        assertEquals(-80, m.harmonics().get(1).dbc(), 0.01);
        assertEquals(f, m.fundamental().frequencyHz(), 1e-4);
        assertEquals(1 / Math.sqrt(2), m.fundamental().rms(), 1e-6);
    }
}
