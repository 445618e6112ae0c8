import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.util.Locale;
import java.util.Random;

/**
 * Writes the invented bench session of sample-captures/: a fictional 60 W class-AB amplifier "DA-60" on a
 * fictional bench. Single-file program with no dependencies, deterministic (every noise source is seeded):
 *
 * <pre>  java tools/GenerateSampleCaptures.java sample-captures</pre>
 *
 * Physics: a complementary emitter-follower output pair with the exponential law Ic = Is·exp(Vbe/VT)
 * (VT = kT/q at 300 K from the exact 2019 SI constants), emitter resistors Re = 0.22 Ω, an 8 Ω load, each
 * device idling at Iq = Vq/Re, solved per sample by Newton (inner: device current for a branch drive; outer:
 * output voltage from Kirchhoff's current law). The driver ahead of it has a gain of 20 and saturates at
 * +32.3 V / −33.0 V (slightly asymmetric rails) and, on the positive side, stays saturated 20 µs after its input
 * has come back (a touch of rail sticking), then lets go with a 0.5 µs time constant. The output stage is measured without global feedback (a stage-test
 * jig), so its own crossover shape shows. The soundcard is modelled as a real one records: the stage is computed
 * at 64 × 48 kHz (the pair's static curve tabulated every 0.5 mV of drive) and passed through an anti-alias filter (flat to 20 kHz, 120 dB down from 24 kHz) before every
 * 64th sample is kept, so the clipping and crossover harmonics above 24 kHz do not fold back as non-harmonic lines.
 * Added: 150 µV RMS white noise and 0.4 mV of 50 Hz hum at the output; a soundcard behind a 1:20 divider with
 * 24-bit rounding (full scale = 40 V peak at the amplifier output).
 *
 * <p>To add a capture: describe the generator as a {@link Stimulus} (a lambda of time), record it with
 * {@link #soundcard} (WAV) or {@link #stage} plus {@link #withNoise} (scope), and write it with {@link #writeWav}
 * or {@link #writeScopeCsv}, with the next seed.
 */
public final class GenerateSampleCaptures {
    static final double VT = 1.380649e-23 * 300 / 1.602176634e-19; // 25.852 mV
    static final double RE = 0.22, RL = 8.0, IS = 1e-12;
    static final double DRIVER_GAIN = 20, POS_LIMIT = 32.3, NEG_LIMIT = -33.0, STICK_SECONDS = 20e-6;
    static final double FS = 48000, TONE = 997, FULL_SCALE = 40, SECONDS = 1.5;
    static final double NOISE_RMS = 150e-6, HUM_PEAK = 0.4e-3;
    static final double RELEASE_SECONDS = 0.5e-6, CURVE_STEP = 0.5e-3;
    static final int OVERSAMPLE = 64;
    static final java.util.Map<Double, double[]> CURVES = new java.util.HashMap<>();
    static final double[] ANTI_ALIAS = kaiserLowPass(20_000, FS / 2, FS * OVERSAMPLE, 120);

