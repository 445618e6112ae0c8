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
    /** Guards {@link #ended} and {@link #next} of a part handed to another thread. */
    private final Object lock = new Object();
    private boolean ended;            // the other thread has finished this part (and what followed it)
    private Runnable next;            // a part queued to run on the same thread right after this one

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
        FutureTask<T> task = new FutureTask<>(work::get);
        Helper<T> h = new Helper<>(work, task);
        try {
            // the thread counts itself out once, after the part and whatever was queued behind it, whether they end,
            // fail or were cancelled before they started
            POOL.execute(() -> {
                try {
                    task.run();
                    Runnable then;
                    synchronized (h.lock) {
                        h.ended = true;
                        then = h.next;
                    }
                    if (then != null) {
                        Thread.interrupted();   // a cancel of the first part interrupts it, not what follows it
                        then.run();
                    }
                } finally {
                    BUSY.decrementAndGet();
                }
            });
            HANDED_OVER.incrementAndGet();
        } catch (RuntimeException e) {   // rejected: run inline
            BUSY.decrementAndGet();
            return new Helper<>(work, null);
        }
        return h;
    }

    /**
     * {@code after} as a part of its own that starts when this one has ended: on this part's thread, right after it,
     * when this part was handed over and is still running (that thread is then free for it, and no other core need
     * be); otherwise like {@link #start} (another thread if a core is idle, else inline at its join). {@code after}
     * may join this part. Its result and exceptions come through its own {@link #join()}.
     */
    <R> Helper<R> then(int samples, Supplier<R> after) {
        if (future != null) {
            synchronized (lock) {
                if (!ended && next == null) {
                    FutureTask<R> task = new FutureTask<>(after::get);
                    next = task;
                    return new Helper<>(after, task);
                }
            }
        }
        return start(samples, after);
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
