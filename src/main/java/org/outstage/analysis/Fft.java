package org.outstage.analysis;

import java.util.concurrent.Executors;
import org.jtransforms.fft.DoubleFFT_1D;
import pl.edu.icm.jlargearrays.ConcurrencyUtils;

/**
 * The one place analysis creates JTransforms FFTs. On first use it gives JTransforms (through JLargeArrays)
 * a thread pool of daemon threads: the library's default pool is non-daemon and keeps a JVM alive for about
 * 60 s after the last large FFT (toolchain.md, P7). It also runs every transform on the calling thread
 * ({@code setNumberOfThreads(1)}): on the two-core bench laptop two threads measured no faster (toolchain.md,
 * JTransforms 2^20: 7.4 ms with one thread, 7.1 ms with two), and the library's multi-threaded path waits on
 * futures and swallows an interrupt, which would keep the workbench's Cancel from stopping a long analysis.
 */
public final class Fft {
    private Fft() {}

    static {
        ConcurrencyUtils.setNumberOfThreads(1);
        ConcurrencyUtils.setThreadPool(Executors.newCachedThreadPool(r -> {
            Thread t = new Thread(r, "outstage-fft");
            t.setDaemon(true);
            return t;
        }));
    }

    /** Plans kept per thread: the most recently used sizes, at most {@link #PLANS_PER_THREAD}. */
    private static final ThreadLocal<java.util.LinkedHashMap<Integer, DoubleFFT_1D>> PLANS = ThreadLocal.withInitial(
            () -> new java.util.LinkedHashMap<>(8, 0.75f, true) {
                @Override
                protected boolean removeEldestEntry(java.util.Map.Entry<Integer, DoubleFFT_1D> eldest) { return size() > PLANS_PER_THREAD; }
            });

    /**
     * Sizes whose plan a thread keeps. One analysis uses up to three sizes (the record's length, its largest power of
     * two, the spectrum block); a plan holds about 2n doubles (16 MB at 2^20).
     */
    static final int PLANS_PER_THREAD = 3;

    /**
     * A real-input FFT of length {@code n} (JTransforms {@code realForward} layout), for use on the calling thread
     * only. The plan (twiddle factors: some n sines and cosines, the larger part of a first transform's cost, e.g.
     * 120–150 ms for n = 960,000 against 26–36 ms for the transform itself, measured on the 2-core build machine) is
     * made once per thread and size and reused; a transform's result does not depend on the plan being new.
     */
    public static DoubleFFT_1D of(int n) {
        return PLANS.get().computeIfAbsent(n, DoubleFFT_1D::new);
    }
}
