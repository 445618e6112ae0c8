package org.outstage.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import java.util.Random;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.outstage.capture.WavWriter;
import org.outstage.json.JsonText;

/** The JSON contracts of issue 12 (docs/cli.md): analyze's imd / noise / crosstalk, response, impedance. */
class SpecCommandsTest {
    @TempDir Path dir;

    static double[] tone(double fs, int n, double f, double peak) {
        double[] y = new double[n];
        for (int i = 0; i < n; i++) y[i] = peak * Math.sin(2 * Math.PI * f * i / fs);
        return y;
    }

    @SuppressWarnings("unchecked")
    static Map<String, Object> firstCapture(String json) {
        Map<String, Object> root = (Map<String, Object>) JsonText.parse(json);
        return (Map<String, Object>) ((List<Object>) root.get("captures")).get(0);
    }

    @Test
    @SuppressWarnings("unchecked")
    void analyzeJson_smpteCapture_hasImdObject() throws Exception {
        double fs = 48000;
        double[] lo = tone(fs, 96000, 60, 0.4), hi = tone(fs, 96000, 7000, 0.1);
        double[] y = new double[lo.length];
        for (int i = 0; i < y.length; i++) { double x = lo[i] + hi[i]; y[i] = x + 0.01 * x * x; }
        Path wav = dir.resolve("smpte.wav");
        WavWriter.write(wav, (int) fs, WavWriter.Encoding.FLOAT_64, false, y);
        CliRun r = CliRun.of("analyze", "--json", "--fs-volts", "40", wav.toString());
        assertEquals(0, r.exit(), r.err());
        Map<String, Object> c = firstCapture(r.out());
        Map<String, Object> imd = (Map<String, Object>) c.get("imd");
        assertEquals("smpte", imd.get("method"));
        assertEquals(60.0, ((Number) imd.get("f1_hz")).doubleValue(), 0.1);
        assertEquals(4.0, ((Number) imd.get("ratio")).doubleValue(), 0.05);
        // y = x + a2·x²: each of f2 ± f1 is a2·A1·A2 (docs/references.md §3), d2 = 2·a2·A1 = 0.008 relative to U(f2) = A2
        assertEquals(0.008, ((Number) imd.get("d2")).doubleValue(), 0.008 * 0.01);
        assertTrue(((List<Object>) imd.get("products")).size() >= 2);
        assertNull(c.get("noise"));
    }

    @Test
    @SuppressWarnings("unchecked")
    void analyzeJson_stimulusNone_hasNoiseWithSnr() throws Exception {
        double fs = 48000;
        Random rnd = new Random(4);
        double[] y = new double[96000];
        for (int i = 0; i < y.length; i++) y[i] = 2.5e-6 * rnd.nextGaussian();   // ×40 V = 100 µV rms
        Path wav = dir.resolve("noise.wav");
        WavWriter.write(wav, (int) fs, WavWriter.Encoding.FLOAT_64, false, y);
        CliRun r = CliRun.of("analyze", "--json", "--fs-volts", "40", "--load", "8", "--rated-power", "60", "--stimulus", "none", wav.toString());
        assertEquals(0, r.exit(), r.err());
        Map<String, Object> n = (Map<String, Object>) firstCapture(r.out()).get("noise");
        double truth = 100e-6 * Math.sqrt((20000 - 20) / 24000.0);   // band share of white noise (docs/references.md §13)
        assertEquals(0, 20 * Math.log10(((Number) n.get("rms")).doubleValue() / truth), 0.1);
        Map<String, Object> snr = (Map<String, Object>) n.get("snr_db");
        assertEquals(20 * Math.log10(Math.sqrt(480) / truth), ((Number) snr.get("re_rated")).doubleValue(), 0.1);
        assertTrue(snr.get("re_rated_a") instanceof Number);
    }

