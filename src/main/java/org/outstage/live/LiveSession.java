package org.outstage.live;

import java.io.IOException;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import java.util.OptionalDouble;
import java.util.concurrent.ArrayBlockingQueue;
import java.util.concurrent.CountDownLatch;
import java.util.concurrent.ThreadPoolExecutor;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicBoolean;
import java.util.concurrent.atomic.AtomicLong;
import java.util.concurrent.atomic.AtomicReference;
import org.outstage.analysis.AnalysisSettings;
import org.outstage.analysis.Analyzer;
import org.outstage.analysis.Measurement;
import org.outstage.audio.AudioBackend;
import org.outstage.audio.AudioBlock;
import org.outstage.audio.AudioUnavailableException;
import org.outstage.audio.BlockCapture;
import org.outstage.audio.InputLine;
import org.outstage.audio.LineFormat;
import org.outstage.audio.OutputLine;
import org.outstage.audio.Player;
import org.outstage.audio.WavRecorder;
import org.outstage.capture.Capture;
import org.outstage.capture.SampleUnit;
import org.outstage.stimulus.Generator;

/**
 * A rolling live measurement: capture (and play), cut into blocks, analyse each block with {@link Analyzer} exactly as
 * {@code analyze} does a file, and tell a {@link LiveListener}.
 *
 * <p>Order at {@link #start()}: open the input and start reading; wait for the first read to return (it can take up
 * to about 2 s); only then open the output and start the stimulus with a fade-in of 50 ms. A shutdown hook stops
 * the session on Ctrl-C: the stimulus fades out, the line closes, and the recording's header is finalised.
 *
 * <p>Analysis runs on one daemon thread; blocks wait for it up to {@value #MAX_BACKLOG_SECONDS} s of input, beyond which
 * the oldest waiting block is skipped (counted in {@link LiveResult#skippedBlocks()}) so the readout never falls far
 * behind the input.
 *
 * <p>Typical use (the workbench's Live view and the CLI do this):
 * <pre>{@code
 * LiveSession s = new LiveSession(new JavaSoundBackend(), settings, result -> show(result));
 * s.start();                 // throws AudioUnavailableException with one line if no device or format
 * s.setLevelDbfs(-26, false); // ramps over 50 ms
 * s.stop();                  // fades out, closes everything; safe to call twice
 * }</pre>
 */
public final class LiveSession implements AutoCloseable {
    /** Blocks wait for the analysis up to this much input time; older waiting blocks are skipped beyond it. */
    static final double MAX_BACKLOG_SECONDS = 4.0;
    private final AudioBackend backend;
    private final LiveSettings settings;
    private final LiveListener listener;
    private final ThreadPoolExecutor analysis;
    private final AtomicLong skipped = new AtomicLong();
    private final AtomicReference<LiveResult> last = new AtomicReference<>();
    private final AtomicReference<Capture> lastRaw = new AtomicReference<>();
    private final AtomicBoolean stopped = new AtomicBoolean();
    private final CountDownLatch ended = new CountDownLatch(1);
    private volatile BlockCapture capture;
    private volatile Player player;
    private volatile long stimulusStartFrame = -1;
    private volatile int outputBufferFrames;
    private volatile WavRecorder recorder;
    private volatile Thread hook;
    private volatile double stopAfterSeconds = Double.POSITIVE_INFINITY;
    private volatile boolean finalQueued;
    private volatile String failure;
    private volatile String inputName = "";
    private volatile String outputName = "";

    public LiveSession(AudioBackend backend, LiveSettings settings, LiveListener listener) {
        this.backend = backend;
        this.settings = settings;
        this.listener = listener;
        int backlog = (int) Math.max(2, Math.ceil(MAX_BACKLOG_SECONDS / settings.hopSeconds()));
        this.analysis = new ThreadPoolExecutor(1, 1, 0, TimeUnit.SECONDS, new ArrayBlockingQueue<>(backlog), r -> {
            Thread t = new Thread(r, "outstage-live-analysis");
            t.setDaemon(true);
            return t;
        }, (r, ex) -> { /* replaced below */ });
        this.analysis.setRejectedExecutionHandler((r, ex) -> {
            if (ex.isShutdown()) return;
            Runnable old = ex.getQueue().poll(); // the older waiting block gives way to the newer one
            if (old != null) skipped.incrementAndGet();
            if (!ex.getQueue().offer(r)) skipped.incrementAndGet();
        });
    }

