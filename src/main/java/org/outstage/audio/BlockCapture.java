package org.outstage.audio;

import java.io.IOException;
import java.util.ArrayDeque;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import java.util.concurrent.CountDownLatch;
import java.util.concurrent.TimeUnit;
import org.outstage.capture.Capture;
import org.outstage.capture.SampleUnit;

/**
 * Reads an {@link InputLine} on a daemon thread and hands out blocks of {@code blockSeconds}, one every
 * {@code hopSeconds} (hop &lt; block means overlapping blocks), to a {@link Listener}.
 *
 * <p><b>Dropped frames.</b> Java Sound does not report input overruns, so they are inferred: after the first read,
 * the frames received (plus those waiting in the line) are compared with the frames the input clock should have
 * delivered by wall-clock time. A shortfall larger than the line's buffer plus 50 ms (the slack for scheduling
 * jitter) is counted as lost, and that many zero frames are inserted, so time stays aligned and the gap is visible
 * in the block and in the recording; the block's capture carries a warning naming the place. A buffer found full
 * before a read is counted as an overrun event. The estimate assumes the input clock agrees with the system
 * clock to better than the slack over the run (true for a virtual device; a real card drifts by tens of ppm,
 * about 1 frame per second at 96 kHz for 10 ppm, which is far below the slack for runs of hours).
 *
 * <p><b>Start.</b> The first read of a line can take from 50 ms to almost 2 s (toolchain notes); callers wait with
 * {@link #awaitFirstRead} before they start playing, so no stimulus is lost.
 */
public final class BlockCapture implements AutoCloseable {
    /** Receives blocks on the capture thread: return quickly (hand heavy work to another thread). */
    public interface Listener {
        void onBlock(AudioBlock block);

        /** The line failed or closed early. */
        default void onFailure(Exception e) {}
    }

    private final InputLine line;
    private final int blockFrames;
    private final int hopFrames;
    private final Optional<WavRecorder> recorder;
    private final Listener listener;
    private final Thread thread;
    private final CountDownLatch firstRead = new CountDownLatch(1);
    private volatile boolean running = true;
    private volatile long framesCaptured;
    private volatile long droppedFrames;
    private volatile long overrunEvents;
    private volatile long firstReadNanos = -1;
    private final long startNanos = System.nanoTime();
    private final ArrayDeque<long[]> dropEvents = new ArrayDeque<>(); // {frame position, count}

    private BlockCapture(InputLine line, double blockSeconds, double hopSeconds, Optional<WavRecorder> recorder, Listener listener) {
        int rate = line.format().sampleRateHz();
        this.line = line;
        this.blockFrames = (int) Math.round(blockSeconds * rate);
        this.hopFrames = (int) Math.round(hopSeconds * rate);
        if (blockFrames < 16) throw new IllegalArgumentException("block of " + blockSeconds + " s is too short at " + rate + " Hz");
        if (hopFrames < 1 || hopFrames > blockFrames)
            throw new IllegalArgumentException("hop of " + hopSeconds + " s must be positive and no longer than the block (" + blockSeconds + " s)");
        this.recorder = recorder;
        this.listener = listener;
        this.thread = new Thread(this::run, "outstage-capture");
        thread.setDaemon(true);
        thread.setPriority(Thread.MAX_PRIORITY);
    }

    /** Starts reading {@code line}; blocks go to {@code listener}; raw input also goes to {@code recorder} if present. */
    public static BlockCapture start(InputLine line, double blockSeconds, double hopSeconds, Optional<WavRecorder> recorder, Listener listener) {
        BlockCapture b = new BlockCapture(line, blockSeconds, hopSeconds, recorder, listener);
        b.thread.start();
        return b;
    }

    /** Waits until the first read returned; false on timeout. */
    public boolean awaitFirstRead(long timeout, TimeUnit unit) throws InterruptedException { return firstRead.await(timeout, unit); }

    /** Time from {@link #start} to the first read's return, seconds; empty before it. */
    public Optional<Double> firstReadSeconds() { return firstReadNanos < 0 ? Optional.empty() : Optional.of((firstReadNanos - startNanos) / 1e9); }

    public long framesCaptured() { return framesCaptured; }
    public long droppedFrames() { return droppedFrames; }
    public long overrunEvents() { return overrunEvents; }
    public InputLine line() { return line; }

