package org.outstage.report;

import java.time.Instant;
import java.util.List;
import java.util.Locale;
import org.outstage.logbook.BiasAdvice;
import org.outstage.logbook.BiasStep;
import org.outstage.logbook.DriftReport;
import org.outstage.logbook.SessionData;
import org.outstage.verify.KeyFigures;

/** A bias session as one self-contained HTML page: steps, trend charts, advice, drift, cautions; prints cleanly. */
public final class HtmlSessionReport {
    private HtmlSessionReport() {}

    public static String render(SessionData d, BiasAdvice advice, DriftReport drift, List<String> charts, Instant generatedAt,
                                String programVersion) {
        StringBuilder h = new StringBuilder(16_384);
        String title = "Bias session " + d.session().id() + " of " + d.unit().name();
        h.append("<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n");
        h.append("<title>").append(HtmlReport.esc(title)).append("</title>\n<style>\n").append(HtmlReport.CSS).append("</style>\n</head>\n<body>\n");
        h.append("<h1>").append(HtmlReport.esc(title)).append("</h1>\n");
        h.append("<p class=\"sub\">").append(HtmlReport.esc(d.session().kind().label() + ", started " + d.session().startedAt()
                + d.session().endedAt().map(e -> ", ended " + e).orElse(" (open)"))).append("</p>\n");
        h.append("<h2>Advice</h2>\n<p><strong>").append(HtmlReport.esc(advice.direction().name().toLowerCase(Locale.ROOT))).append("</strong>: ")
                .append(HtmlReport.esc(advice.text())).append("</p>\n");
        if (!advice.warnings().isEmpty()) {
            h.append("<ul>\n");
            for (String w : advice.warnings()) h.append("<li>").append(HtmlReport.esc(w)).append("</li>\n");
            h.append("</ul>\n");
        }
        h.append("<p>Drift: ").append(HtmlReport.esc(drift.text())).append("</p>\n");
        if (!charts.isEmpty()) {
            h.append("<h2>Trend</h2>\n");
            for (String svg : charts) h.append("<figure>").append(svg).append("</figure>\n");
        }
        h.append("<h2>Steps</h2>\n<table>\n<thead><tr><th class=\"num\">Step</th><th>Time</th><th class=\"num\">Reading</th><th class=\"num\">Heatsink</th>"
                + "<th class=\"num\">Crossover ratio</th><th class=\"num\">Gain at zero</th><th>Crossover</th><th class=\"num\">THD</th><th class=\"num\">THD+N</th><th>Capture</th></tr></thead>\n<tbody>\n");
        for (BiasStep s : d.steps()) {
            h.append("<tr><td class=\"num\">").append(s.seq()).append("</td><td>").append(HtmlReport.esc(s.takenAt().toString())).append("</td>");
            h.append("<td class=\"num\">").append(HtmlReport.esc(s.reading().toString())).append("</td>");
            h.append("<td class=\"num\">").append(s.heatsinkCelsius().isPresent() ? HtmlReport.num(s.heatsinkCelsius().getAsDouble()) + " °C" : "—").append("</td>");
            if (s.measurement().isPresent()) {
                KeyFigures f = s.measurement().get().figures();
                h.append("<td class=\"num\">").append(f.crossoverReading().isPresent() ? String.format(Locale.ROOT, "%.4f", f.crossoverReading().getAsDouble()) : "—")
                        .append("</td>");
                h.append("<td class=\"num\">").append(f.gainAtZero().isPresent() ? String.format(Locale.ROOT, "%.4f", f.gainAtZero().getAsDouble()) : "—")
                        .append("</td><td>").append(HtmlReport.esc(f.crossoverVerdict().orElse("—"))).append("</td>");
                h.append("<td class=\"num\">").append(HtmlReport.num(f.thdRatio() * 100)).append(" %</td><td class=\"num\">")
                        .append(HtmlReport.num(f.thdNRatio() * 100)).append(" %</td>");
                h.append("<td>").append(HtmlReport.esc(s.measurement().get().capture().map(c -> c.fileName()).orElse("—"))).append("</td>");
            } else {
                h.append("<td class=\"num\">—</td><td class=\"num\">—</td><td>—</td><td class=\"num\">—</td><td class=\"num\">—</td><td>—</td>");
            }
            h.append("</tr>\n");
        }
        h.append("</tbody>\n</table>\n");
        h.append("<h2>Cautions</h2>\n<div class=\"cautions\"><ul>\n");
        for (String c : ReportDocument.CAUTIONS) h.append("<li>").append(HtmlReport.esc(c)).append("</li>\n");
        h.append("</ul></div>\n<footer>Made by ").append(HtmlReport.esc(programVersion)).append(" on ").append(HtmlReport.esc(generatedAt.toString()))
                .append(".</footer>\n</body>\n</html>\n");
        return h.toString();
    }
}