    public LiveSettings settings() { return settings; }

    /** Stops by itself after the first block that ends at or after {@code seconds} of input (that block is analysed). */
    public LiveSession stopAfter(double seconds) {
        if (!(seconds > 0)) throw new IllegalArgumentException("seconds=" + seconds + " must be positive");
        stopAfterSeconds = seconds;
        return this;
    }

    /**
     * Opens the devices and starts. On failure everything opened so far is closed again.
     *
     * @throws AudioUnavailableException no input or output device, or the format is refused (one line)
     * @throws IOException               the record file cannot be created
     */
    public void start() throws AudioUnavailableException, IOException {
        if (capture != null) throw new IllegalStateException("already started");
        InputLine in = null;
        try {
            if (settings.recordFile().isPresent())
                recorder = WavRecorder.create(settings.recordFile().get(), settings.inputFormat().sampleRateHz(), settings.inputFormat().channels());
            warmUp();
            in = backend.openInput(settings.inputDevice(), settings.inputFormat());
            inputName = in.deviceName();
            installHook();
            capture = BlockCapture.start(in, settings.blockSeconds(), settings.hopSeconds(), Optional.ofNullable(recorder), new BlockCapture.Listener() {
                @Override public void onBlock(AudioBlock block) { submit(block); }
                @Override public void onFailure(Exception e) { fail("input " + inputName + ": " + e.getMessage()); }
            });
            if (!capture.awaitFirstRead(5, TimeUnit.SECONDS) || capture.firstReadSeconds().isEmpty())
                throw new AudioUnavailableException("input device " + inputName + " delivered nothing within 5 s");
            if (settings.stimulus().isPresent()) {
                LineFormat of = new LineFormat(settings.inputFormat().sampleRateHz(), settings.outputFormat(), 2);
                OutputLine out = backend.openOutput(settings.outputDevice(), of);
                outputName = out.deviceName();
                Generator g = Generator.of(settings.stimulus().get(), of.sampleRateHz(), settings.levelDbfs(), settings.blockSeconds(), settings.allowLoud())
                        .fadeIn(Generator.MIN_RAMP_SECONDS);
                stimulusStartFrame = capture.framesCaptured();
                outputBufferFrames = out.bufferFrames();
                player = Player.start(out, g);
            }
            listener.onStarted(inputName, outputName, capture.firstReadSeconds().get());
        } catch (AudioUnavailableException | IOException | RuntimeException | InterruptedException e) {
            if (in != null && capture == null) in.close();
            stop();
            // a start that failed leaves no half-written recording behind
            if (settings.recordFile().isPresent() && recorder != null) {
                try {
                    java.nio.file.Files.deleteIfExists(settings.recordFile().get());
                } catch (IOException ignored) {
                    // best effort
                }
            }
            if (e instanceof InterruptedException) {
                Thread.currentThread().interrupt();
                throw new AudioUnavailableException("interrupted while waiting for the input");
            }
            if (e instanceof RuntimeException r) throw r;
            if (e instanceof IOException io) throw io;
            throw (AudioUnavailableException) e;
        }
    }

    /**
     * Analyses one synthetic block on the analysis thread while the first real block is being captured, so the first
     * figures do not wait for the JIT compiler (a cold first analysis took 1.7 s against 0.2 s warm on the bench machine).
     */
    private void warmUp() {
        int rate = settings.inputFormat().sampleRateHz();
        int n = (int) Math.round(settings.blockSeconds() * rate);
        analysis.execute(() -> {
            if (stopped.get()) return;
            double[][] ch = new double[settings.inputFormat().channels()][n];
            java.util.SplittableRandom rnd = new java.util.SplittableRandom(1);
            for (int c = 0; c < ch.length; c++)
                for (int i = 0; i < n; i++) ch[c][i] = 0.1 * Math.sin(2 * Math.PI * 997.0 * i / rate) + 1e-6 * (rnd.nextDouble() - 0.5);
            try {
                measure(Capture.inMemory("warm-up", rate, SampleUnit.FULL_SCALE, ch), settings);
            } catch (RuntimeException e) {
                // a warm-up only; the real blocks report their own problems
            }
        });
    }