    @Test
    @SuppressWarnings("unchecked")
    void analyzeJson_driven1_reportsCrosstalkOnChannel2() throws Exception {
        double fs = 48000;
        double[] a = tone(fs, 48000, 1000, 0.5), b = tone(fs, 48000, 1000, 0.5e-3);   // −60 dB
        Path wav = dir.resolve("xtalk.wav");
        WavWriter.write(wav, (int) fs, WavWriter.Encoding.FLOAT_64, false, a, b);
        CliRun r = CliRun.of("analyze", "--json", "--driven", "1", wav.toString());
        assertEquals(0, r.exit(), r.err());
        Map<String, Object> root = (Map<String, Object>) JsonText.parse(r.out());
        List<Object> caps = (List<Object>) root.get("captures");
        assertNull(((Map<String, Object>) caps.get(0)).get("crosstalk"));
        Map<String, Object> x = (Map<String, Object>) ((Map<String, Object>) caps.get(1)).get("crosstalk");
        assertEquals(1, ((Number) x.get("from_channel")).intValue());
        assertEquals(-60, ((Number) x.get("db")).doubleValue(), 0.05);
    }

    @Test
    @SuppressWarnings("unchecked")
    void responseJson_withReference_wireReadsZeroDb() throws Exception {
        double fs = 48000, t = 4;
        int n = (int) (fs * t);
        double l = Math.log(20000 / 5.0);
        double[] x = new double[n];
        for (int i = 0; i < n; i++) x[i] = 0.5 * Math.sin(2 * Math.PI * 5 * t / l * (Math.exp(i / fs * l / t) - 1));
        double[] y = x.clone();
        for (int i = 0; i < n; i++) y[i] *= 0.5;   // −6.02 dB, a divider
        Path wav = dir.resolve("sweep.wav");
        WavWriter.write(wav, (int) fs, WavWriter.Encoding.FLOAT_64, false, x, y);
        CliRun r = CliRun.of("response", "--reference", "1", "--json", wav.toString());
        assertEquals(0, r.exit(), r.err());
        Map<String, Object> o = (Map<String, Object>) JsonText.parse(r.out());
        for (Object p : (List<Object>) o.get("points"))   // 20·lg(1/2); 0.05 dB is the issue's in-band target
            assertEquals(-6.0206, ((Number) ((Map<String, Object>) p).get("gain_db")).doubleValue(), 0.05, "20·lg(1/2)");
        Map<String, Object> m3 = (Map<String, Object>) o.get("minus_3db_hz");
        assertNull(m3.get("low"));
        assertTrue(o.containsKey("deviation_db") && o.containsKey("thd_vs_frequency"));
    }

    @Test
    @SuppressWarnings("unchecked")
    void responseJson_knownSweepWithoutReference_startFoundByCrossCorrelation_wireIsFlat() throws Exception {
        double fs = 48000;
        double[] played = ResponseCommand.render("sweep:5-20k,4", fs);
        int lead = 14_321;   // the capture starts 0.298 s before the sweep
        double[] y = new double[played.length + lead + 4800];
        for (int i = 0; i < played.length; i++) y[lead + i] = 0.25 * played[i];
        Path wav = dir.resolve("known.wav");
        WavWriter.write(wav, (int) fs, WavWriter.Encoding.FLOAT_64, false, y);
        CliRun r = CliRun.of("response", "--sweep", "sweep:5-20k,4", "--json", wav.toString());
        assertEquals(0, r.exit(), r.err());
        Map<String, Object> o = (Map<String, Object>) JsonText.parse(r.out());
        assertEquals(false, o.get("from_reference"));
        for (Object p : (List<Object>) o.get("points")) {
            Map<String, Object> m = (Map<String, Object>) p;
            // a wire: flat (0.05 dB, the issue's in-band target) and, once the start is found, no phase
            assertEquals(0, ((Number) m.get("gain_re_1khz_db")).doubleValue(), 0.05);
            assertEquals(0, ((Number) m.get("phase_deg")).doubleValue(), 1.0);
        }
        assertEquals(2, CliRun.of("response", wav.toString()).exit(), "no reference and no sweep: bad input");
    }

