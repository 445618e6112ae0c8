package org.outstage.live;

import java.util.List;
import org.outstage.analysis.Measurement;
import org.outstage.capture.Capture;

/**
 * The figures of one live block.
 *
 * @param block              block number from 0
 * @param timeSeconds        end of the block, seconds after the first captured frame (input clock)
 * @param droppedFrames      input frames lost inside this block (zeros stand in for them; never hidden)
 * @param droppedFramesTotal input frames lost since the start
 * @param skippedBlocks      blocks not analysed since the start because the analysis was still busy
 * @param measurements       one {@link Measurement} per analysed channel, exactly as {@code analyze} makes them
 * @param capture            the block's samples (calibrated when full-scale volts are set)
 * @param analysisSeconds    wall time the analysis of this block took
 * @param analysisCpuSeconds CPU time of the analysis thread for this block (the cost, whatever else the machine does)
 */
public record LiveResult(long block, double timeSeconds, long droppedFrames, long droppedFramesTotal, long skippedBlocks,
                         List<Measurement> measurements, Capture capture, double analysisSeconds, double analysisCpuSeconds) {
    public LiveResult {
        measurements = List.copyOf(measurements);
    }
}
