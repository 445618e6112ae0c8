package org.outstage.analysis;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.concurrent.CountDownLatch;
import org.junit.jupiter.api.Test;
import org.outstage.analysis.stage.StageDiagnosis;
import org.outstage.capture.SampleUnit;

/**
 * The stage diagnosis runs beside the spectrum on an idle core, or inline when every core is busy. The two paths must
 * give the same measurement, pass the same exceptions, and leave the count of busy threads as they found it.
 */
class HelperTest {
    /** 2^18 samples at 96 kHz of a 997 Hz tone with a third harmonic and a cusp at zero (a crossover-like defect). */
    private static double[] tone() {
        double[] x = new double[1 << 18];
        for (int i = 0; i < x.length; i++) {
            double s = Math.sin(2 * Math.PI * 997 * i / 96_000.0);
            x[i] = 0.5 * s + 0.001 * Math.sin(3 * 2 * Math.PI * 997 * i / 96_000.0) - 0.002 * Math.signum(s) * Math.exp(-Math.abs(s) / 0.02);
        }
        return x;
    }

    private static String json(Measurement m) {
        return org.outstage.json.JsonText.write(org.outstage.report.MeasurementJson.capture("samples", m, java.util.List.of()));
    }

    @Test
    void besideOrInline_sameMeasurement() {
        double[] x = tone();
        int cores = Runtime.getRuntime().availableProcessors();
        long before = Helper.handedOver();
        Measurement beside = Analyzer.analyze(x, 96_000, SampleUnit.FULL_SCALE);
        if (cores > 1) assertTrue(Helper.handedOver() > before, "with an idle core the diagnosis is handed over");
        Measurement inline;
        for (int i = 0; i < cores; i++) Helper.enter();   // every core busy: the diagnosis runs inline
        try {
            long mark = Helper.handedOver();
            inline = Analyzer.analyze(x, 96_000, SampleUnit.FULL_SCALE);
            assertEquals(mark, Helper.handedOver(), "no core idle: nothing handed over");
        } finally {
            for (int i = 0; i < cores; i++) Helper.leave();
        }
        assertTrue(beside.measured() && beside.stage() instanceof StageDiagnosis.Measured, String.valueOf(beside.stage()));
        // every figure the JSON report carries (the records hold arrays, whose equals is identity), and the spectrum
        assertEquals(json(inline), json(beside), "the same pure computation on either thread");
        assertTrue(java.util.Arrays.equals(inline.spectrum().levelDb(), beside.spectrum().levelDb()));
    }

    @Test
    void exceptionsOfTheDiagnosis_comeThroughUnchanged() {
        // a reference channel that does not exist is refused by the stage diagnosis (the part that may run beside)
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> Analyzer.analyze(tone(), 96_000, SampleUnit.FULL_SCALE, AnalysisSettings.defaults().withReferenceChannel(2)));
        assertTrue(e.getMessage().contains("reference channel 2 does not exist"), e.getMessage());
    }

    /**
     * The count of busy threads once the helpers of earlier tests have counted themselves out (each does so after its
     * part, and what was queued behind it, have ended: just after its result was handed over).
     */
    private static int settledBusy() throws InterruptedException {
        for (int i = 0; i < 500 && Helper.busy() != 0; i++) Thread.sleep(10);
        return Helper.busy();
    }

    /** A part that notes its thread, says it started and waits for {@code release}; its result is 1. */
    private static Helper<Integer> blocking(CountDownLatch started, CountDownLatch release, java.util.concurrent.atomic.AtomicReference<Thread> on) {
        return Helper.start(Helper.MIN_SAMPLES, () -> {
            on.set(Thread.currentThread());
            started.countDown();
            try {
                release.await();
            } catch (InterruptedException ie) {
                Thread.currentThread().interrupt();
            }
            return 1;
        });
    }

    @Test
    void cancelledBeforeOrWhileRunning_leavesTheCountAsFound() throws Exception {
        int base = settledBusy();
        CountDownLatch started = new CountDownLatch(1), release = new CountDownLatch(1);
        Helper<Integer> running = blocking(started, release, new java.util.concurrent.atomic.AtomicReference<>());
        Helper<Integer> queued = Helper.start(Helper.MIN_SAMPLES, () -> 2);
        queued.cancel();
        if (Runtime.getRuntime().availableProcessors() > 1) assertTrue(started.await(10, java.util.concurrent.TimeUnit.SECONDS));
        running.cancel();
        release.countDown();
        for (int i = 0; i < 200 && Helper.busy() != base; i++) Thread.sleep(10);
        assertEquals(base, Helper.busy());
        assertEquals(5, Helper.start(10, () -> 5).join(), "a short record's part runs inline at join");
    }

    @Test
    void aPartQueuedBehindARunningOne_runsOnItsThreadAfterIt_andTheCountComesBack() throws Exception {
        boolean twoCores = Runtime.getRuntime().availableProcessors() > 1;
        // on CI (CI=true) the check must run: a one-core machine fails it saying so instead of skipping
        if (!twoCores && "true".equalsIgnoreCase(System.getenv("CI")))
            throw new AssertionError("HelperTest: CI=true but this machine has one core: queuing a part behind another needs an idle core");
        org.junit.jupiter.api.Assumptions.assumeTrue(twoCores, "needs an idle core");
        int base = settledBusy();
        CountDownLatch started = new CountDownLatch(1), release = new CountDownLatch(1);
        java.util.concurrent.atomic.AtomicReference<Thread> firstOn = new java.util.concurrent.atomic.AtomicReference<>();
        Helper<Integer> first = blocking(started, release, firstOn);
        assertTrue(started.await(10, java.util.concurrent.TimeUnit.SECONDS));
        long handed = Helper.handedOver();
        Helper<String> second = first.then(Helper.MIN_SAMPLES, () -> first.join() + 1 + " on " + (Thread.currentThread() == firstOn.get()));
        assertTrue(!second.inline(), "queued behind the running part, not inline");
        assertEquals(handed, Helper.handedOver(), "no second thread taken");
        release.countDown();
        assertEquals("2 on true", second.join());
        for (int i = 0; i < 200 && Helper.busy() != base; i++) Thread.sleep(10);
        assertEquals(base, Helper.busy());
    }

    @Test
    void aPartAfterAnInlineOne_isInlineToo_andFailuresComeThrough() {
        int cores = Runtime.getRuntime().availableProcessors();
        for (int i = 0; i < cores; i++) Helper.enter();
        try {
            Helper<Integer> first = Helper.start(Helper.MIN_SAMPLES, () -> 3);
            Helper<Integer> second = first.then(Helper.MIN_SAMPLES, () -> first.join() * 2);
            assertTrue(first.inline() && second.inline());
            assertEquals(6, second.join());
            Helper<Integer> failing = first.then(Helper.MIN_SAMPLES, () -> { throw new IllegalStateException("from the second part"); });
            assertEquals("from the second part", assertThrows(IllegalStateException.class, failing::join).getMessage());
        } finally {
            for (int i = 0; i < cores; i++) Helper.leave();
        }
    }
}
