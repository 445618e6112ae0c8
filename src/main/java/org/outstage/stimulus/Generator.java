package org.outstage.stimulus;

import java.util.Optional;
import java.util.concurrent.atomic.AtomicReference;

/**
 * Streams the samples of one {@link Stimulus} at a level in dBFS peak (1.0 = digital full-scale peak; a sine at
 * 0 dBFS peak has an rms of 0.7071, AES17, docs/references.md §2). Mono: the audio layer copies the samples to
 * every output channel.
 *
 * <p><b>Precision.</b> Phases are kept in cycles, in double, and reduced to [−½, ½) before the sine is taken, so
 * the phase error stays near 1e−16 of a cycle whatever the run length: spurs and noise of the double output are far
 * below −150 dBc (checked against Commons Math's FFT in the tests). Tones accumulate the increment f/fs; the sweep
 * takes its phase from the sample index within the sweep ({@link SweepParameters#phaseCycles}).
 *
 * <p><b>Safety.</b> A generator refuses to start above {@link #SAFE_START_DBFS} unless the caller says the level
 * is wanted ({@code allowLoud}); level changes, start ({@link #fadeIn}) and stop ({@link #fadeOut}) ramp linearly
 * in amplitude over at least {@link #MIN_RAMP_SECONDS}.
 *
 * <p><b>Threads.</b> {@link #fill} is called by one thread (the playback thread); {@link #rampTo} and
 * {@link #fadeOut} may be called from any thread and take effect at the next {@code fill}.
 */
public final class Generator {
    /** Highest level a generator starts at without {@code allowLoud}: −20 dBFS peak. */
    public static final double SAFE_START_DBFS = -20;
    /** Shortest level ramp: 50 ms. */
    public static final double MIN_RAMP_SECONDS = 0.05;
    /** Sweep length used when neither the signal nor the caller states one. */
    public static final double DEFAULT_SWEEP_SECONDS = 1.0;

    private final Stimulus stimulus;
    private final double sampleRateHz;
    private final Optional<SweepParameters> sweep;
    private final AtomicReference<Ramp> request = new AtomicReference<>();

    // Tone state: phases in cycles.
    private final double[] increments;
    private final double[] amplitudes;
    private final double[] phases;
    private long sweepIndex;
    private final long sweepFrames;

    private double gain;          // present linear gain (peak amplitude)
    private double target;        // gain the ramp heads for
    private double step;          // gain change per sample while ramping
    private volatile double levelDbfs;
    private volatile long position;

    private record Ramp(double targetGain, double seconds) {}

    private Generator(Stimulus stimulus, double sampleRateHz, double levelDbfs, double sweepSeconds) {
        this.stimulus = stimulus;
        this.sampleRateHz = sampleRateHz;
        this.levelDbfs = levelDbfs;
        this.gain = gainOf(levelDbfs);
        this.target = gain;
        double nyquist = sampleRateHz / 2;
        if (stimulus instanceof Stimulus.Sine s) {
            checkNyquist(s.frequencyHz(), nyquist, s);
            increments = new double[] {s.frequencyHz() / sampleRateHz};
            amplitudes = new double[] {1.0};
        } else if (stimulus instanceof Stimulus.Twin t) {
            checkNyquist(Math.max(t.firstHz(), t.secondHz()), nyquist, t);
            increments = new double[] {t.firstHz() / sampleRateHz, t.secondHz() / sampleRateHz};
            amplitudes = new double[] {0.5, 0.5};
        } else if (stimulus instanceof Stimulus.Smpte m) {
            checkNyquist(m.highHz(), nyquist, m);
            increments = new double[] {m.lowHz() / sampleRateHz, m.highHz() / sampleRateHz};
            amplitudes = new double[] {0.8, 0.2};
        } else if (stimulus instanceof Stimulus.Burst b) {
            checkNyquist(b.frequencyHz(), nyquist, b);
            increments = new double[] {b.frequencyHz() / sampleRateHz};
            amplitudes = new double[] {1.0};
        } else {
            increments = new double[0];
            amplitudes = new double[0];
        }
        phases = new double[increments.length];
        if (stimulus instanceof Stimulus.Sweep w) {
            checkNyquist(w.endHz(), nyquist, w);
            double len = w.lengthSeconds().orElse(sweepSeconds);
            SweepParameters p = SweepParameters.of(sampleRateHz, w.startHz(), w.endHz(), len, 1.0);
            sweep = Optional.of(p);
            sweepFrames = Math.max(1, Math.round(len * sampleRateHz));
        } else {
            sweep = Optional.empty();
            sweepFrames = 0;
        }
    }

    /**
     * A generator of {@code stimulus} at {@code levelDbfs} peak.
     *
     * @param sweepSeconds length of a sweep whose text gives none (ignored for other signals)
     * @param allowLoud    true to allow a start above {@link #SAFE_START_DBFS}
     * @throws IllegalArgumentException for a level above the safe start without {@code allowLoud}, above 0 dBFS, or a
     *                                  frequency at or above Nyquist
     */
    public static Generator of(Stimulus stimulus, double sampleRateHz, double levelDbfs, double sweepSeconds, boolean allowLoud) {
        if (stimulus == null) throw new IllegalArgumentException("stimulus must not be null");
        if (!(sampleRateHz > 0 && Double.isFinite(sampleRateHz))) throw new IllegalArgumentException("sampleRateHz=" + sampleRateHz + " must be a positive number");
        if (!(sweepSeconds > 0 && Double.isFinite(sweepSeconds))) throw new IllegalArgumentException("sweepSeconds=" + sweepSeconds + " must be a positive number");
        checkLevel(levelDbfs, allowLoud);
        return new Generator(stimulus, sampleRateHz, levelDbfs, sweepSeconds);
    }

