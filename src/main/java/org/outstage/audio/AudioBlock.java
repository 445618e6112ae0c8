package org.outstage.audio;

import org.outstage.capture.Capture;

/**
 * One block of live input, shaped like a file capture so the analysis does not know where it came from.
 *
 * @param index              block number from 0
 * @param startSeconds       time of the block's first frame, from the first captured frame (input clock)
 * @param endSeconds         time just after its last frame
 * @param droppedFrames      frames lost inside this block (replaced by zeros, and named in the capture's warnings)
 * @param droppedFramesTotal frames lost since the capture started
 * @param capture            the block's samples, full-scale units, every input channel
 */
public record AudioBlock(long index, double startSeconds, double endSeconds, long droppedFrames, long droppedFramesTotal, Capture capture) {}
