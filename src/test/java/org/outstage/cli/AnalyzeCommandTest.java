package org.outstage.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.outstage.capture.WavWriter;
import org.outstage.json.JsonText;

class AnalyzeCommandTest {
    @TempDir Path dir;

    /**
     * y = x + a3·x³ driven by x = A·cos: H3 = a3·A³/4, H1 = A + 3a3·A³/4 (Chebyshev expansion,
     * docs/references.md §6.4), so THD = (a3A²/4)/(1 + 3a3A²/4). Calibrated with --fs-volts 40 into 8 Ω.
     */
    private Path cubicWav(String name, double amplitude, double a3) throws Exception {
        double fs = 48000, f = 997;
        int n = 96000;
        double[] y = new double[n];
        for (int i = 0; i < n; i++) {
            double x = amplitude * Math.cos(2 * Math.PI * f * i / fs);
            y[i] = x + a3 * x * x * x;
        }
        Path p = dir.resolve(name);
        WavWriter.write(p, (int) fs, WavWriter.Encoding.FLOAT_64, false, y);
        return p;
    }

    @Test
    @SuppressWarnings("unchecked")
    void cubicLaw_jsonContractCarriesChebyshevThd() throws Exception {
        double a = 0.5, a3 = 0.04;
        Path wav = cubicWav("cubic.wav", a, a3);
        CliRun r = CliRun.of("analyze", "--json", "--fs-volts", "40", "--load", "8", wav.toString());
        assertEquals(0, r.exit(), r.err());
        Map<String, Object> root = (Map<String, Object>) JsonText.parse(r.out());
        List<Object> caps = (List<Object>) root.get("captures");
        assertEquals(1, caps.size());
        Map<String, Object> c = (Map<String, Object>) caps.get(0);
        // the keys the issue states as a contract
        for (String k : List.of("file", "channel", "sample_rate_hz", "unit", "fundamental", "thd", "thd_n", "harmonics", "crossover", "clipping"))
            assertTrue(c.containsKey(k), "missing key " + k);
        assertEquals(wav.toString(), c.get("file"));
        assertEquals(1.0, c.get("channel"));
        assertEquals(48000.0, c.get("sample_rate_hz"));
        assertEquals("V", c.get("unit"));
        double expectedThd = (a3 * a * a / 4) / (1 + 3 * a3 * a * a / 4); // Chebyshev, docs/references.md §6.4
        Map<String, Object> thd = (Map<String, Object>) c.get("thd");
        assertEquals(expectedThd, (Double) thd.get("ratio"), 1e-6 * expectedThd);
        assertEquals(100 * expectedThd, (Double) thd.get("percent"), 1e-4 * expectedThd);
        assertEquals(20 * Math.log10(expectedThd), (Double) thd.get("db"), 1e-3);
        Map<String, Object> fund = (Map<String, Object>) c.get("fundamental");
        double h1 = (a + 0.75 * a3 * a * a * a) * 40 / Math.sqrt(2);
        assertEquals(h1, (Double) fund.get("rms"), 1e-6 * h1);
        assertEquals(997.0, (Double) fund.get("frequency_hz"), 1e-6);
        Map<String, Object> thdN = (Map<String, Object>) c.get("thd_n");
        assertEquals(List.of(20.0, 20000.0), thdN.get("bandwidth_hz"));
        assertEquals("none", thdN.get("weighting"));
        List<Object> hs = (List<Object>) c.get("harmonics");
        Map<String, Object> h3 = (Map<String, Object>) hs.get(1);
        assertEquals(3.0, h3.get("order"));
        for (String k : List.of("order", "frequency_hz", "rms", "dbc", "phase_deg")) assertTrue(h3.containsKey(k), k);
        assertTrue(((Map<String, Object>) c.get("crossover")).containsKey("gain_at_zero"));
        for (String k : List.of("detected", "positive_level", "negative_level", "asymmetry_percent"))
            assertTrue(((Map<String, Object>) c.get("clipping")).containsKey(k), k);
    }

    @Test
    void defaultOutput_isReadableTable() throws Exception {
        Path wav = cubicWav("t.wav", 0.5, 0.04);
        CliRun r = CliRun.of("analyze", wav.toString());
        assertEquals(0, r.exit(), r.err());
        assertTrue(r.out().contains("THD "), r.out());
        assertTrue(r.out().contains("unit FS"), r.out());
        assertTrue(r.out().contains("crossover"), r.out());
    }

    @Test
    void csvOutput_oneRowPerChannel() throws Exception {
        Path wav = cubicWav("c.wav", 0.5, 0.04);
        CliRun r = CliRun.of("analyze", "--csv", wav.toString());
        assertEquals(0, r.exit(), r.err());
        String[] lines = r.out().split("\n");
        assertEquals(2, lines.length);
        assertTrue(lines[0].startsWith("file,channel,unit,"));
        assertTrue(lines[1].startsWith(wav + ",1,FS,"));
    }

    @Test
    void missingFile_exits2WithOneLine() {
        CliRun r = CliRun.of("analyze", dir.resolve("nope.wav").toString());
        assertEquals(2, r.exit());
        assertEquals("outstage: " + dir.resolve("nope.wav") + ": no such file", r.err().strip());
        assertEquals("", r.out());
    }

    @Test
    void malformedWav_exits2NamingFileAndOffset() throws Exception {
        Path bad = dir.resolve("bad.wav");
        Files.write(bad, "RIFF\u0004\u0000\u0000\u0000WAVE".getBytes(java.nio.charset.StandardCharsets.ISO_8859_1));
        CliRun r = CliRun.of("analyze", bad.toString());
        assertEquals(2, r.exit());
        String line = r.err().strip();
        assertFalse(line.contains("\n"), line);
        assertTrue(line.startsWith("outstage: "), line);
        assertTrue(line.contains("bad.wav: byte "), line);
        assertFalse(line.contains("Exception"), line);
    }

    @Test
    void badOptionValues_exit2() throws Exception {
        Path wav = cubicWav("o.wav", 0.5, 0.04);
        assertEquals("outstage: --weighting: \"B\" must be A or none", CliRun.of("analyze", "--weighting", "B", wav.toString()).err().strip());
        assertEquals(2, CliRun.of("analyze", "--bandwidth", "20-abc", wav.toString()).exit());
        assertEquals(2, CliRun.of("analyze", "--json", "--csv", wav.toString()).exit());
        assertEquals(2, CliRun.of("analyze", "--channel", "3", wav.toString()).exit());
        assertEquals(2, CliRun.of("analyze").exit());
        assertEquals(2, CliRun.of("analyze", "--no-such-option", wav.toString()).exit());
    }

    @Test
    void residualExport_writesAlignedColumns() throws Exception {
        Path wav = cubicWav("r.wav", 0.5, 0.04);
        Path csv = dir.resolve("out/residual.csv");
        CliRun r = CliRun.of("analyze", "--residual", csv.toString(), wav.toString());
        assertEquals(0, r.exit(), r.err());
        List<String> lines = Files.readAllLines(csv);
        assertEquals(96000 + 1, lines.size());
        String[] first = lines.get(1).split(",");
        double out = Double.parseDouble(first[1]), fund = Double.parseDouble(first[2]), res = Double.parseDouble(first[3]);
        // residual = output − fitted fundamental − DC (DC is 0 here: odd law)
        assertEquals(out - fund, res, 1e-9);
        // x = 0.5 at t = 0: output 0.5 + 0.04·0.125 = 0.505 (the law itself)
        assertEquals(0.505, out, 1e-7);
    }
}