    /** Checks a level against 0 dBFS and, unless {@code allowLoud}, against {@link #SAFE_START_DBFS}. */
    public static void checkLevel(double levelDbfs, boolean allowLoud) {
        if (!Double.isFinite(levelDbfs)) throw new IllegalArgumentException("level " + levelDbfs + " dBFS must be a finite number");
        if (levelDbfs > 0) throw new IllegalArgumentException("level " + levelDbfs + " dBFS is above digital full scale (0 dBFS)");
        if (levelDbfs > SAFE_START_DBFS && !allowLoud)
            throw new IllegalArgumentException("level " + levelDbfs + " dBFS is above the safe level " + (int) SAFE_START_DBFS
                    + " dBFS; ask for it explicitly (--allow-loud) once the attenuator and load are checked");
    }

    public Stimulus stimulus() { return stimulus; }
    public double sampleRateHz() { return sampleRateHz; }
    /** The level most recently set or ramped to, dBFS peak (−∞ after {@link #fadeOut}). */
    public double levelDbfs() { return levelDbfs; }
    /** Frames generated so far. */
    public long position() { return position; }
    /** The sweep's parameters when the stimulus is a sweep. */
    public Optional<SweepParameters> sweepParameters() {
        return sweep.map(p -> new SweepParameters(p.sampleRateHz(), p.startHz(), p.endHz(), p.lengthSeconds(), p.rateSeconds(),
                p.fadeInSeconds(), p.fadeOutSeconds(), gainOf(levelDbfs)));
    }

    /** Starts from silence: the next samples rise to the set level over {@code seconds} (at least {@link #MIN_RAMP_SECONDS}). Call before the first {@link #fill}. */
    public Generator fadeIn(double seconds) {
        double g = gainOf(levelDbfs);
        gain = 0;
        target = 0;
        request.set(new Ramp(g, Math.max(MIN_RAMP_SECONDS, seconds)));
        return this;
    }

    /**
     * Ramps to {@code newLevelDbfs} over {@code seconds} (at least {@link #MIN_RAMP_SECONDS}).
     *
     * @throws IllegalArgumentException as {@link #checkLevel} for the new level
     */
    public void rampTo(double newLevelDbfs, double seconds, boolean allowLoud) {
        checkLevel(newLevelDbfs, allowLoud);
        levelDbfs = newLevelDbfs;
        request.set(new Ramp(gainOf(newLevelDbfs), Math.max(MIN_RAMP_SECONDS, seconds)));
    }

    /** Ramps to silence over {@link #MIN_RAMP_SECONDS}; {@link #isSilent()} turns true once there. */
    public void fadeOut() {
        levelDbfs = Double.NEGATIVE_INFINITY;
        request.set(new Ramp(0, MIN_RAMP_SECONDS));
    }

    /** True when the output gain is zero and no ramp is pending. */
    public boolean isSilent() { return gain == 0 && target == 0 && request.get() == null; }

    /** Frames a fade of {@link #MIN_RAMP_SECONDS} lasts at this rate. */
    public int rampFrames() { return (int) Math.ceil(MIN_RAMP_SECONDS * sampleRateHz); }

    /** Writes the next {@code length} samples (full-scale units) into {@code out[offset...]}. */
    public void fill(double[] out, int offset, int length) {
        Ramp r = request.getAndSet(null);
        if (r != null) {
            target = r.targetGain;
            step = (target - gain) / Math.max(1, r.seconds * sampleRateHz);
        }
        for (int i = 0; i < length; i++) {
            double g = gain;
            if (g != target) {
                g += step;
                if ((step > 0 && g >= target) || (step < 0 && g <= target) || step == 0) g = target;
                gain = g;
            }
            out[offset + i] = g * nextUnit();
        }
        position += length;
    }

    /** Renders {@code frames} samples from the present state (a file: no fade-in unless {@link #fadeIn} was called). */
    public double[] render(int frames) {
        double[] out = new double[frames];
        fill(out, 0, frames);
        return out;
    }

    /** The next sample of the signal at unit peak. */
    private double nextUnit() {
        if (sweep.isPresent()) {
            SweepParameters p = sweep.get();
            double t = sweepIndex / sampleRateHz;
            double cycles = p.phaseCycles(t);
            double v = p.envelope(t) * sinCycles(cycles - Math.floor(cycles));
            if (++sweepIndex >= sweepFrames) sweepIndex = 0;
            return v;
        }
        if (stimulus instanceof Stimulus.Burst b) {
            double c = phases[0];
            double v = c < b.onCycles() ? sinCycles(c - Math.floor(c)) : 0.0;
            c += increments[0];
            int period = b.onCycles() + b.offCycles();
            if (c >= period) c -= period;
            phases[0] = c;
            return v;
        }
        double v = 0;
        for (int k = 0; k < increments.length; k++) {
            double c = phases[k];
            v += amplitudes[k] * sinCycles(c);
            c += increments[k];
            if (c >= 1) c -= 1;
            phases[k] = c;
        }
        return v;
    }

    /** sin(2π·c) for c in [0, 1), with c first reduced to [−½, ½). */
    private static double sinCycles(double c) {
        double r = c >= 0.5 ? c - 1.0 : c;
        return Math.sin(2 * Math.PI * r);
    }

    /** Linear peak gain of a level in dBFS peak. */
    public static double gainOf(double levelDbfs) { return levelDbfs == Double.NEGATIVE_INFINITY ? 0 : Math.pow(10, levelDbfs / 20); }

    private static void checkNyquist(double hz, double nyquist, Stimulus s) {
        if (hz >= nyquist) throw new IllegalArgumentException("signal " + s.spec() + ": " + hz + " Hz is not below Nyquist (" + nyquist + " Hz) at this sample rate");
    }
}