    public static void main(String[] args) throws IOException {
        if (args.length != 1) {
            System.err.println("usage: java tools/GenerateSampleCaptures.java <output folder>");
            System.exit(2);
        }
        Path dir = Path.of(args[0]);
        Files.createDirectories(dir);
        int n = (int) Math.round(FS * SECONDS);
        // level series at the well-adjusted bias (26 mV across each Re)
        double[] watts = {1, 5, 20, 40, 55, 62, 70};
        long seed = 1000;
        for (double w : watts) {
            double[] v = soundcard(sine(w, 0.026), 0.026, 0, n, seed++).output;
            writeWav(dir.resolve(String.format(Locale.ROOT, "da60-level-%03.0fW.wav", w)), FS, toFullScale(v, FULL_SCALE));
        }
        // bias series at 40 W (the outer swing well past the crossover region even at 90 mV)
        for (double mv : new double[] {3, 26, 90}) {
            double[] v = soundcard(sine(40, mv / 1000), mv / 1000, 0, n, seed++).output;
            writeWav(dir.resolve(String.format(Locale.ROOT, "da60-bias-%02.0fmV-40W.wav", mv)), FS, toFullScale(v, FULL_SCALE));
        }
        // stereo: generator on channel 1 (soundcard input direct, 2 V full scale), amplifier on channel 2 (1:20 divider)
        Run xy = soundcard(sine(20, 0.010), 0.010, 7.7e-6, n, seed++);
        writeWav(dir.resolve("da60-xy-gen-ch1-amp-ch2-10mV-20W.wav"), FS, toFullScale(xy.generator, FULL_SCALE / DRIVER_GAIN),
                toFullScale(xy.output, FULL_SCALE));
        // scope CSV of the clipping case: 1 MS/s, 4000 points (about four cycles), 8-bit codes over 80 V. The scope's
        // bandwidth is far above the harmonics that matter, so it samples the stage directly (no filter model).
        Run scope = withNoise(stage(sine(70, 0.026), 0.026, 0, 1e6, 4000, 0), 1e6, seed++);
        writeScopeCsv(dir.resolve("da60-scope-70W-clipping.csv"), 1e6, scope.output);
        specSheetCaptures(dir, 2000);
        System.out.println("wrote the DA-60 session to " + dir.toAbsolutePath());
    }

    // ------------------------------------------------------------------------------------------------------------
    // Issue 12: one capture of each spec-sheet stimulus (IMD, noise, sweep, crosstalk, output impedance). Seeds from
    // 2000 so the captures above keep theirs. Levels are in the DA-60's amplifier-output volts like the rest.

    /** Output impedance of the invented DA-60 at 1 kHz (damping factor 200 into 8 Ω). */
    static final double ZOUT = 0.04;
    /** Crosstalk from the driven channel into the other at 997 Hz (−72 dB). */
    static final double CROSSTALK = Math.pow(10, -72 / 20.0);
    /** The DA-60's input coupling: a first-order high-pass at 3.5 Hz (the sweep capture shows it). */
    static final double INPUT_HIGH_PASS_HZ = 3.5;