    @Test
    @SuppressWarnings("unchecked")
    void impedanceJson_dividerOf0Point1Ohm() throws Exception {
        double fs = 48000;
        Path open = dir.resolve("open.wav"), loaded = dir.resolve("loaded.wav");
        WavWriter.write(open, (int) fs, WavWriter.Encoding.FLOAT_64, false, tone(fs, 48000, 1000, 0.1));
        WavWriter.write(loaded, (int) fs, WavWriter.Encoding.FLOAT_64, false, tone(fs, 48000, 1000, 0.1 * 8 / 8.1));
        CliRun r = CliRun.of("impedance", "--load", "8", "--fs-volts", "40", "--json", loaded.toString(), open.toString());
        assertEquals(0, r.exit(), r.err());
        Map<String, Object> o = (Map<String, Object>) JsonText.parse(r.out());
        assertEquals(0.1, ((Number) o.get("output_impedance_ohms")).doubleValue(), 1e-6, "voltage divider, §13");
        assertEquals(80, ((Number) o.get("damping_factor")).doubleValue(), 1e-3);
        CliRun bad = CliRun.of("impedance", loaded.toString(), open.toString());
        assertEquals(2, bad.exit());
    }

    /** x through k·jωτ/(1 + jωτ) (first-order high-pass, capacitive coupling), by FFT of the zero-padded signal. */
    static double[] highPass(double[] x, double fs, double k, double cornerHz) {
        int m = Integer.highestOneBit(x.length) << 2;
        double[] z = new double[2 * m];
        for (int i = 0; i < x.length; i++) z[2 * i] = x[i];
        org.jtransforms.fft.DoubleFFT_1D fft = new org.jtransforms.fft.DoubleFFT_1D(m);
        fft.complexForward(z);
        for (int i = 0; i < m; i++) {
            double wt = (i <= m / 2 ? i : i - m) * fs / m / cornerHz;   // ωτ, signed
            double den = 1 + wt * wt, hr = k * wt * wt / den, hi = k * wt / den;   // k·jωτ(1 − jωτ)/(1 + (ωτ)²)
            double a = z[2 * i], b = z[2 * i + 1];
            z[2 * i] = a * hr - b * hi;
            z[2 * i + 1] = a * hi + b * hr;
        }
        fft.complexInverse(z, true);
        double[] y = new double[x.length];
        for (int i = 0; i < y.length; i++) y[i] = z[2 * i];
        return y;
    }

    @Test
    @SuppressWarnings("unchecked")
    void analyzeJson_sweptCrosstalk_matchesFirstOrderHighPass() throws Exception {
        double fs = 96000, k = 0.01, fc = 2000;
        double[] drv = org.outstage.analysis.ImpedanceVsFrequencyTest.sweep(fs, 20, 20000, 4, 0.5);
        double[] und = highPass(drv, fs, k, fc);
        Path wav = dir.resolve("xtalk-sweep.wav");
        WavWriter.write(wav, (int) fs, WavWriter.Encoding.FLOAT_64, false, drv, und);
        CliRun r = CliRun.of("analyze", "--json", "--driven", "1", "--channel", "2", wav.toString());
        assertEquals(0, r.exit(), r.err());
        Map<String, Object> x = (Map<String, Object>) firstCapture(r.out()).get("crosstalk");
        List<Object> points = (List<Object>) x.get("points");
        assertTrue(points != null && points.size() > 50 && points.size() <= 200, "points: " + points);
        double worst = 0;
        for (Object o : points) {
            Map<String, Object> p = (Map<String, Object>) o;
            double f = ((Number) p.get("frequency_hz")).doubleValue();
            if (f < 50 || f > 15000) continue;
            double wt = f / fc, want = 20 * Math.log10(k * wt / Math.sqrt(1 + wt * wt));   // |k·jωτ/(1 + jωτ)|
            worst = Math.max(worst, Math.abs(((Number) p.get("db")).doubleValue() - want));
        }
        System.out.printf("analyzeJson_sweptCrosstalk: worst error %.4f dB 50 Hz-15 kHz%n", worst);
        assertTrue(worst < 0.1, "worst crosstalk error " + worst + " dB");
        double f = ((Number) x.get("frequency_hz")).doubleValue(), wt = f / fc;
        assertEquals(20 * Math.log10(k * wt / Math.sqrt(1 + wt * wt)), ((Number) x.get("db")).doubleValue(), 0.1);
    }

