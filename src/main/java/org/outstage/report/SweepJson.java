package org.outstage.report;

import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import org.outstage.analysis.stage.LevelPoint;
import org.outstage.analysis.stage.LevelSweepResult;
import org.outstage.json.JsonText;

/** The JSON face of a level series (the {@code sweep --json} contract in docs/cli.md). */
public final class SweepJson {
    private SweepJson() {}

    public static Map<String, Object> of(LevelSweepResult r) {
        List<Object> pts = new ArrayList<>();
        for (LevelPoint p : r.points())
            pts.add(JsonText.obj("file", p.fileName(), "power_w", p.powerWatts(), "thd_percent", 100 * p.thdRatio(),
                    "thd_n_percent", 100 * p.thdNRatio(), "frequency_hz", p.frequencyHz()));
        return JsonText.obj("load_ohms", r.points().get(0).loadOhms(), "points", pts,
                "power_at_1pct_thd_w", r.atOnePercent().powerWatts(), "power_at_10pct_thd_w", r.atTenPercent().powerWatts(),
                "messages", List.of(r.atOnePercent().message(), r.atTenPercent().message()));
    }
}
