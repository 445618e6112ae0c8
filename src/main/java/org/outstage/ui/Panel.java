package org.outstage.ui;

import java.util.Optional;
import org.outstage.plot.ChartSpec;

/** What one view shows: a chart, or a message in its place (why there is no chart). */
record Panel(Optional<ChartSpec> chart, String message) {
    static Panel of(ChartSpec spec) { return new Panel(Optional.of(spec), ""); }
    static Panel message(String text) { return new Panel(Optional.empty(), text); }

    void showOn(ChartCanvas canvas) {
        if (chart.isPresent()) canvas.setSpec(chart.get()); else canvas.setMessage(message);
    }
}
