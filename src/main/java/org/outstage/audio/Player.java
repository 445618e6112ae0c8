package org.outstage.audio;

import java.util.concurrent.CountDownLatch;
import java.util.concurrent.TimeUnit;
import org.outstage.stimulus.Generator;

/**
 * Plays a {@link Generator} into an {@link OutputLine} on a daemon thread, in 10 ms chunks. {@link #stop()} fades
 * the generator out over its minimum ramp, lets the faded samples through and closes the line; if the thread dies
 * for any reason its {@code finally} closes the line, so a tone never sticks. The caller adds a shutdown hook that
 * calls {@link #stop()} (the live session does).
 */
public final class Player implements AutoCloseable {
    private final OutputLine line;
    private final Generator generator;
    private final Thread thread;
    private final CountDownLatch finished = new CountDownLatch(1);
    private volatile boolean stopping;
    private volatile long framesWritten;
    private volatile long underruns;
    private volatile Exception failure;

    private Player(OutputLine line, Generator generator) {
        this.line = line;
        this.generator = generator;
        this.thread = new Thread(this::run, "outstage-playback");
        thread.setDaemon(true);
        thread.setPriority(Thread.MAX_PRIORITY);
    }

    /** Starts playing at once; the generator should have been given a {@link Generator#fadeIn}. */
    public static Player start(OutputLine line, Generator generator) {
        if (line.format().sampleRateHz() != generator.sampleRateHz())
            throw new IllegalArgumentException("generator rate " + generator.sampleRateHz() + " Hz differs from the line's " + line.format().sampleRateHz() + " Hz");
        Player p = new Player(line, generator);
        p.thread.start();
        return p;
    }

    public Generator generator() { return generator; }
    public long framesWritten() { return framesWritten; }
    /** Times the output buffer was found empty while playing (an audible gap in the stimulus). */
    public long underruns() { return underruns; }
    public java.util.Optional<Exception> failure() { return java.util.Optional.ofNullable(failure); }

    private void run() {
        int chunk = Math.max(64, line.format().sampleRateHz() / 100);
        double[] buf = new double[chunk];
        try {
            while (true) {
                if (framesWritten > line.bufferFrames() && line.available() >= line.bufferFrames()) underruns++;
                generator.fill(buf, 0, chunk);
                int k = line.write(buf, 0, chunk);
                framesWritten += k;
                if (k < chunk) break;
                if (stopping && generator.isSilent()) {
                    // one more chunk of silence so the fade's tail is not cut by the close
                    generator.fill(buf, 0, chunk);
                    line.write(buf, 0, chunk);
                    line.drain(); // the buffer holds the fade: let it play out rather than cut it
                    break;
                }
            }
        } catch (Exception e) {
            failure = e;
        } finally {
            line.close();
            finished.countDown();
        }
    }

    /** Fades out (at least 50 ms) and closes the line; waits at most two seconds. Safe to call twice and from a shutdown hook. */
    public void stop() {
        if (!stopping) {
            stopping = true;
            generator.fadeOut();
        }
        try {
            if (!finished.await(2, TimeUnit.SECONDS)) BoundedClose.run(line::close, 2000, "output");
        } catch (InterruptedException e) {
            BoundedClose.run(line::close, 2000, "output");
            Thread.currentThread().interrupt();
        }
    }

    @Override public void close() { stop(); }
}