    @Test
    @SuppressWarnings("unchecked")
    void impedanceJson_twoSweeps_givesPointsAgainstFrequency() throws Exception {
        double fs = 96000, r0 = 0.05, l0 = 5e-6;
        double[] gen = org.outstage.analysis.ImpedanceVsFrequencyTest.sweep(fs, 20, 20000, 4, 0.5);
        double[] open = new double[gen.length];
        for (int i = 0; i < gen.length; i++) open[i] = 0.8 * gen[i];
        double[] loadedOut = org.outstage.analysis.ImpedanceVsFrequencyTest.divider(open, fs, 8, r0, l0);
        Path o = dir.resolve("open-sweep.wav"), l = dir.resolve("loaded-sweep.wav");
        WavWriter.write(o, (int) fs, WavWriter.Encoding.FLOAT_64, false, gen, open);
        WavWriter.write(l, (int) fs, WavWriter.Encoding.FLOAT_64, false, gen, loadedOut);
        CliRun r = CliRun.of("impedance", "--load", "8", "--reference", "1", "--channel", "2", "--json", l.toString(), o.toString());
        assertEquals(0, r.exit(), r.err());
        Map<String, Object> m = (Map<String, Object>) JsonText.parse(r.out());
        List<Object> points = (List<Object>) m.get("points");
        assertTrue(points != null && points.size() > 50 && points.size() <= 200, "points: " + points);
        double f = ((Number) m.get("frequency_hz")).doubleValue();
        assertEquals(1000, f, 30);
        double zs = Math.hypot(r0, 2 * Math.PI * f * l0);      // |Z_s| of the divider applied above
        assertEquals(zs, ((Number) m.get("output_impedance_ohms")).doubleValue(), 0.02 * zs);
        assertEquals(8 / zs, ((Number) m.get("damping_factor")).doubleValue(), 0.02 * 8 / zs);
        assertTrue(m.containsKey("open_rms") && m.get("open_rms") == null, "no single-tone level for sweeps");
        Map<String, Object> p0 = (Map<String, Object>) points.get(0);
        assertTrue(p0.containsKey("output_impedance_phase_deg") && p0.containsKey("damping_factor"));
        CliRun text = CliRun.of("impedance", "--load", "8", "--reference", "1", l.toString(), o.toString());
        assertEquals(0, text.exit(), text.err());
        boolean row1k = false;   // the third-octave table has a row near 1 kHz with |Z_s| there
        for (String line : text.out().split("\\R")) {
            String[] w = line.trim().split("\\s+");
            if (w.length != 4 || !w[0].matches("[0-9.]+")) continue;
            double rf = Double.parseDouble(w[0]), rz = Double.parseDouble(w[1]);
            if (Math.abs(rf - 1000) < 30) row1k = Math.abs(rz / Math.hypot(r0, 2 * Math.PI * rf * l0) - 1) < 0.02;
        }
        assertTrue(row1k, text.out());
    }

    /**
     * One rule for a sweep (SweepResponse.sweepCandidate, shared with the workbench): the sample sweep, whose bench.txt
     * names the generator channel, is read as a sweep by verify with no stated stimulus, and its noise figures (the
     * analysis finds no tone) do not stand in for a noise capture.
     */
    @Test
    @SuppressWarnings("unchecked")
    void verify_sampleSweepWithoutStatedStimulus_isASweepNotANoiseCapture() {
        Path samples = Path.of(System.getProperty("outstage.project.dir", ".")).resolve("sample-captures");
        CliRun r = CliRun.of("verify", "--spec", samples.resolve("spec/da-60-sheet.spec").toString(), "--fs-volts", "40", "--load", "8",
                "--allow-unmeasured", "--no-log", "--json", samples.resolve("da60-sweep-gen-ch1-amp-ch2-1W.wav").toString());
        assertEquals(0, r.exit(), r.err());
        Map<String, Object> root = (Map<String, Object>) JsonText.parse(r.out());
        Map<String, String> verdicts = new java.util.HashMap<>();
        for (Object o : (List<Object>) root.get("limits")) {
            Map<String, Object> l = (Map<String, Object>) o;
            verdicts.put((String) l.get("quantity"), (String) l.get("verdict"));
        }
        assertEquals("pass", verdicts.get("response-deviation"), r.out());
        assertEquals("pass", verdicts.get("bandwidth-low"), r.out());
        assertEquals("not-measured", verdicts.get("snr"), r.out());
    }