    static void specSheetCaptures(Path dir, long seed) throws IOException {
        int n = (int) Math.round(FS * SECONDS);
        // SMPTE-type two tones, 60 Hz + 7 kHz at 4:1, summed peak as a 10 W sine's peak
        double p10 = drivePeakFor(10, 0.026) / DRIVER_GAIN;
        Stimulus smpte = t -> p10 * (0.8 * Math.sin(2 * Math.PI * 60 * t) + 0.2 * Math.sin(2 * Math.PI * 7000 * t + 0.5));
        writeWav(dir.resolve("da60-imd-smpte-60Hz-7kHz-10W.wav"), FS, toFullScale(soundcard(smpte, 0.026, 0, n, seed++).output, FULL_SCALE));
        // twin tone 19 + 20 kHz, equal amplitudes, same summed peak
        Stimulus twin = t -> p10 * 0.5 * (Math.sin(2 * Math.PI * 19000 * t) + Math.sin(2 * Math.PI * 20000 * t + 0.5));
        writeWav(dir.resolve("da60-imd-twin-19k-20k-10W.wav"), FS, toFullScale(soundcard(twin, 0.026, 0, n, seed++).output, FULL_SCALE));
        // input shorted: the output is the bench's noise and 50 Hz hum (withNoise) and nothing else
        Run quiet = withNoise(new Run(new double[n], new double[n]), FS, seed++);
        writeWav(dir.resolve("da60-noise-input-shorted.wav"), FS, toFullScale(quiet.output, FULL_SCALE));
        // exponential sweep 1 Hz–22 kHz, 8 s, at a 1 W sine's peak; generator on channel 1, amplifier on channel 2.
        // The input high-pass is applied to the recorded output (bilinear, pre-warped): a simplification, since in
        // the amplifier it precedes the stage, harmless at 1 W where the stage is nearly linear.
        double p1 = drivePeakFor(1, 0.026) / DRIVER_GAIN, t = 8, l = Math.log(22000 / 1.0);
        Stimulus sweep = u -> u < 0 || u >= t ? 0 : p1 * Math.sin(2 * Math.PI * 1.0 * t / l * (Math.exp(u * l / t) - 1));
        int ns = (int) Math.round(FS * (t + 0.5));
        Run sw = soundcard(sweep, 0.026, 0, ns, seed++);
        writeWav(dir.resolve("da60-sweep-gen-ch1-amp-ch2-1W.wav"), FS, toFullScale(sw.generator, FULL_SCALE / DRIVER_GAIN),
                toFullScale(highPass(sw.output, INPUT_HIGH_PASS_HZ, FS), FULL_SCALE));
        // crosstalk: channel 1 driven at 10 W, channel 2 undriven with the driven output leaking in at −72 dB
        Run driven = soundcard(sine(10, 0.026), 0.026, 0, n, seed++);
        double[] leak = new double[n];
        for (int i = 0; i < n; i++) leak[i] = CROSSTALK * driven.output[i];
        Run other = withNoise(new Run(new double[n], leak), FS, seed++);
        writeWav(dir.resolve("da60-crosstalk-ch1-driven-10W.wav"), FS, toFullScale(driven.output, FULL_SCALE), toFullScale(other.output, FULL_SCALE));
        // output impedance: the 1 W tone into 8 Ω, and the same drive open-circuit, V_open = V_loaded·(RL + ZOUT)/RL
        Run loaded = soundcard(sine(1, 0.026), 0.026, 0, n, seed++);
        Run openRun = soundcard(sine(1, 0.026), 0.026, 0, n, seed++);
        double[] open = new double[n];
        for (int i = 0; i < n; i++) open[i] = openRun.output[i] * (RL + ZOUT) / RL;
        writeWav(dir.resolve("da60-zout-loaded-8ohm-1W.wav"), FS, toFullScale(loaded.output, FULL_SCALE));
        writeWav(dir.resolve("da60-zout-open-1W.wav"), FS, toFullScale(open, FULL_SCALE));
    }

    /** First-order high-pass at fc by the bilinear transform with pre-warping: y = a·(y₋₁ + x − x₋₁), a = 1/(1 + K), K = tan(π·fc/fs). */
    static double[] highPass(double[] x, double fc, double fs) {
        double k = Math.tan(Math.PI * fc / fs), a = 1 / (1 + k), b = (1 - k) / (1 + k);
        double[] y = new double[x.length];
        double x1 = 0, y1 = 0;
        for (int i = 0; i < x.length; i++) {
            y[i] = b * y1 + a * (x[i] - x1);
            x1 = x[i];
            y1 = y[i];
        }
        return y;
    }

    /** Generator and amplifier-output waveforms in volts, sample for sample. */
    record Run(double[] generator, double[] output) {}

    /** A generator waveform: volts at the amplifier's input at time t. New stimuli (two tones, bursts) are lambdas. */
    interface Stimulus {
        double volts(double tSeconds);
    }

    /** The 997 Hz generator sine that gives {@code nominalWatts} into RL at bias vq (the unclipped power). */
    static Stimulus sine(double nominalWatts, double vqVolts) {
        double genPeak = drivePeakFor(nominalWatts, vqVolts) / DRIVER_GAIN;
        double w = 2 * Math.PI * TONE, phase = 0.3;
        return t -> genPeak * Math.sin(w * t + phase);
    }

    /** Stage drive peak that gives the nominal output peak, by a few fixed-point steps (no clipping). */
    static double drivePeakFor(double nominalWatts, double vqVolts) {
        double vh = headroom(vqVolts);
        double outPeak = Math.sqrt(2 * nominalWatts * RL);
        double stagePeak = outPeak / 0.97;
        for (int k = 0; k < 6; k++) stagePeak *= outPeak / pair(stagePeak, vh, outPeak);
        return stagePeak;
    }

