package org.outstage.report;

import java.util.Locale;
import java.util.OptionalDouble;
import org.outstage.verify.KeyFigures;
import org.outstage.verify.LimitResult;
import org.outstage.verify.MeasuredChannel;

/**
 * One self-contained HTML file: inline CSS (with a print stylesheet, so a browser prints it cleanly to PDF),
 * inline SVG charts when there are any, no scripts, no external resources.
 */
public final class HtmlReport {
    private HtmlReport() {}

    static final String CSS = """
            :root { --ink: #1d232a; --muted: #5b6570; --line: #d5dbe1; --pass: #1f7a3a; --fail: #b3261e; --nm: #8a6d00; }
            * { box-sizing: border-box; }
            body { font: 14px/1.45 system-ui, -apple-system, "Segoe UI", sans-serif; color: var(--ink); margin: 2rem auto; max-width: 62rem; padding: 0 1rem; }
            h1 { font-size: 1.6rem; margin: 0 0 .2rem; } h2 { font-size: 1.15rem; margin: 2rem 0 .6rem; border-bottom: 1px solid var(--line); padding-bottom: .2rem; }
            .sub { color: var(--muted); margin: 0 0 1rem; }
            .outcome { display: inline-block; padding: .3rem .8rem; border-radius: .3rem; font-weight: 700; color: #fff; }
            .outcome.pass { background: var(--pass); } .outcome.fail { background: var(--fail); } .outcome.incomplete { background: var(--nm); }
            table { border-collapse: collapse; width: 100%; margin: .4rem 0; }
            th, td { text-align: left; padding: .3rem .5rem; border-bottom: 1px solid var(--line); vertical-align: top; }
            th { font-weight: 600; color: var(--muted); font-size: .85rem; }
            td.num { text-align: right; font-variant-numeric: tabular-nums; white-space: nowrap; }
            .v-pass { color: var(--pass); font-weight: 700; } .v-fail { color: var(--fail); font-weight: 700; } .v-not-measured { color: var(--nm); font-weight: 700; }
            .evidence { color: var(--muted); font-size: .85rem; }
            dl { display: grid; grid-template-columns: max-content 1fr; gap: .2rem 1rem; } dt { color: var(--muted); } dd { margin: 0; }
            .cautions { background: #fff8e5; border-left: 4px solid var(--nm); padding: .6rem 1rem; }
            .warn { color: var(--nm); }
            .cautions li { margin: .2rem 0; }
            figure { margin: 1rem 0; } figure svg { max-width: 100%; height: auto; }
            footer { margin-top: 2rem; color: var(--muted); font-size: .8rem; }
            @media print {
              body { margin: 0; max-width: none; font-size: 10.5pt; }
              h2 { break-after: avoid; } table, figure, .cautions { break-inside: avoid; }
              .outcome { border: 1px solid #000; color: #000 !important; background: none !important; }
              a { color: inherit; text-decoration: none; }
              @page { margin: 15mm; }
            }
            """;

