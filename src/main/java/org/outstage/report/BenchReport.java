package org.outstage.report;

import java.io.IOException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Optional;
import org.outstage.analysis.Analyzer;
import org.outstage.analysis.Measurement;
import org.outstage.analysis.stage.LevelSweepResult;
import org.outstage.analysis.stage.Residual;
import org.outstage.analysis.stage.StageAnalyzer;
import org.outstage.analysis.stage.StageDiagnosis;
import org.outstage.analysis.stage.StageSettings;
import org.outstage.json.JsonText;
import org.outstage.plot.ChartSpec;
import org.outstage.plot.MeasurementCharts;

/**
 * The report of a bench folder: one self-contained HTML file (inline CSS with a print stylesheet, inline SVG
 * charts drawn from the same {@code plot} descriptions as the workbench, the cautions) and its JSON twin. Both
 * files are written to a temporary name and moved into place, so a reader never sees half a report.
 */
public final class BenchReport {
    private BenchReport() {}

    static final int CHART_WIDTH = 760, CHART_HEIGHT = 300;

    /** One analysed capture. */
    public record Capture(String file, org.outstage.capture.Capture capture, List<Measurement> measurements) {}

    /** Where the report went. */
    public record Written(Path html, Path json) {}

    public static Written write(Path dir, String folder, List<Capture> captures, Map<String, LevelSweepResult> sweeps,
                                List<String> failures) throws IOException {
        return write(dir, folder, captures, sweeps, failures, java.time.Instant.now());
    }

    /** As {@link #write(Path, String, List, Map, List)}, stamped with {@code generatedAt}. */
    public static Written write(Path dir, String folder, List<Capture> captures, Map<String, LevelSweepResult> sweeps,
                                List<String> failures, java.time.Instant generatedAt) throws IOException {
        Path html = dir.resolve("report.html"), json = dir.resolve("report.json");
        AtomicFile.write(html, html(folder, captures, sweeps, failures, generatedAt));
        Map<String, Object> j = new java.util.LinkedHashMap<>(json(folder, captures, sweeps, failures));
        j.put("generated_at", HtmlReport.when(generatedAt));
        AtomicFile.write(json, JsonText.pretty(j) + "\n");
        return new Written(html, json);
    }

    static Map<String, Object> json(String folder, List<Capture> captures, Map<String, LevelSweepResult> sweeps, List<String> failures) {
        List<Object> caps = new ArrayList<>();
        for (Capture c : captures)
            for (Measurement m : c.measurements()) caps.add(MeasurementJson.capture(c.file(), m, c.capture().warnings()));
        Map<String, Object> series = new java.util.LinkedHashMap<>();
        sweeps.forEach((k, v) -> series.put(k, SweepJson.of(v)));
        return JsonText.obj("folder", folder, "captures", caps, "series", series, "failures", failures,
                "cautions", ReportDocument.CAUTIONS);
    }

    static String html(String folder, List<Capture> captures, Map<String, LevelSweepResult> sweeps, List<String> failures) {
        return html(folder, captures, sweeps, failures, java.time.Instant.now());
    }