    /** Bias voltage of each branch for a quiescent drop vq across Re: VT·ln(Iq/Is) + Iq·Re. */
    static double headroom(double vqVolts) {
        double iq = vqVolts / RE;
        return VT * Math.log(iq / IS) + iq * RE;
    }

    /**
     * The noiseless stage: generator and amplifier output at {@code n} instants t0 + i/fs. The driver saturates at
     * its limits and its positive side sticks STICK_SECONDS after its input comes back; {@code delaySeconds} delays
     * the amplifier behind the generator.
     */
    static Run stage(Stimulus gen, double vqVolts, double delaySeconds, double fs, int n, double t0) {
        double[] curve = stageCurve(vqVolts);
        double[] g = new double[n], out = new double[n];
        double releasedAt = Double.NaN, prevEarlier = Double.NaN, prevT = Double.NaN;
        for (int i = 0; i < n; i++) {
            double t = t0 + i / fs;
            g[i] = gen.volts(t);
            double td = t - delaySeconds;
            double drive = DRIVER_GAIN * gen.volts(td);
            double earlier = DRIVER_GAIN * gen.volts(td - STICK_SECONDS);
            double mid = DRIVER_GAIN * gen.volts(td - STICK_SECONDS / 2);
            if (drive >= POS_LIMIT || earlier >= POS_LIMIT || mid >= POS_LIMIT) {
                drive = POS_LIMIT;
                releasedAt = Double.NaN;
            } else if (prevEarlier >= POS_LIMIT) {
                // the sticking ends when the delayed input falls through the limit: that instant, interpolated
                releasedAt = prevT + (t - prevT) * (prevEarlier - POS_LIMIT) / (prevEarlier - earlier);
            }
            if (!Double.isNaN(releasedAt)) // letting go of the rail takes RELEASE_SECONDS (time constant), not zero time
                drive += (POS_LIMIT - drive) * Math.exp(-(t - releasedAt) / RELEASE_SECONDS);
            if (drive < NEG_LIMIT) drive = NEG_LIMIT;
            out[i] = lookup(curve, drive);
            prevEarlier = earlier;
            prevT = t;
        }
        return new Run(g, out);
    }

    /** The pair's static curve at bias vq, tabulated every CURVE_STEP volts of drive over the driver's range. */
    static double[] stageCurve(double vqVolts) {
        return CURVES.computeIfAbsent(vqVolts, vq -> {
            double vh = headroom(vq);
            int m = (int) Math.ceil((POS_LIMIT - NEG_LIMIT) / CURVE_STEP) + 2;
            double[] c = new double[m];
            double last = 0;
            for (int k = 0; k < m; k++) c[k] = last = pair(NEG_LIMIT + k * CURVE_STEP, vh, last);
            return c;
        });
    }

    /** Linear interpolation in the tabulated curve (error below 1 µV at a 0.5 mV step: far under the 24-bit step). */
    static double lookup(double[] curve, double drive) {
        double x = (drive - NEG_LIMIT) / CURVE_STEP;
        int k = Math.min(curve.length - 2, Math.max(0, (int) Math.floor(x)));
        double f = x - k;
        return curve[k] + f * (curve[k + 1] - curve[k]);
    }

    /** Adds the bench's noise (white, NOISE_RMS) and 50 Hz hum to the output; samples at t = i/fs; seeded. */
    static Run withNoise(Run r, double fs, long seed) {
        Random rnd = new Random(seed);
        double[] out = r.output.clone();
        for (int i = 0; i < out.length; i++)
            out[i] += NOISE_RMS * rnd.nextGaussian() + HUM_PEAK * Math.sin(2 * Math.PI * 50 * (i / fs));
        return new Run(r.generator, out);
    }

