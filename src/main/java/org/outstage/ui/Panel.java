package org.outstage.ui;

import java.util.Optional;
import org.outstage.plot.ChartSpec;

/**
 * What one view shows: a chart (already prepared for drawing, see {@link ChartCanvas#prepare}), or a
 * message in its place (why there is no chart).
 */
record Panel(Optional<ChartCanvas.PreparedChart> prepared, String message) {
    /** Prepares the chart on the calling thread (a worker thread in the workbench). */
    static Panel of(ChartSpec spec) { return new Panel(Optional.of(ChartCanvas.prepare(spec)), ""); }
    static Panel message(String text) { return new Panel(Optional.empty(), text); }

    Optional<ChartSpec> chart() { return prepared.map(ChartCanvas.PreparedChart::spec); }

    void showOn(ChartCanvas canvas) {
        if (prepared.isPresent()) canvas.setPrepared(prepared.get()); else canvas.setMessage(message);
    }
}