    static String html(String folder, List<Capture> captures, Map<String, LevelSweepResult> sweeps, List<String> failures,
                       java.time.Instant generatedAt) {
        StringBuilder h = new StringBuilder(1 << 16);
        String title = "Bench report: " + folder;
        h.append("<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n");
        h.append("<title>").append(HtmlReport.esc(title)).append("</title>\n<style>\n").append(HtmlReport.CSS).append("</style>\n</head>\n<body>\n");
        h.append("<h1>").append(HtmlReport.esc(title)).append("</h1>\n");
        h.append("<p class=\"sub\">").append(captures.size()).append(" capture file(s) analysed with Outstage 0.1.0 on ")
                .append(HtmlReport.esc(HtmlReport.when(generatedAt))).append(".</p>\n");
        h.append("<div class=\"cautions\"><strong>Cautions</strong><ul>\n");
        for (String c : ReportDocument.CAUTIONS) h.append("<li>").append(HtmlReport.esc(c)).append("</li>\n");
        h.append("</ul></div>\n");
        if (!failures.isEmpty()) {
            h.append("<h2>Captures that could not be read</h2>\n<ul>\n");
            for (String f : failures) h.append("<li>").append(HtmlReport.esc(f)).append("</li>\n");
            h.append("</ul>\n");
        }
        h.append("<h2>Figures</h2>\n<table>\n<thead><tr><th>Capture</th><th class=\"num\">Ch</th><th class=\"num\">Frequency</th>"
                + "<th class=\"num\">Level (rms)</th><th class=\"num\">Power</th><th class=\"num\">THD</th><th class=\"num\">THD+N</th>"
                + "<th class=\"num\">Floor</th><th class=\"num\">Gain at zero</th><th>Crossover</th><th>Clipping</th></tr></thead>\n<tbody>\n");
        for (Capture c : captures) for (Measurement m : c.measurements()) row(h, c, m);
        h.append("</tbody>\n</table>\n");
        for (Map.Entry<String, LevelSweepResult> s : sweeps.entrySet()) {
            h.append("<h2>Level series “").append(HtmlReport.esc(s.getKey())).append("”</h2>\n");
            h.append("<p>").append(HtmlReport.esc(s.getValue().atOnePercent().message())).append("<br>")
                    .append(HtmlReport.esc(s.getValue().atTenPercent().message())).append("</p>\n");
            figure(h, MeasurementCharts.levelSweep("THD and THD+N against output power", s.getValue()));
        }
        for (Capture c : captures) for (Measurement m : c.measurements()) section(h, c, m);
        h.append("<footer>Made by Outstage 0.1.0 on ").append(HtmlReport.esc(HtmlReport.when(generatedAt))).append(". Methods and their sources: docs/methods.md and docs/diagnosis.md of the project.</footer>\n");
        h.append("</body>\n</html>\n");
        return h.toString();
    }

    private static void row(StringBuilder h, Capture c, Measurement m) {
        h.append("<tr><td>").append(HtmlReport.esc(Path.of(c.file()).getFileName().toString())).append("</td><td class=\"num\">").append(m.channel()).append("</td>");
        if (!m.measured()) {
            h.append("<td colspan=\"9\">not measured: ").append(HtmlReport.esc(m.notMeasuredReason().get())).append("</td></tr>\n");
            return;
        }
        String u = m.unit();
        if (m.noise().isPresent()) {   // a noise capture: the strongest line is hum, not a test tone (FigureTable.text)
            var n = m.noise().get();
            h.append("<td colspan=\"9\">").append(HtmlReport.esc(String.format(Locale.ROOT,
                    "noise capture: noise %s %s rms, A-weighted %s %s rms, band %s–%s Hz; strongest line %s Hz (%s %s rms) is not a test tone: no distortion, power or stage figures",
                    HtmlReport.num(n.rms()), u, HtmlReport.num(n.rmsA()), u, HtmlReport.num(n.lowHz()), HtmlReport.num(n.highHz()),
                    HtmlReport.num(m.fundamental().frequencyHz()), HtmlReport.num(m.fundamental().rms()), u))).append("</td></tr>\n");
            return;
        }
        cell(h, HtmlReport.num(m.fundamental().frequencyHz()) + " Hz");
        cell(h, HtmlReport.num(m.fundamental().rms()) + " " + u);
        cell(h, m.powerWatts().map(p -> HtmlReport.num(p.totalWatts()) + " W").orElse("—"));
        cell(h, HtmlReport.num(m.thd().percent()) + " %");
        cell(h, HtmlReport.num(m.thdN().percent()) + " %" + (m.thdN().atFloor() ? " (at floor)" : ""));
        cell(h, String.format(Locale.ROOT, "%.1f dB", m.floor().db()));
        if (m.stage() instanceof StageDiagnosis.Measured s) {
            cell(h, String.format(Locale.ROOT, "%.4f", s.crossover().gainAtZero()));
            h.append("<td>").append(s.crossover().verdict().label()).append("</td>");
            h.append("<td>").append(s.clipping().detected() ? "yes" + s.clipping().asymmetryPercent().stream()
                    .mapToObj(a -> String.format(Locale.ROOT, ", asymmetry %.2f %%", a)).findFirst().orElse("") : "no").append("</td>");
        } else {
            h.append("<td class=\"num\">—</td><td>").append(HtmlReport.esc(((StageDiagnosis.NotMeasured) m.stage()).reason())).append("</td><td>—</td>");
        }
        h.append("</tr>\n");
    }

