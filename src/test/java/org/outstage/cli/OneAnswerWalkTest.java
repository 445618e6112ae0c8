package org.outstage.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.outstage.capture.WavWriter;
import org.outstage.json.JsonText;

/** Issue 11 ("one answer everywhere"): a channel's role and the level series, the same in every command. */
class OneAnswerWalkTest {
    @TempDir Path dir;

    static final Path SAMPLES = Path.of(System.getProperty("outstage.project.dir", "."), "sample-captures");

    /** A stereo WAV: channel 1 a 1 kHz generator sine at 0.1 of full scale, channel 2 the "amplifier" at 0.5. */
    private Path generatorAndOutput(Path folder) throws Exception {
        int fs = 48000;
        double[] gen = new double[fs], amp = new double[fs];
        for (int i = 0; i < fs; i++) {
            double s = Math.sin(2 * Math.PI * 1000 * i / fs);
            gen[i] = 0.1 * s;
            amp[i] = 0.5 * s;
        }
        Path p = folder.resolve("gen-and-amp.wav");
        WavWriter.write(p, fs, WavWriter.Encoding.FLOAT_32, false, gen, amp);
        return p;
    }

    /**
     * The generator channel is the amplifier's input, not an output: it has no output power, no verdict and is not
     * one side of a channel balance (the spec's balance is between amplifier outputs: docs/spec-format.md). The
     * role comes from bench.txt ({@code reference=1}) or from the options ({@code --roles generator,output}).
     */
    @SuppressWarnings("unchecked")
    @Test
    void finding3_generatorChannelHasNoPower() throws Exception {
        // the bundled stereo file: bench.txt says reference=1, no option says anything about roles
        Path xy = SAMPLES.resolve("da60-xy-gen-ch1-amp-ch2-10mV-20W.wav");
        CliRun text = CliRun.of("analyze", "--fs-volts", "40", "--load", "8", xy.toString());
        assertEquals(0, text.exit(), text.err());
        assertTrue(text.out().contains("channel 1  generator (reference)"), text.out());
        assertFalse(text.out().contains("channel 1  48000 Hz"), "channel 1 measured as an output:\n" + text.out());
        CliRun json = CliRun.of("analyze", "--json", "--fs-volts", "40", "--load", "8", xy.toString());
        List<Object> caps = (List<Object>) ((Map<String, Object>) JsonText.parse(json.out())).get("captures");
        assertEquals(1, caps.size());
        assertEquals(2.0, ((Map<String, Object>) caps.get(0)).get("channel"));

        // verify: balance only between output channels. Roles from the options, then from bench.txt.
        Path spec = dir.resolve("balance.spec");
        Files.writeString(spec, "name demo\nbalance <= 0.5 dB at 1 kHz\n");
        Path plain = Files.createDirectories(dir.resolve("plain"));
        Path wav = generatorAndOutput(plain);
        CliRun unroled = CliRun.of("verify", "--spec", spec.toString(), "--no-log", "--json", "--fs-volts", "40", wav.toString());
        // without a role every channel is an output: 20·lg(0.1/0.5) = 13.98 dB, a FAIL (the behaviour the roles fix)
        assertEquals(1, unroled.exit(), unroled.err());
        CliRun roled = CliRun.of("verify", "--spec", spec.toString(), "--no-log", "--json", "--fs-volts", "40", "--roles", "generator,output",
                "--allow-unmeasured", wav.toString());
        assertEquals(0, roled.exit(), roled.err());
        Map<String, Object> limit = ((List<Map<String, Object>>) ((Map<String, Object>) JsonText.parse(roled.out())).get("limits")).get(0);
        assertEquals("not-measured", limit.get("verdict"), roled.out());
        Path noted = Files.createDirectories(dir.resolve("noted"));
        Path wav2 = generatorAndOutput(noted);
        Files.writeString(noted.resolve("bench.txt"), "gen-*.wav  reference=1\n");
        CliRun fromNotes = CliRun.of("verify", "--spec", spec.toString(), "--no-log", "--json", "--fs-volts", "40", "--allow-unmeasured", wav2.toString());
        assertEquals(0, fromNotes.exit(), fromNotes.err());
        limit = ((List<Map<String, Object>>) ((Map<String, Object>) JsonText.parse(fromNotes.out())).get("limits")).get(0);
        assertEquals("not-measured", limit.get("verdict"), fromNotes.out());
    }