    private void installHook() {
        Thread h = new Thread(this::stop, "outstage-live-shutdown");
        try {
            Runtime.getRuntime().addShutdownHook(h);
            hook = h;
        } catch (IllegalStateException e) {
            // shutting down already
        }
    }

    private void submit(AudioBlock block) {
        if (finalQueued || stopped.get()) return;
        boolean isFinal = block.endSeconds() >= stopAfterSeconds - 1e-9;
        if (isFinal) finalQueued = true;
        Runnable job = () -> analyse(block, isFinal);
        if (isFinal) {
            // the last block must be analysed: wait for room instead of skipping
            try {
                analysis.getQueue().put(job);
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
            }
            analysis.prestartCoreThread();
        } else {
            analysis.execute(job);
        }
    }

    private void analyse(AudioBlock block, boolean isFinal) {
        if (stopped.get()) return;
        long t0 = System.nanoTime();
        java.lang.management.ThreadMXBean mx = java.lang.management.ManagementFactory.getThreadMXBean();
        long c0 = mx.isCurrentThreadCpuTimeSupported() ? mx.getCurrentThreadCpuTime() : -1;
        try {
            Capture cap = block.capture();
            lastRaw.set(cap);
            OptionalDouble fs = settings.fullScaleVolts();
            if (fs.isPresent()) cap = cap.calibrated(fs.getAsDouble(), SampleUnit.VOLTS);
            List<Measurement> ms = measure(cap, settings);
            double cpu = c0 < 0 ? Double.NaN : (mx.getCurrentThreadCpuTime() - c0) / 1e9;
            LiveResult r = new LiveResult(block.index(), block.endSeconds(), block.droppedFrames(), block.droppedFramesTotal(), skipped.get(), ms, cap,
                    (System.nanoTime() - t0) / 1e9, cpu);
            last.set(r);
            listener.onBlock(r);
        } catch (RuntimeException e) {
            fail("analysis of block " + block.index() + " failed: " + e);
        }
        if (isFinal) new Thread(this::stop, "outstage-live-stop").start();
    }

    /** Analyses the selected channels of one capture exactly as {@code analyze} does (1-based channels in settings). */
    public static List<Measurement> measure(Capture cap, LiveSettings settings) {
        AnalysisSettings s = settings.reference().isPresent() ? settings.analysis().withReferenceChannel(settings.reference().getAsInt()) : settings.analysis();
        List<Measurement> out = new ArrayList<>();
        for (int c = 1; c <= cap.channelCount(); c++) {
            if (settings.channel().isPresent() && c != settings.channel().getAsInt()) continue;
            if (settings.reference().isPresent() && c == settings.reference().getAsInt()) continue;
            out.add(Analyzer.analyze(cap, c - 1, s));
        }
        return out;
    }

    private void fail(String message) {
        if (stopped.get()) return;
        failure = message;
        listener.onFailure(message);
        new Thread(this::stop, "outstage-live-stop").start();
    }

    /**
     * Ramps the stimulus to {@code levelDbfs} over 50 ms.
     *
     * @throws IllegalStateException    when nothing is playing
     * @throws IllegalArgumentException above 0 dBFS, or above −20 dBFS without {@code allowLoud}
     */
    public void setLevelDbfs(double levelDbfs, boolean allowLoud) {
        Player p = player;
        if (p == null) throw new IllegalStateException("no stimulus is playing");
        p.generator().rampTo(levelDbfs, Generator.MIN_RAMP_SECONDS, allowLoud);
    }

