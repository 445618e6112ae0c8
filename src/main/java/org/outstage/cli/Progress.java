package org.outstage.cli;

import java.io.PrintWriter;
import java.util.Locale;
import java.util.concurrent.Executors;
import java.util.concurrent.ScheduledExecutorService;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicInteger;
import java.util.concurrent.atomic.AtomicReference;

/**
 * Progress on stderr, only when the work takes more than a moment: nothing is printed during the first second.
 * Never writes to stdout. Two forms:
 * <ul>
 *   <li>plain lines (a pipe, a log file, CI): the current step every two seconds;</li>
 *   <li>on a terminal, with a known number of items: one bar that updates in place ({@code \r}) five times a second
 *       and is cleared at the end, so the terminal keeps only the results.</li>
 * </ul>
 * "On a terminal" is {@link System#console()} being present (the JDK's own test: standard input and output are a
 * terminal); {@code OUTSTAGE_PROGRESS=lines} or {@code =bar} overrides it.
 */
final class Progress implements AutoCloseable {
    private static final int BAR_WIDTH = 30;
    private final PrintWriter err;
    private final AtomicReference<String> current = new AtomicReference<>("");
    private final AtomicInteger done = new AtomicInteger();
    private final int total;
    private final boolean bar;
    private final long start = System.nanoTime();
    private final ScheduledExecutorService timer;
    private volatile boolean barShown;

    /** Plain progress lines of the current step. */
    Progress(PrintWriter err) { this(err, 0, false); }

    /** Progress over {@code total} items; a bar when {@code terminal} and total &gt; 1, else plain lines. */
    Progress(PrintWriter err, int total, boolean terminal) {
        this.err = err;
        this.total = total;
        this.bar = terminal && total > 1;
        this.timer = Executors.newSingleThreadScheduledExecutor(r -> {
            Thread t = new Thread(r, "progress");
            t.setDaemon(true);
            return t;
        });
        timer.scheduleAtFixedRate(this::tick, 1000, bar ? 200 : 2000, TimeUnit.MILLISECONDS);
    }

    /** Whether progress should be a bar here: the override, else whether this process has a terminal. */
    static boolean onTerminal() {
        String o = System.getenv("OUTSTAGE_PROGRESS");
        if ("lines".equals(o)) return false;
        if ("bar".equals(o)) return true;
        return System.console() != null;
    }

    void step(String what) { current.set(what); }

    /** One item finished. */
    void itemDone() { done.incrementAndGet(); }

    static String barLine(int done, int total, double seconds) {
        int filled = total <= 0 ? 0 : (int) Math.round((double) BAR_WIDTH * Math.min(done, total) / total);
        return String.format(Locale.ROOT, "outstage: [%s%s] %d of %d files (%.0f s)", "#".repeat(filled), "-".repeat(BAR_WIDTH - filled),
                done, total, seconds);
    }

    private void tick() {
        double s = (System.nanoTime() - start) / 1e9;
        synchronized (err) {
            if (bar) {
                err.print("\r" + barLine(done.get(), total, s));
                barShown = true;
            } else {
                String what = current.get();
                if (what.isEmpty()) return;
                err.printf(Locale.ROOT, "outstage: %s (%.0f s)%n", what, s);
            }
            err.flush();
        }
    }

    @Override
    public void close() {
        timer.shutdownNow();
        try {
            timer.awaitTermination(1, TimeUnit.SECONDS);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        }
        if (barShown) {
            synchronized (err) {
                // clear the bar's line: what follows on stderr (warnings) starts at the left margin
                err.print("\r" + " ".repeat(barLine(total, total, 0).length() + 8) + "\r");
                err.flush();
            }
        }
    }
}