    /**
     * verify --report over the whole sample folder (level series, bias series, scope export, stereo X-Y file, and the
     * seven spec-sheet captures: IMD, noise, sweep, crosstalk, open circuit): the
     * THD-against-power chart holds only the named series of bench.txt ({@code series=level}: the seven
     * da60-level files), so one THD line of 7 markers and one THD+N line of 7; and the shared series function gives
     * the same power at 1 % THD as {@code sweep} over the same files.
     */
    @Test
    void finding4_levelSweepDrawsOnlyNamedSeries() throws Exception {
        List<String> files = new ArrayList<>();
        try (var s = Files.list(SAMPLES)) {
            s.map(Path::toString).filter(n -> n.endsWith(".wav") || n.endsWith(".csv")).sorted().forEach(files::add);
        }
        assertEquals(19, files.size());
        Path html = dir.resolve("report.html");
        List<String> args = new ArrayList<>(List.of("verify", "--spec", SAMPLES.resolve("spec/da-60.spec").toString(), "--no-log",
                "--fs-volts", "40", "--load", "8", "--report", html.toString()));
        args.addAll(files);
        CliRun v = CliRun.of(args.toArray(String[]::new));
        assertTrue(v.exit() == 0 || v.exit() == 1, v.err());
        String report = Files.readString(html);
        int start = report.indexOf("Distortion against output power");
        assertTrue(start > 0, "no level-sweep chart");
        String svg = report.substring(start, report.indexOf("</svg>", start));
        List<Integer> markerGroups = new ArrayList<>();
        Matcher g = Pattern.compile("<g fill=\"[^\"]+\" stroke=\"none\">((?:<circle[^>]*/>)*)</g>").matcher(svg);
        while (g.find()) markerGroups.add(g.group(1).split("<circle", -1).length - 1);
        assertEquals(List.of(7, 7), markerGroups, "THD and THD+N markers of the one named series");

        List<String> level = files.stream().filter(f -> f.contains("da60-level-")).toList();
        List<String> sw = new ArrayList<>(List.of("sweep", "--fs-volts", "40", "--load", "8"));
        sw.addAll(level);
        CliRun sweep = CliRun.of(sw.toArray(String[]::new));
        assertEquals(0, sweep.exit(), sweep.err());
        Matcher m = Pattern.compile("power at 1 % THD : ([0-9.]+) W").matcher(sweep.out());
        assertTrue(m.find(), sweep.out());
        CliRun bench = CliRun.of("bench", SAMPLES.toString(), "--out", dir.resolve("bench").toString());
        assertTrue(bench.out().contains("level series \"level\""), bench.out());
        Matcher b = Pattern.compile("power at 1 % THD : ([0-9.]+) W").matcher(bench.out());
        assertTrue(b.find(), bench.out());
        assertEquals(m.group(1), b.group(1), "bench's named series and sweep give one answer");
    }

    /**
     * Figures no audio amplifier bench can produce are flagged, with the limits of {@link org.outstage.analysis.Plausibility}
     * (300 V rms, 20 kW: common practice, from memory, the largest audio amplifiers give some 10 kW, i.e. 283 V rms
     * into 8 Ω). A 70 W capture read with --fs-volts 4000 instead of 40 reads 100 × 23.3 V ≈ 2330 V rms; --load
     * without a calibration says why there is no power; the 4-cycle scope export gets no crossover figures.
     */
    @Test
    void finding10_implausibleFiguresAreFlagged() {
        CliRun big = CliRun.of("analyze", "--fs-volts", "4000", "--load", "8", SAMPLES.resolve("da60-level-070W.wav").toString());
        assertEquals(0, big.exit(), big.err());
        assertTrue(big.err().contains("V rms is beyond any audio amplifier (above 300 V rms)"), big.err());
        assertTrue(big.err().contains("W is beyond any audio amplifier (above 20000 W)"), big.err());
        CliRun sane = CliRun.of("analyze", "--fs-volts", "40", "--load", "8", SAMPLES.resolve("da60-level-070W.wav").toString());
        assertFalse(sane.err().contains("beyond any audio amplifier"), sane.err());

        CliRun uncal = CliRun.of("analyze", "--load", "8", SAMPLES.resolve("da60-level-001W.wav").toString());
        assertEquals(0, uncal.exit(), uncal.err());
        assertFalse(uncal.out().contains("  power "), uncal.out());
        assertTrue(uncal.err().contains("no output power although a 8 ohm load was given: the capture is in FS"), uncal.err());

        // 4000 points at 1 µs of a 997 Hz tone: 3.988 cycles
        CliRun scope = CliRun.of("analyze", "--load", "8", SAMPLES.resolve("da60-scope-70W-clipping.csv").toString());
        assertEquals(0, scope.exit(), scope.err());
        assertTrue(scope.out().contains("crossover     not given: the record spans 4.0 cycles; at least 10 are needed"), scope.out());
        assertFalse(scope.out().contains("notch width"), scope.out());
        assertTrue(scope.out().indexOf("  clipping ") < scope.out().indexOf("  crossover "), "clipping is said first:\n" + scope.out());
    }

    /**
     * The bench report of the sample folder: the clipping captures' sections say clipping first and never call it
     * "memory"; the 4-cycle scope export gets no crossover reading and no transfer chart; the report is dated.
     */
    @Test
    void finding13_clippingSectionsSayClippingFirst() throws Exception {
        CliRun bench = CliRun.of("bench", SAMPLES.toString(), "--out", dir.resolve("b").toString());
        String html = Files.readString(dir.resolve("b").resolve("report.html"));
        assertFalse(html.contains("(memory)"), "clipping or hysteresis called memory");
        assertTrue(Pattern.compile("analysed with Outstage [^<]* on \\d{4}-\\d{2}-\\d{2} \\d{2}:\\d{2}:\\d{2} UTC").matcher(html).find(), "dated");
        for (String f : List.of("da60-scope-70W-clipping.csv", "da60-level-070W.wav")) {
            int at = html.indexOf("<h2>" + f);
            assertTrue(at > 0, f);
            int end = html.indexOf("<h2>", at + 4);
            String section = html.substring(at, end < 0 ? html.length() : end);
            assertTrue(section.indexOf("Clipping:") >= 0 && section.indexOf("Clipping:") < section.indexOf("Crossover:"), section);
        }
        int at = html.indexOf("<h2>da60-scope-70W-clipping.csv");
        int end = html.indexOf("<h2>", at + 4);
        String scope = html.substring(at, end < 0 ? html.length() : end);
        assertTrue(scope.contains("Crossover: not given: the record spans 4.0 cycles"), scope);
        assertFalse(scope.contains("incremental gain against output"), "no transfer chart for 4 cycles");
    }
}
