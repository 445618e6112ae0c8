package org.outstage.cli;

import java.io.PrintWriter;
import java.util.concurrent.Callable;
import org.outstage.json.JsonText;
import org.outstage.logbook.BiasAdvice;
import org.outstage.logbook.BiasAdvisor;
import org.outstage.logbook.BiasStep;
import org.outstage.logbook.DriftAnalysis;
import org.outstage.logbook.DriftReport;
import org.outstage.logbook.Logbook;
import org.outstage.logbook.SessionData;
import org.outstage.logbook.StepPoint;
import org.outstage.report.HtmlSessionReport;
import org.outstage.report.ReportCharts;
import java.time.Instant;
import java.util.List;
import picocli.CommandLine;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

/** {@code session show ID}: the steps, the trend of the crossover figures and THD, the recommendation, the drift. */
@Command(name = "show", mixinStandardHelpOptions = true, description = "Show a session: its steps, the bias recommendation and the drift.")
public final class SessionShowCommand implements Callable<Integer> {
    @CommandLine.Spec CommandLine.Model.CommandSpec spec;
    @Mixin LogbookPathOption logbook;

    @Parameters(index = "0", paramLabel = "ID", converter = Units.SessionId.class, description = "Session id.")
    long sessionId;

    @Option(names = "--json", description = "Print JSON: {\"steps\": [...], \"recommendation\": {...}, \"drift\": {...}}.")
    boolean json;

    @Option(names = "--report", paramLabel = "FILE.html", description = "Also write the session as a self-contained HTML page with trend charts.")
    java.nio.file.Path report;

    @Override
    public Integer call() {
        SessionData d;
        try (Logbook lb = logbook.open()) {
            if (lb.session(sessionId).isEmpty()) throw new BadInputException("no session " + sessionId + " in logbook " + lb.display());
            d = lb.sessionData(sessionId);
        }
        if (report != null) {
            BiasAdvice a = BiasAdvisor.recommend(d.steps());
            DriftReport dr = DriftAnalysis.analyze(d.steps(), DriftAnalysis.Quantity.READING);
            List<String> charts = ReportCharts.forBiasSession(StepPoint.of(d.steps()), a, BiasAdvisor.DEFAULT_TOLERANCE);
            try {
                org.outstage.report.AtomicFile.write(report, HtmlSessionReport.render(d, a, dr, charts, Instant.now(), SessionSupport.programVersion()));
            } catch (java.io.IOException e) {
                throw new BadInputException(report + ": cannot write (" + e.getMessage() + ")");
            }
        }
        PrintWriter out = spec.commandLine().getOut();
        if (json) {
            out.println(JsonText.pretty(SessionSupport.sessionJson(d)));
        } else {
            out.println("session " + d.session().id() + "  " + d.session().kind().label() + "  unit " + d.unit().name() + "  started "
                    + d.session().startedAt() + d.session().endedAt().map(e -> "  ended " + e).orElse("  (open)"));
            for (BiasStep s : d.steps()) out.println("  " + SessionSupport.stepLine(s));
            if (!d.measurements().isEmpty()) out.println("  " + d.measurements().size() + " measurement(s) outside bias steps");
            if (!d.steps().isEmpty()) {
                BiasAdvice a = BiasAdvisor.recommend(d.steps());
                out.println("advice: " + a.text());
                for (String w : a.warnings()) out.println("warning: " + w);
                DriftReport dr = DriftAnalysis.analyze(d.steps(), DriftAnalysis.Quantity.READING);
                out.println("drift: " + dr.text());
                DriftReport dg = DriftAnalysis.analyze(d.steps(), DriftAnalysis.Quantity.GAIN_AT_ZERO);
                out.println("drift of gain at zero: " + dg.text());
            }
        }
        out.flush();
        return 0;
    }
}