    /**
     * What the soundcard records at FS: the stage computed at OVERSAMPLE × FS, passed through the modelled
     * anti-alias filter ({@link #ANTI_ALIAS}) and kept every OVERSAMPLE-th sample, then noise and hum (white within
     * the soundcard's band). Harmonics above FS/2 are thereby removed instead of folding back as non-harmonic lines,
     * as the decimation filter of a real soundcard's converter does.
     */
    static Run soundcard(Stimulus gen, double vqVolts, double delaySeconds, int n, long seed) {
        int half = ANTI_ALIAS.length / 2, m = (n - 1) * OVERSAMPLE + ANTI_ALIAS.length;
        Run fast = stage(gen, vqVolts, delaySeconds, FS * OVERSAMPLE, m, -half / (FS * OVERSAMPLE));
        return withNoise(new Run(decimate(fast.generator, n), decimate(fast.output, n)), FS, seed);
    }

    /** y[k] = Σ h[j]·x[k·OVERSAMPLE + j]: the filter centred on each kept instant. */
    static double[] decimate(double[] x, int n) {
        double[] y = new double[n];
        for (int k = 0; k < n; k++) {
            double s = 0;
            for (int j = 0, o = k * OVERSAMPLE; j < ANTI_ALIAS.length; j++) s += ANTI_ALIAS[j] * x[o + j];
            y[k] = s;
        }
        return y;
    }

    /**
     * Modelled anti-alias (decimation) filter: linear-phase windowed-sinc low-pass at FS·OVERSAMPLE, passband to
     * 20 kHz, stopband from FS/2 = 24 kHz, Kaiser window for 120 dB of stopband attenuation. Kaiser's design
     * formulas (Oppenheim and Schafer, Discrete-Time Signal Processing, 3rd ed., §7.6): β = 0.1102·(A − 8.7),
     * taps N ≈ (A − 8)/(2.285·Δω) + 1 with Δω the transition width in rad/sample. Unity gain at DC.
     */
    static double[] kaiserLowPass(double passHz, double stopHz, double fs, double attenuationDb) {
        double dw = 2 * Math.PI * (stopHz - passHz) / fs;
        int taps = (int) Math.ceil((attenuationDb - 8) / (2.285 * dw)) + 1;
        if (taps % 2 == 0) taps++;
        double beta = 0.1102 * (attenuationDb - 8.7), fc = (passHz + stopHz) / 2 / fs;
        int mid = taps / 2;
        double[] h = new double[taps];
        double sum = 0;
        for (int i = 0; i < taps; i++) {
            int k = i - mid;
            double sinc = k == 0 ? 2 * fc : Math.sin(2 * Math.PI * fc * k) / (Math.PI * k);
            double r = (double) k / mid;
            h[i] = sinc * besselI0(beta * Math.sqrt(1 - r * r)) / besselI0(beta);
            sum += h[i];
        }
        for (int i = 0; i < taps; i++) h[i] /= sum;
        return h;
    }

    /** Modified Bessel function of the first kind, order 0, by its power series. */
    static double besselI0(double x) {
        double term = 1, sum = 1;
        for (int k = 1; k < 200 && term > 1e-17 * sum; k++) {
            term *= (x / (2 * k)) * (x / (2 * k));
            sum += term;
        }
        return sum;
    }

    /** Device current for branch drive u: Re·I + VT·ln(I/Is) = u (Newton on ln I from an over-estimate). */
    static double device(double u) {
        double lnIs = Math.log(IS);
        double x = Math.min(lnIs + u / VT, u > 0 ? Math.log(u / RE) : Double.POSITIVE_INFINITY);
        for (int k = 0; k < 100; k++) {
            double e = Math.exp(x);
            double dx = (RE * e + VT * (x - lnIs) - u) / (RE * e + VT);
            x -= dx;
            if (Math.abs(dx) < 1e-13) break;
        }
        return Math.exp(x);
    }

