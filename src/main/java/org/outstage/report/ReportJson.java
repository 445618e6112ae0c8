package org.outstage.report;

import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.OptionalDouble;
import org.outstage.json.JsonText;
import org.outstage.logbook.Session;
import org.outstage.verify.KeyFigures;
import org.outstage.verify.LimitResult;
import org.outstage.verify.MeasuredChannel;

/** The report's content as JSON: the same fields as the HTML, measured values in the units the spec used. */
public final class ReportJson {
    private ReportJson() {}

    public static Map<String, Object> of(ReportDocument d) {
        List<Object> limits = new ArrayList<>();
        for (LimitResult r : d.result().results()) {
            limits.add(JsonText.obj("line", r.limit().line(), "limit", r.limit().text(), "quantity", r.limit().quantity().keyword(),
                    "comparison", r.limit().atMost() ? "<=" : ">=", "bound", r.limit().boundDisplay(), "unit", r.limit().displayUnit(),
                    "measured", r.measured().isPresent() ? OptionalDouble.of(r.limit().toDisplay(r.measured().getAsDouble())) : OptionalDouble.empty(),
                    "margin", r.margin(), "verdict", r.verdict().name().toLowerCase(Locale.ROOT).replace('_', '-'), "evidence", r.evidence()));
        }
        List<Object> channels = new ArrayList<>();
        for (MeasuredChannel c : d.channels()) channels.add(channelJson(c));
        return JsonText.obj("report", "verification", "generated_at", d.generatedAt().toString(), "program_version", d.programVersion(),
                "unit", JsonText.obj("name", d.unit().name(), "serial", d.unit().serial(), "topology", d.unit().topology(),
                        "rated_power_watts", d.unit().ratedPowerWatts(), "rated_load_ohms", d.unit().ratedLoadOhms()),
                "session", d.session().map(ReportJson::sessionJson),
                "spec", JsonText.obj("name", d.result().spec().name(), "source", d.result().spec().source()),
                "outcome", d.outcome(), "summary", d.result().summary(), "limits", limits, "captures", channels,
                "cautions", ReportDocument.CAUTIONS);
    }

    private static Map<String, Object> sessionJson(Session s) {
        return JsonText.obj("session_id", s.id(), "kind", s.kind().label(), "started_at", s.startedAt().toString(),
                "ended_at", s.endedAt().map(Instant::toString));
    }

    static Map<String, Object> channelJson(MeasuredChannel c) {
        KeyFigures f = c.figures();
        return JsonText.obj("capture", c.captureName(), "channel", c.channel(), "fundamental_hz", f.fundamentalHz(),
                "fundamental_rms", f.fundamentalRms(), "unit", f.unit(), "thd_percent", f.thdRatio() * 100, "thdn_percent", f.thdNRatio() * 100,
                "power_watts", f.powerWatts(), "load_ohms", f.loadOhms(), "residual_rms", f.residualRms(), "gain_at_zero", f.gainAtZero(),
                "crossover_verdict", f.crossoverVerdict(),
                "clip_asymmetry_percent", f.clipAsymmetryRatio().isPresent() ? OptionalDouble.of(f.clipAsymmetryRatio().getAsDouble() * 100)
                        : OptionalDouble.empty());
    }
}