    /**
     * A noise capture (input shorted: hum at 50 Hz, 0.28 mV, below the 10 mV of a test tone) gets its noise and hum
     * figures, and no THD, power or crossover figures of the hum line in the text table or the bench report: those
     * would describe the hum, not the amplifier.
     */
    @Test
    void noiseCapture_textAndReport_giveNoToneFigures() throws Exception {
        Path samples = Path.of(System.getProperty("outstage.project.dir", ".")).resolve("sample-captures");
        String noise = samples.resolve("da60-noise-input-shorted.wav").toString();
        CliRun r = CliRun.of("analyze", "--fs-volts", "40", "--load", "8", noise);
        assertEquals(0, r.exit(), r.err());
        assertTrue(r.out().contains("noise ") && r.out().contains("hum ") && r.out().contains("not a test tone"), r.out());
        for (String absent : new String[] {"THD", "crossover", "W into", "clipping"})
            assertTrue(!r.out().contains(absent), absent + " in " + r.out());
        Path folder = java.nio.file.Files.createDirectories(dir.resolve("noise-bench"));
        java.nio.file.Files.copy(Path.of(noise), folder.resolve("da60-noise-input-shorted.wav"));
        java.nio.file.Files.writeString(folder.resolve("bench.txt"), "*.wav fs-volts=40 load=8\n");
        CliRun b = CliRun.of("bench", "--out", dir.resolve("report").toString(), folder.toString());
        assertEquals(0, b.exit(), b.err());
        String page = java.nio.file.Files.readString(dir.resolve("report/report.html"));
        assertTrue(page.contains("noise capture: noise"), page);
        assertTrue(!page.contains("Crossover:"), "no crossover paragraph for a noise capture");
    }

    /**
     * The sample sweep (generator on channel 1 by its folder's notes) holds no tone: `analyze` must not present it as
     * a noise capture with "hum" lines at the sweep's frequencies, but say it is a sweep and leave its figures to
     * `response`, as verify and the workbench read it (SweepResponse's rule).
     */
    @Test
    @SuppressWarnings("unchecked")
    void analyze_sampleSweep_isNamedASweep_notANoiseCapture() {
        Path samples = Path.of(System.getProperty("outstage.project.dir", ".")).resolve("sample-captures");
        CliRun r = CliRun.of("analyze", "--json", samples.resolve("da60-sweep-gen-ch1-amp-ch2-1W.wav").toString());
        assertEquals(0, r.exit(), r.err());
        Map<String, Object> c = firstCapture(r.out());
        assertEquals(2.0, ((Number) c.get("channel")).doubleValue(), 0.0);
        assertEquals(null, c.get("noise"), "no noise figures for a sweep");
        assertTrue(((List<Object>) c.get("warnings")).stream().anyMatch(w -> String.valueOf(w).contains("exponential sweep")), r.out());
        // bench (and the no-argument run of tools/outstage, which is bench on the sample folder) reads it the same way
        Path folder = dir.resolve("sweep-bench");
        try {
            java.nio.file.Files.createDirectories(folder);
            java.nio.file.Files.copy(samples.resolve("da60-sweep-gen-ch1-amp-ch2-1W.wav"), folder.resolve("sweep.wav"));
            java.nio.file.Files.writeString(folder.resolve("bench.txt"), "*.wav fs-volts=40 load=8 reference=1\n");
        } catch (java.io.IOException e) {
            throw new java.io.UncheckedIOException(e);
        }
        CliRun b = CliRun.of("bench", "--out", dir.resolve("sweep-report").toString(), folder.toString());
        assertEquals(0, b.exit(), b.err());
        assertTrue(b.err().contains("exponential sweep") && !b.out().contains("hum "), b.out() + b.err());
    }
}
