package org.outstage.cli;

import java.io.PrintWriter;
import java.util.concurrent.Executors;
import java.util.concurrent.ScheduledExecutorService;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicReference;

/**
 * Progress on stderr, only when the work takes more than a moment: nothing is printed during the first
 * second, then the current step every two seconds. Never writes to stdout.
 */
final class Progress implements AutoCloseable {
    private final PrintWriter err;
    private final AtomicReference<String> current = new AtomicReference<>("");
    private final long start = System.nanoTime();
    private final ScheduledExecutorService timer;

    Progress(PrintWriter err) {
        this.err = err;
        this.timer = Executors.newSingleThreadScheduledExecutor(r -> {
            Thread t = new Thread(r, "progress");
            t.setDaemon(true);
            return t;
        });
        timer.scheduleAtFixedRate(this::tick, 1000, 2000, TimeUnit.MILLISECONDS);
    }

    void step(String what) { current.set(what); }

    private void tick() {
        String what = current.get();
        if (what.isEmpty()) return;
        synchronized (err) {
            err.printf("outstage: %s (%.0f s)%n", what, (System.nanoTime() - start) / 1e9);
            err.flush();
        }
    }

    @Override
    public void close() { timer.shutdownNow(); }
}
