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
 * has come back (a touch of rail sticking). The output stage is measured without global feedback (a stage-test
 * jig), so its own crossover shape shows. Added: 150 µV RMS white noise and 0.4 mV of 50 Hz hum at the output;
 * a soundcard behind a 1:20 divider with 24-bit rounding (full scale = 40 V peak at the amplifier output).
 */
public final class GenerateSampleCaptures {
    static final double VT = 1.380649e-23 * 300 / 1.602176634e-19; // 25.852 mV
    static final double RE = 0.22, RL = 8.0, IS = 1e-12;
    static final double DRIVER_GAIN = 20, POS_LIMIT = 32.3, NEG_LIMIT = -33.0, STICK_SECONDS = 20e-6;
    static final double FS = 48000, TONE = 997, FULL_SCALE = 40, SECONDS = 1.5;
    static final double NOISE_RMS = 150e-6, HUM_PEAK = 0.4e-3;

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
            double[] v = amplifier(n, FS, w, 0.026, 0, seed++).output;
            writeWav(dir.resolve(String.format(Locale.ROOT, "da60-level-%03.0fW.wav", w)), FS, toFullScale(v, FULL_SCALE));
        }
        // bias series at 40 W (the outer swing well past the crossover region even at 90 mV)
        for (double mv : new double[] {3, 26, 90}) {
            double[] v = amplifier(n, FS, 40, mv / 1000, 0, seed++).output;
            writeWav(dir.resolve(String.format(Locale.ROOT, "da60-bias-%02.0fmV-40W.wav", mv)), FS, toFullScale(v, FULL_SCALE));
        }
        // stereo: generator on channel 1 (soundcard input direct, 2 V full scale), amplifier on channel 2 (1:20 divider)
        Run xy = amplifier(n, FS, 20, 0.010, 7.7e-6, seed++);
        writeWav(dir.resolve("da60-xy-gen-ch1-amp-ch2-10mV-20W.wav"), FS, toFullScale(xy.generator, FULL_SCALE / DRIVER_GAIN),
                toFullScale(xy.output, FULL_SCALE));
        // scope CSV of the clipping case: 1 MS/s, 4000 points (about four cycles), 8-bit codes over 80 V
        Run scope = amplifier(4000, 1e6, 70, 0.026, 0, seed++);
        writeScopeCsv(dir.resolve("da60-scope-70W-clipping.csv"), 1e6, scope.output);
        System.out.println("wrote the DA-60 session to " + dir.toAbsolutePath());
    }

    record Run(double[] generator, double[] output) {}

    /**
     * One capture: the generator tone for a nominal output power (unclipped), the driver, the output pair,
     * noise and hum. {@code delaySeconds} delays the amplifier behind the generator.
     */
    static Run amplifier(int n, double fs, double nominalWatts, double vqVolts, double delaySeconds, long seed) {
        Random rnd = new Random(seed);
        double iq = vqVolts / RE;
        double vh = VT * Math.log(iq / IS) + iq * RE;
        double outPeak = Math.sqrt(2 * nominalWatts * RL);
        double stagePeak = outPeak / 0.97; // stage drive that gives outPeak, by a few fixed-point steps (no clipping)
        for (int k = 0; k < 6; k++) stagePeak *= outPeak / pair(stagePeak, vh, outPeak);
        double genPeak = stagePeak / DRIVER_GAIN;
        double w = 2 * Math.PI * TONE, phase = 0.3;
        double[] gen = new double[n], out = new double[n];
        double lastOut = 0;
        for (int i = 0; i < n; i++) {
            double t = i / fs;
            gen[i] = genPeak * Math.sin(w * t + phase);
            double td = t - delaySeconds;
            double drive = DRIVER_GAIN * genPeak * Math.sin(w * td + phase);
            // driver saturation; positive side sticks STICK_SECONDS after its input comes back below the limit
            double earlier = DRIVER_GAIN * genPeak * Math.sin(w * (td - STICK_SECONDS) + phase);
            double mid = DRIVER_GAIN * genPeak * Math.sin(w * (td - STICK_SECONDS / 2) + phase);
            if (drive >= POS_LIMIT || earlier >= POS_LIMIT || mid >= POS_LIMIT) drive = POS_LIMIT;
            if (drive < NEG_LIMIT) drive = NEG_LIMIT;
            lastOut = pair(drive, vh, lastOut);
            out[i] = lastOut + NOISE_RMS * rnd.nextGaussian() + HUM_PEAK * Math.sin(2 * Math.PI * 50 * t);
        }
        return new Run(gen, out);
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