    private static void cell(StringBuilder h, String s) { h.append("<td class=\"num\">").append(HtmlReport.esc(s)).append("</td>"); }

    private static void section(StringBuilder h, Capture c, Measurement m) {
        if (!m.measured()) return;
        String name = Path.of(c.file()).getFileName().toString() + (c.capture().channelCount() > 1 ? " ch " + m.channel() : "");
        h.append("<h2>").append(HtmlReport.esc(name)).append("</h2>\n");
        // the capture's warnings, as the command line and report.json give them (those of another channel left out)
        for (String w : c.capture().warnings())
            if (!w.startsWith("channel ") || w.startsWith("channel " + m.channel() + ":") || w.startsWith("channel " + m.channel() + " "))
                h.append("<p class=\"warn\">Warning: ").append(HtmlReport.esc(w)).append("</p>\n");
        boolean noiseCapture = m.noise().isPresent();   // no test tone: waveform and spectrum only
        boolean crossover = !noiseCapture && org.outstage.analysis.Plausibility.crossoverGiven(m);
        if (!noiseCapture && m.stage() instanceof StageDiagnosis.Measured s) {
            var clip = s.clipping();
            if (clip.detected()) // clipping first: it is what the capture shows before anything about the crossover
                h.append("<p>Clipping: positive ").append(HtmlReport.esc(clip.positive().map(p -> String.format(java.util.Locale.ROOT, "%.2f %s", p.levelVolts(), m.unit())).orElse("none")))
                        .append(", negative ").append(HtmlReport.esc(clip.negative().map(p -> String.format(java.util.Locale.ROOT, "%.2f %s", p.levelVolts(), m.unit())).orElse("none")))
                        .append(", first: ").append(HtmlReport.esc(clip.clipsFirst().label())).append(".</p>\n");
            h.append("<p>").append(HtmlReport.esc(crossover ? "Crossover: " + s.crossover().explanation()
                    : "Crossover: not given: " + org.outstage.analysis.Plausibility.crossoverNotGiven(m).orElseThrow() + "."))
                    .append("</p>\n");
        }
        if (noiseCapture) h.append("<p>Noise capture: the strongest line is hum or noise, not a test tone; its distortion and stage figures are not given.</p>\n");
        else for (String caution : org.outstage.analysis.Plausibility.cautions(m, m.settings().loadOhms()))
            if (crossover || !caution.contains("crossover")) h.append("<p class=\"sub\">Caution: ").append(HtmlReport.esc(caution)).append("</p>\n");
        int span = Analyzer.spanFrames(c.capture());
        double[] x = c.capture().readChannel(m.channel() - 1, span);
        figure(h, MeasurementCharts.waveform(name, m, x, ""));
        Residual r = StageAnalyzer.residual(x, m.sampleRateHz(), m.sineFit(), StageSettings.defaults().withUnit(m.unit()));
        figure(h, MeasurementCharts.residual(name, m, r.samples()));
        MeasurementCharts.spectrum(name, m).ifPresent(sp -> figure(h, sp));
        MeasurementCharts.harmonicProfile(name, m).ifPresent(sp -> figure(h, sp));
        if (crossover) MeasurementCharts.transfer(name, m, Optional.empty(), "").ifPresent(sp -> figure(h, sp));
    }

    private static void figure(StringBuilder h, ChartSpec spec) {
        h.append("<figure>\n").append(SvgRenderer.render(spec, CHART_WIDTH, CHART_HEIGHT)).append("\n</figure>\n");
    }
}