    /** Output of the pair for drive {@code vin}: In(vin + vh − v) − Ip(v − vin + vh) = v/RL, safeguarded Newton. */
    static double pair(double vin, double vh, double start) {
        double lo = -Math.abs(vin) - 2, hi = Math.abs(vin) + 2;
        double v = Math.max(lo + 1e-9, Math.min(hi - 1e-9, start));
        for (int k = 0; k < 100; k++) {
            double in = device(vin + vh - v), ip = device(v - vin + vh);
            double g = in - ip - v / RL;
            if (g > 0) lo = v; else hi = v;
            double dg = -1 / (RE + VT / in) - 1 / (RE + VT / ip) - 1 / RL;
            double nv = v - g / dg;
            if (!(nv > lo && nv < hi)) nv = 0.5 * (lo + hi);
            if (Math.abs(nv - v) < 1e-13) return nv;
            v = nv;
        }
        return v;
    }

    static int[] toFullScale(double[] volts, double fullScaleVolts) {
        int max = (1 << 23) - 1;
        int[] c = new int[volts.length];
        for (int i = 0; i < volts.length; i++)
            c[i] = (int) Math.max(-max - 1, Math.min(max, Math.round(volts[i] / fullScaleVolts * (1 << 23))));
        return c;
    }

    /** 24-bit PCM WAV (RIFF, 16-byte fmt chunk), channels interleaved; written to a temp file then moved. */
    static void writeWav(Path file, double fs, int[]... channels) throws IOException {
        int ch = channels.length, n = channels[0].length, block = 3 * ch;
        long dataBytes = (long) n * block;
        ByteArrayOutputStream b = new ByteArrayOutputStream((int) dataBytes + 44);
        b.write("RIFF".getBytes(StandardCharsets.US_ASCII));
        le32(b, 36 + dataBytes);
        b.write("WAVEfmt ".getBytes(StandardCharsets.US_ASCII));
        le32(b, 16);
        le16(b, 1);
        le16(b, ch);
        le32(b, (long) fs);
        le32(b, (long) fs * block);
        le16(b, block);
        le16(b, 24);
        b.write("data".getBytes(StandardCharsets.US_ASCII));
        le32(b, dataBytes);
        for (int i = 0; i < n; i++)
            for (int[] c : channels) { int v = c[i]; b.write(v & 0xff); b.write((v >> 8) & 0xff); b.write((v >> 16) & 0xff); }
        atomicWrite(file, b.toByteArray());
    }

    /** Scope export: key/value preamble, a "Time,CH1" header, time and volts; 8-bit codes over ±40 V (10 V/div). */
    static void writeScopeCsv(Path file, double fs, double[] volts) throws IOException {
        double step = 80.0 / 256;
        StringBuilder sb = new StringBuilder();
        sb.append("Instrument,fictional bench scope\n");
        sb.append("Record Length,").append(volts.length).append('\n');
        sb.append(String.format(Locale.ROOT, "Sample Interval,%.6E%n", 1 / fs));
        sb.append("Trigger Point,0\nSource,CH1\nVertical Units,V\nVertical Scale,10\nVertical Offset,0\n");
        sb.append("Horizontal Units,s\nHorizontal Scale,0.0005\nProbe Atten,10\n");
        sb.append("Time,CH1\n");
        for (int i = 0; i < volts.length; i++) {
            long code = Math.max(-128, Math.min(127, Math.round(volts[i] / step)));
            sb.append(String.format(Locale.ROOT, "%.6E,%.4f%n", i / fs, code * step));
        }
        atomicWrite(file, sb.toString().replace(System.lineSeparator(), "\n").getBytes(StandardCharsets.US_ASCII));
    }

    static void atomicWrite(Path file, byte[] bytes) throws IOException {
        Path tmp = file.resolveSibling(file.getFileName() + ".tmp");
        Files.write(tmp, bytes);
        Files.move(tmp, file, StandardCopyOption.REPLACE_EXISTING, StandardCopyOption.ATOMIC_MOVE);
    }

    static void le16(ByteArrayOutputStream b, int v) { b.write(v & 0xff); b.write((v >> 8) & 0xff); }

    static void le32(ByteArrayOutputStream b, long v) { for (int k = 0; k < 4; k++) b.write((int) ((v >> (8 * k)) & 0xff)); }
}
