package org.outstage.analysis;

import java.util.concurrent.CancellationException;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import java.util.concurrent.FutureTask;
import java.util.concurrent.atomic.AtomicInteger;
import java.util.function.Supplier;

/**
 * A part of one analysis that runs on an idle processor core beside the rest of it, or inline when no core is idle.
 * One capture analysed alone (the command line on one file, the workbench) then uses two cores; a batch that already
 * keeps every core busy with one capture each runs every part inline, so the parts never compete with whole
 * captures. The result is the same either way: the part is a pure function of its inputs.
 *
 * @param <T> the part's result
 */
final class Helper<T> {
    /** Records shorter than this run inline: the hand-over would cost more than it saves. */
    static final int MIN_SAMPLES = 1 << 16;

    /** Threads of this JVM doing analysis work now: analyses running plus helpers running. */
    private static final AtomicInteger BUSY = new AtomicInteger();

    private static final ExecutorService POOL = Executors.newCachedThreadPool(r -> {
        Thread t = new Thread(r, "outstage-analysis-helper");
        t.setDaemon(true);
        return t;
    });

    private final Supplier<T> work;
    private final Future<T> future;   // null: run inline at join

    private Helper(Supplier<T> work, Future<T> future) {
        this.work = work;
        this.future = future;
    }

    /** Marks the calling thread as analysing until {@link #leave()}. */
    static void enter() { BUSY.incrementAndGet(); }

    static void leave() { BUSY.decrementAndGet(); }

    /** Threads doing analysis work now (for tests). */
    static int busy() { return BUSY.get(); }

    /** Parts handed to another thread since start (for tests). */
    static long handedOver() { return HANDED_OVER.get(); }

    private static final java.util.concurrent.atomic.AtomicLong HANDED_OVER = new java.util.concurrent.atomic.AtomicLong();

    /**
     * Starts {@code work} on another thread when a core is idle and the record ({@code samples} long) is large
     * enough, else keeps it to be run inline by {@link #join()}.
     */
    static <T> Helper<T> start(int samples, Supplier<T> work) {
        if (samples < MIN_SAMPLES) return new Helper<>(work, null);
        int cores = Runtime.getRuntime().availableProcessors();
        while (true) {
            int busy = BUSY.get();
            if (busy >= cores) return new Helper<>(work, null);
            if (BUSY.compareAndSet(busy, busy + 1)) break;
        }
        // done() runs once whether the task ends, fails or is cancelled before it starts: the count stays true
        FutureTask<T> task = new FutureTask<>(work::get) {
            @Override
            protected void done() { BUSY.decrementAndGet(); }
        };
        try {
            POOL.execute(task);
            HANDED_OVER.incrementAndGet();
        } catch (RuntimeException e) {   // rejected: run inline
            BUSY.decrementAndGet();
            return new Helper<>(work, null);
        }
        return new Helper<>(work, task);
    }

    /** The result: waits for the other thread, or runs the work now. Its exceptions come through unchanged. */
    T join() {
        if (future == null) return work.get();
        try {
            return future.get();
        } catch (ExecutionException e) {
            Throwable c = e.getCause();
            if (c instanceof RuntimeException r) throw r;
            if (c instanceof Error err) throw err;
            throw new IllegalStateException(c);
        } catch (InterruptedException e) {
            future.cancel(true);
            Thread.currentThread().interrupt();
            throw new CancellationException("analysis interrupted");
        }
    }

    /** True when the work runs in the thread that joins it (no core was idle, or the record is short). */
    boolean inline() { return future == null; }

    /** Gives the work up (interrupting it if it runs); an inline part is simply never run. */
    void cancel() {
        if (future != null) future.cancel(true);
    }
}