    public static String render(ReportDocument d) {
        StringBuilder h = new StringBuilder(16_384);
        String title = d.unit().name().equals(d.result().spec().name()) ? "Verification of " + d.unit().name()
                : "Verification of " + d.unit().name() + " against " + d.result().spec().name();
        h.append("<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n");
        h.append("<title>").append(esc(title)).append("</title>\n<style>\n").append(CSS).append("</style>\n</head>\n<body>\n");
        h.append("<h1>").append(esc(title)).append("</h1>\n");
        h.append("<p class=\"sub\">").append(esc(d.result().summary())).append("</p>\n");
        h.append("<p><span class=\"outcome ").append(d.outcome()).append("\">").append(d.outcome().toUpperCase(Locale.ROOT)).append("</span></p>\n");

        h.append("<h2>Unit and session</h2>\n<dl>\n");
        dd(h, "Unit", d.unit().name());
        d.unit().serial().ifPresent(s -> dd(h, "Serial", s));
        d.unit().topology().ifPresent(s -> dd(h, "Output stage", s));
        d.unit().ratedPowerWatts().ifPresent(p -> dd(h, "Rated power", num(p) + " W"));
        d.unit().ratedLoadOhms().ifPresent(r -> dd(h, "Rated load", num(r) + " Ω"));
        d.session().ifPresent(s -> {
            dd(h, "Logbook session", s.id() + " (" + s.kind().label() + ")");
            dd(h, "Started", when(s.startedAt()));
            s.endedAt().ifPresent(e -> dd(h, "Ended", when(e)));
        });
        dd(h, "Specification", d.result().spec().name() + " (" + d.result().spec().source() + ")");
        h.append("</dl>\n");

        h.append("<h2>Limits</h2>\n<table>\n<thead><tr><th>Line</th><th>Limit</th><th class=\"num\">Measured</th><th class=\"num\">Margin</th><th>Verdict</th></tr></thead>\n<tbody>\n");
        for (LimitResult r : d.result().results()) {
            String unit = r.limit().displayUnit();
            String v = r.verdict().name().toLowerCase(Locale.ROOT).replace('_', '-');
            h.append("<tr><td class=\"num\">").append(r.limit().line()).append("</td><td>").append(esc(r.limit().text()))
                    .append("<div class=\"evidence\">").append(esc(r.evidence())).append("</div></td>");
            h.append("<td class=\"num\">").append(r.measured().isPresent() ? esc(num(r.limit().toDisplay(r.measured().getAsDouble())) + " " + unit) : "—")
                    .append("</td><td class=\"num\">").append(r.margin().isPresent() ? esc(signed(r.margin().getAsDouble()) + " " + unit) : "—")
                    .append("</td><td class=\"v-").append(v).append("\">").append(v.replace('-', ' ')).append("</td></tr>\n");
        }
        h.append("</tbody>\n</table>\n");

        h.append("<h2>Figures</h2>\n<table>\n<thead><tr><th>Capture</th><th class=\"num\">Ch</th><th class=\"num\">Frequency</th><th class=\"num\">Level</th>"
                + "<th class=\"num\">Power</th><th class=\"num\">THD</th><th class=\"num\">THD+N</th><th class=\"num\">Gain at zero</th><th>Crossover</th>"
                + "<th class=\"num\">Clip asym.</th></tr></thead>\n<tbody>\n");
        for (MeasuredChannel c : d.channels()) {
            KeyFigures f = c.figures();
            h.append("<tr><td>").append(esc(c.captureName())).append("</td><td class=\"num\">").append(c.channel()).append("</td>");
            cell(h, num(f.fundamentalHz()) + " Hz");
            cell(h, num(f.fundamentalRms()) + " " + f.unit() + " rms");
            cell(h, opt(f.powerWatts(), 1, " W"));
            cell(h, num(f.thdRatio() * 100) + " %");
            cell(h, num(f.thdNRatio() * 100) + " %");
            cell(h, f.gainAtZero().isPresent() ? String.format(Locale.ROOT, "%.4f", f.gainAtZero().getAsDouble()) : "—");
            h.append("<td>").append(esc(f.crossoverVerdict().orElse("—"))).append("</td>");
            cell(h, opt(f.clipAsymmetryRatio(), 100, " %"));
            h.append("</tr>\n");
        }
        h.append("</tbody>\n</table>\n");

        if (!d.charts().isEmpty()) {
            h.append("<h2>Charts</h2>\n");
            for (String svg : d.charts()) h.append("<figure>").append(svg).append("</figure>\n");
        }

        h.append("<h2>Cautions</h2>\n<div class=\"cautions\"><ul>\n");
        for (String c : ReportDocument.CAUTIONS) h.append("<li>").append(esc(c)).append("</li>\n");
        h.append("</ul></div>\n");
        h.append("<footer>Made by ").append(esc(d.programVersion())).append(" on ").append(esc(when(d.generatedAt())))
                .append(". Measured values are in the units of the specification; margin is positive when a limit is met.</footer>\n");
        h.append("</body>\n</html>\n");
        return h.toString();
    }

    private static void dd(StringBuilder h, String k, String v) {
        h.append("<dt>").append(esc(k)).append("</dt><dd>").append(esc(v)).append("</dd>\n");
    }

    private static void cell(StringBuilder h, String text) {
        h.append("<td class=\"num\">").append(esc(text)).append("</td>");
    }

    private static String opt(OptionalDouble v, double factor, String unit) {
        return v.isPresent() ? num(v.getAsDouble() * factor) + unit : "—";
    }

    static String num(double v) {
        if (v == 0) return "0";
        double a = Math.abs(v);
        if (a >= 1e-3 && a < 1e6) {
            String s = String.format(Locale.ROOT, "%.4g", v);
            if (s.contains(".") && !s.contains("e")) s = s.replaceAll("0+$", "").replaceAll("\\.$", "");
            return s;
        }
        return String.format(Locale.ROOT, "%.3e", v);
    }

    static String signed(double v) { return (v > 0 ? "+" : "") + num(v); }

    static String esc(String s) {
        StringBuilder b = new StringBuilder(s.length());
        for (char c : s.toCharArray()) {
            switch (c) {
                case '<' -> b.append("&lt;");
                case '>' -> b.append("&gt;");
                case '&' -> b.append("&amp;");
                case '"' -> b.append("&quot;");
                default -> b.append(c);
            }
        }
        return b.toString();
    }

    /** A report's time stamp for a reader: UTC to the second, no fraction ("2026-12-04 09:26:02 UTC"). */
    public static String when(java.time.Instant t) {
        return java.time.format.DateTimeFormatter.ofPattern("yyyy-MM-dd HH:mm:ss 'UTC'", java.util.Locale.ROOT)
                .withZone(java.time.ZoneOffset.UTC).format(t);
    }
}