    /** The stimulus level now set, dBFS peak; empty when nothing plays. */
    public OptionalDouble levelDbfs() {
        Player p = player;
        return p == null ? OptionalDouble.empty() : OptionalDouble.of(p.generator().levelDbfs());
    }

    /** The last analysed block's result. */
    public Optional<LiveResult> lastResult() { return Optional.ofNullable(last.get()); }

    /** The last analysed block as a capture (calibrated when full-scale volts are set), for logging a step. */
    public Optional<Capture> lastBlock() { return lastResult().map(LiveResult::capture); }

    /**
     * Writes the last analysed block's raw samples (full-scale units, every channel, before calibration) to a 32-bit
     * float WAV file, for logging a step through the same path as a file (the logbook stores the file).
     *
     * @throws IllegalStateException when no block has been analysed yet
     */
    public void saveLastBlock(java.nio.file.Path wav) throws IOException {
        Capture c = lastRaw.get();
        if (c == null) throw new IllegalStateException("no block has been analysed yet");
        double[][] ch = new double[c.channelCount()][];
        for (int i = 0; i < ch.length; i++) ch[i] = c.readChannel(i);
        try (WavRecorder w = WavRecorder.create(wav, (int) Math.round(c.sampleRateHz()), ch.length)) {
            w.write(ch, 0, ch[0].length);
        }
    }

    public long droppedFrames() { BlockCapture c = capture; return c == null ? 0 : c.droppedFrames(); }
    public long skippedBlocks() { return skipped.get(); }
    public long overrunEvents() { BlockCapture c = capture; return c == null ? 0 : c.overrunEvents(); }
    public long outputUnderruns() { Player p = player; return p == null ? 0 : p.underruns(); }
    /**
     * Input time (seconds from the first input frame) by which the stimulus can have reached the input: the input
     * position when the player started plus the output line's buffer (its latency) and the fade-in. Empty without a
     * stimulus or before the start.
     */
    public Optional<Double> stimulusArrivalSeconds() {
        long f = stimulusStartFrame;
        if (f < 0) return Optional.empty();
        double rate = settings.inputFormat().sampleRateHz();
        return Optional.of((f + outputBufferFrames) / rate + Generator.MIN_RAMP_SECONDS);
    }

    public Optional<Double> firstReadSeconds() { BlockCapture c = capture; return c == null ? Optional.empty() : c.firstReadSeconds(); }
    public String inputDeviceName() { return inputName; }
    public String outputDeviceName() { return outputName; }
    /** Why the session stopped early, if it did. */
    public Optional<String> failure() { return Optional.ofNullable(failure); }

    /** Waits until the session has stopped (by {@link #stop}, {@link #stopAfter} or a failure). */
    public boolean awaitEnd(long timeout, TimeUnit unit) throws InterruptedException { return ended.await(timeout, unit); }

    /**
     * Stops: the stimulus fades out over 50 ms and its line closes, the input closes, the analysis thread ends after
     * its present block, and the recording's header is finalised. Safe to call more than once and from any thread.
     */
    public void stop() {
        if (!stopped.compareAndSet(false, true)) {
            return;
        }
        try {
            Player p = player;
            if (p != null) p.stop();
        } finally {
            try {
                BlockCapture c = capture;
                if (c != null) c.close();
            } finally {
                analysis.shutdown();
                try {
                    if (Thread.currentThread().getName().startsWith("outstage-live-analysis") == false)
                        analysis.awaitTermination(5, TimeUnit.SECONDS);
                } catch (InterruptedException e) {
                    Thread.currentThread().interrupt();
                }
                try {
                    WavRecorder r = recorder;
                    if (r != null) r.close();
                } catch (IOException e) {
                    if (failure == null) failure = "record file: " + e.getMessage();
                } finally {
                    Thread h = hook;
                    if (h != null && Thread.currentThread() != h) {
                        try {
                            Runtime.getRuntime().removeShutdownHook(h);
                        } catch (IllegalStateException e) {
                            // shutdown in progress: the hook runs (and finds the session stopped)
                        }
                    }
                    ended.countDown();
                }
            }
        }
    }

    @Override public void close() { stop(); }
}
