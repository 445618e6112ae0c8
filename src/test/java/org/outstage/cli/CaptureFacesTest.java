package org.outstage.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.outstage.analysis.Analyzer;
import org.outstage.analysis.Measurement;
import org.outstage.capture.SampleUnit;
import org.outstage.capture.WavWriter;
import org.outstage.json.JsonText;

/**
 * Captures whose reading the faces of the command line must agree on. A tone locked to the sample rate (1 kHz at 48 kHz: 48 sample phases) does not cover the crossing, so the crossover
 * figures are not given, and every face of the command line says so the same way: the table, the JSON's flags and
 * cautions, and the figures a bias step would store in the logbook. The same stage at 997 Hz gives them (the rule
 * must not catch a tone that is not locked). The measurement truth behind the rule is in MeasurementTruthTest.
 */
class CaptureFacesTest {
    @TempDir Path dir;

    /** One second at 48 kHz of a sine at f, half of full scale, through a mild odd law (a cubic and a small dead zone). */
    private Path tone(String name, double f) throws Exception {
        int fs = 48000;
        double[] y = new double[fs];
        for (int i = 0; i < fs; i++) {
            double x = 0.5 * Math.sin(2 * Math.PI * f * i / fs + 0.3);
            y[i] = x - 0.01 * x * x * x - 0.002 * Math.tanh(x / 0.01);
        }
        Path p = dir.resolve(name);
        WavWriter.write(p, fs, WavWriter.Encoding.PCM_24, false, y);
        return p;
    }

    @SuppressWarnings("unchecked")
    private static Map<String, Object> json(Path wav) {
        CliRun r = CliRun.of("analyze", "--json", wav.toString());
        assertEquals(0, r.exit(), r.err());
        return (Map<String, Object>) ((List<Object>) ((Map<String, Object>) JsonText.parse(r.out())).get("captures")).get(0);
    }

    @SuppressWarnings("unchecked")
    @Test
    void lockedTone_everyFaceSaysNotGiven_theSameStageAt997Hz_givesTheFigures() throws Exception {
        Path locked = tone("locked-1k.wav", 1000), free = tone("free-997.wav", 997);

        CliRun text = CliRun.of("analyze", locked.toString());
        assertEquals(0, text.exit(), text.err());
        assertTrue(text.out().contains("crossover     not given: the samples near zero do not cover the crossing"), text.out());
        assertFalse(text.out().contains("gain at zero"), text.out());
        assertTrue(text.err().contains("no crossover figures"), text.err());

        Map<String, Object> j = json(locked);
        assertEquals(false, j.get("crossover_given"));
        assertEquals(false, ((Map<String, Object>) j.get("crossover")).get("crossing_observed"));
        assertTrue(((List<Object>) j.get("cautions")).stream().anyMatch(c -> c.toString().contains("do not cover the crossing")), j.get("cautions").toString());

        Measurement m = Analyzer.analyze(readMono(locked), 48000, SampleUnit.FULL_SCALE);
        assertTrue(LogbookPipelineMeasurer.figures(m).gainAtZero().isEmpty(), "a bias step stores no gain at zero");

        CliRun freeText = CliRun.of("analyze", free.toString());
        assertTrue(freeText.out().contains("crossover     gain at zero"), freeText.out());
        Map<String, Object> f = json(free);
        assertEquals(true, f.get("crossover_given"));
        assertEquals(true, ((Map<String, Object>) f.get("crossover")).get("crossing_observed"));
        Measurement mf = Analyzer.analyze(readMono(free), 48000, SampleUnit.FULL_SCALE);
        assertTrue(LogbookPipelineMeasurer.figures(mf).gainAtZero().isPresent());
    }

    /**
     * The input-shorted sample capture read without its calibration is a noise capture (Analyzer's full-scale rule),
     * and its levels are in dBFS as AES17 defines it: re the rms of a full-scale sine, 20·lg(rms·√2) for a capture
     * whose 1.0 is the full-scale peak.
     */
    @SuppressWarnings("unchecked")
    @Test
    void uncalibratedNoiseCapture_isNoise_inDbfsAfterAes17() {
        Path shorted = Path.of(System.getProperty("outstage.project.dir", ".")).resolve("sample-captures/da60-noise-input-shorted.wav");
        CliRun text = CliRun.of("analyze", shorted.toString());
        assertEquals(0, text.exit(), text.err());
        assertTrue(text.out().contains("not a test tone (noise capture)"), text.out());
        Map<String, Object> noise = (Map<String, Object>) json(shorted).get("noise");
        double rms = (Double) noise.get("rms");
        assertEquals(20 * Math.log10(rms * Math.sqrt(2)), (Double) noise.get("dbfs"), 1e-9);
        assertEquals(null, noise.get("dbv"));
        assertTrue(text.out().contains(String.format(java.util.Locale.ROOT, "(%.1f dBFS)", 20 * Math.log10(rms * Math.sqrt(2)))), text.out());
    }

    private static double[] readMono(Path wav) throws Exception {
        var c = org.outstage.capture.CaptureReader.open(wav, org.outstage.capture.CaptureOptions.none());
        return c.readChannel(0, (int) c.frameCount());
    }
}