    private void run() {
        LineFormat f = line.format();
        int rate = f.sampleRateHz();
        int ch = f.channels();
        int chunk = Math.max(64, rate / 100); // 10 ms
        double[][] buf = new double[ch][chunk];
        double[][] ring = new double[ch][blockFrames];
        long written = 0;      // frames put into the ring (read + inserted zeros)
        long nextBlockEnd = blockFrames;
        long blockIndex = 0;
        long t0 = 0;
        long framesAtT0 = 0;
        long slack = line.bufferFrames() + rate / 20;
        try {
            while (running) {
                if (written > 0 && line.available() >= line.bufferFrames()) overrunEvents++;
                int k = line.read(buf, 0, chunk);
                if (k <= 0) {
                    if (running) throw new IOException("the input line stopped delivering samples");
                    break;
                }
                long now = System.nanoTime();
                if (firstReadNanos < 0) {
                    firstReadNanos = now;
                    t0 = now;
                    framesAtT0 = k + line.available();
                    firstRead.countDown();
                } else {
                    long expected = framesAtT0 + Math.round((now - t0) * 1e-9 * rate);
                    long have = framesCaptured + k + line.available() + droppedFrames;
                    long deficit = expected - have;
                    if (deficit > slack) {
                        long lost = deficit - rate / 100; // keep 10 ms of jitter out of the count
                        droppedFrames += lost;
                        synchronized (dropEvents) { dropEvents.add(new long[] {written, lost}); }
                        double[][] zeros = new double[ch][(int) Math.min(lost, Integer.MAX_VALUE / 2)];
                        long left = lost;
                        while (left > 0) {
                            int n = (int) Math.min(left, zeros[0].length);
                            put(ring, zeros, n, written);
                            if (recorder.isPresent()) recorder.get().write(zeros, 0, n);
                            written += n;
                            left -= n;
                        }
                    }
                }
                framesCaptured += k;
                if (recorder.isPresent()) recorder.get().write(buf, 0, k);
                // Emit every block that ends inside this chunk.
                int done = 0;
                while (done < k) {
                    int n = (int) Math.min(k - done, nextBlockEnd - written);
                    if (n > 0) {
                        double[][] part = new double[ch][];
                        for (int c = 0; c < ch; c++) part[c] = java.util.Arrays.copyOfRange(buf[c], done, done + n);
                        put(ring, part, n, written);
                        written += n;
                        done += n;
                    }
                    if (written >= nextBlockEnd) {
                        emit(ring, blockIndex++, nextBlockEnd, rate);
                        nextBlockEnd += hopFrames;
                    }
                }
            }
        } catch (IOException | RuntimeException e) {
            if (running) listener.onFailure(e);
        } finally {
            firstRead.countDown();
        }
    }

    private void put(double[][] ring, double[][] src, int n, long position) {
        for (int c = 0; c < ring.length; c++) {
            for (int i = 0; i < n; i++) ring[c][(int) ((position + i) % blockFrames)] = src[c][i];
        }
    }

    private void emit(double[][] ring, long index, long end, int rate) {
        long start = end - blockFrames;
        double[][] block = new double[ring.length][blockFrames];
        int s = (int) (start % blockFrames);
        for (int c = 0; c < ring.length; c++) {
            System.arraycopy(ring[c], s, block[c], 0, blockFrames - s);
            System.arraycopy(ring[c], 0, block[c], blockFrames - s, s);
        }
        long inBlock = 0;
        List<String> warnings = new ArrayList<>();
        synchronized (dropEvents) {
            while (!dropEvents.isEmpty() && dropEvents.peekFirst()[0] < start - blockFrames) dropEvents.pollFirst();
            for (long[] ev : dropEvents) {
                if (ev[0] >= start && ev[0] < end) {
                    inBlock += ev[1];
                    warnings.add(ev[1] + " frames lost at input frame " + ev[0] + " (" + String.format(java.util.Locale.ROOT, "%.3f", ev[0] / (double) rate)
                            + " s); replaced by zeros");
                }
            }
        }
        Capture cap = Capture.inMemory("live block " + index, rate, SampleUnit.FULL_SCALE, block);
        if (line.format().sampleFormat() != SampleFormat.FLOAT_32)
            cap = new Capture(cap.name(), rate, cap.channelCount(), cap.frameCount(), SampleUnit.FULL_SCALE, 1.0, List.of(),
                    i -> Capture.inMemory("", rate, SampleUnit.FULL_SCALE, block[i]).openChannel(0), java.util.OptionalInt.of(line.format().sampleFormat().bits()));
        if (!warnings.isEmpty()) cap = cap.withWarnings(warnings);
        listener.onBlock(new AudioBlock(index, start / (double) rate, end / (double) rate, inBlock, droppedFrames, cap));
    }

    /** Stops reading and closes the line (the recorder is the caller's to close). */
    @Override
    public void close() {
        running = false;
        BoundedClose.run(line::close, 2000, "input");
        try {
            thread.join(2000);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        }
    }
}
