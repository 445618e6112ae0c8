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

    /** A real-input FFT of length {@code n} (JTransforms {@code realForward} layout). Not thread-safe: one per use. */
    public static DoubleFFT_1D of(int n) {
        return new DoubleFFT_1D(n);
    }
}
