package org.outstage.analysis;

import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.concurrent.CancellationException;
import org.junit.jupiter.api.Test;
import org.outstage.capture.Capture;
import org.outstage.capture.ChannelReader;
import org.outstage.capture.SampleUnit;

/** The workbench cancels a long analysis by interrupting its worker thread: the block loop must notice. */
class CancellationTest {
    @Test
    void interruptedThread_stopsLongRecordBetweenBlocks() {
        double fs = 48000;
        long frames = (long) (60 * fs); // a minute: several 2^20 blocks, the long-record path
        int[] blocksRead = {0};
        Capture capture = new Capture("minute", fs, 1, frames, SampleUnit.FULL_SCALE, 1.0, List.of(), index -> new ChannelReader() {
            long pos;

            @Override
            public int read(double[] b, int off, int len) {
                if (pos >= frames) return -1;
                int k = (int) Math.min(len, frames - pos);
                for (int i = 0; i < k; i++) b[off + i] = 0.5 * Math.sin(2 * Math.PI * 997.13 * (pos + i) / fs);
                pos += k;
                blocksRead[0]++;
                return k;
            }
        });
        Thread.currentThread().interrupt();
        try {
            assertThrows(CancellationException.class, () -> Analyzer.analyze(capture, 0, AnalysisSettings.DEFAULT));
        } finally {
            Thread.interrupted(); // clear the flag for the next test
        }
        // the spectrum loop gave up at its first block instead of reading the whole minute
        assertTrue(blocksRead[0] < 10, "reads before giving up: " + blocksRead[0]);
    }
}
