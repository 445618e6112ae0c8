package org.outstage.ui;

import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import javafx.geometry.Insets;
import javafx.scene.control.Label;
import javafx.scene.control.Tab;
import javafx.scene.layout.BorderPane;
import org.outstage.analysis.stage.LevelPoint;
import org.outstage.analysis.stage.LevelSweep;
import org.outstage.analysis.stage.LevelSweepResult;
import org.outstage.plot.Charts;

/**
 * THD and THD+N against output power over one level series, with the power at 1 % THD from
 * {@link LevelSweep#analyze} (the function {@code sweep}, {@code bench} and {@code verify} use, fed the same
 * points: {@link org.outstage.analysis.stage.LevelSeries#point}, whole-output power V_rms²/R, THD and THD+N of the
 * output channel of each capture of the series).
 *
 * <p>Which captures form the series: two or more captures selected in the list, taken as they are (the
 * analysis refuses a mixed selection); otherwise the named series of the calibration notes ({@code series=NAME}
 * in {@code bench.txt}) that the selected capture belongs to, or the first named series. Captures of other
 * experiments (bias steps, the generator channel, a scope export) never join a series by accident.
 */
final class LevelSweepView implements WorkbenchView {
    final ChartCanvas sweepChart = WorkbenchView.chart("sweepChart");
    /** Which captures the chart is over, in words. */
    final Label seriesLabel = new Label();
    private final Tab tab;
    private Optional<LevelSweepResult> result = Optional.empty();

    LevelSweepView() {
        seriesLabel.setId("sweepSeries");
        seriesLabel.setWrapText(true);
        seriesLabel.setPadding(new Insets(4, 6, 2, 6));
        BorderPane p = new BorderPane(sweepChart);
        p.setTop(seriesLabel);
        tab = WorkbenchView.tab("sweepTab", "Level sweep", p);
    }

    @Override public Tab tab() { return tab; }
    @Override public List<ChartCanvas> charts() { return List.of(sweepChart); }
    @Override public void clear(String message) { /* the sweep does not follow the selected capture alone */ }

    /** The analysis result now drawn, if any. */
    Optional<LevelSweepResult> result() { return result; }

    /** The captures the sweep is over, and how it says so. */
    record Choice(List<CaptureEntry> entries, String description) {}

    /** Chooses the series: the selection when it holds two or more captures, else a named series of the notes. */
    static Optional<Choice> choose(List<CaptureEntry> selected, List<CaptureEntry> all, CaptureEntry focus) {
        if (selected.size() >= 2) return Optional.of(new Choice(List.copyOf(selected), "The " + selected.size() + " selected captures"));
        Optional<String> name = focus != null && focus.series.isPresent() ? focus.series
                : all.stream().filter(e -> e.series.isPresent()).map(e -> e.series.get()).findFirst();
        if (name.isEmpty()) return Optional.empty();
        List<CaptureEntry> members = all.stream().filter(e -> e.series.equals(name)).toList();
        List<String> others = all.stream().filter(e -> e.series.isPresent() && !e.series.equals(name)).map(e -> e.series.get()).distinct().toList();
        return Optional.of(new Choice(members, "Level series “" + name.get() + "” of the calibration notes (" + members.size() + " captures)"
                + (others.isEmpty() ? "" : "; other series: " + String.join(", ", others) + " (select one of its captures)")
                + ". Ctrl-click two or more captures for another set."));
    }

    /** Draws the sweep over the chosen captures' analysis results. */
    void refresh(List<CaptureEntry> selected, List<CaptureEntry> all, CaptureEntry focus) {
        result = Optional.empty();
        Optional<Choice> choice = choose(selected, all, focus);
        if (choice.isEmpty()) {
            seriesLabel.setText("No level series: the calibration notes (bench.txt, series=NAME) name none.");
            sweepChart.setMessage("Select the captures of one level series (two or more, at rising level, in volts, with a load) with Ctrl-click.");
            return;
        }
        seriesLabel.setText(choice.get().description());
        List<LevelPoint> pts = new ArrayList<>();
        int waiting = 0;
        List<String> without = new ArrayList<>();
        for (CaptureEntry e : choice.get().entries()) {
            if (e.data == null) { if (!e.failed()) waiting++; continue; }
            Optional<ViewData.SweepPoint> p = e.data.sweepPoint();
            if (p.isPresent()) pts.add(p.get().point()); else without.add(e.name);
        }
        if (waiting > 0) {
            sweepChart.setMessage("Analysing the series: " + pts.size() + " of " + choice.get().entries().size() + " captures done…");
            return;
        }
        if (!without.isEmpty() && choice.get().entries().size() >= 2) {
            sweepChart.setMessage("Not one level series: " + String.join(", ", without)
                    + " has no output power (give the full-scale volts and the load).");
            return;
        }
        if (pts.size() < 2) {
            sweepChart.setMessage("The level sweep needs two or more captures at rising level, in volts, with a load set ("
                    + pts.size() + " so far). Select the captures of one series with Ctrl-click.");
            return;
        }
        LevelSweepResult r;
        try {
            r = LevelSweep.analyze(pts);
        } catch (IllegalArgumentException ex) {
            sweepChart.setMessage("Not one level series: " + WorkbenchPane.oneLine(ex) + ". Select the captures of one series with Ctrl-click.");
            return;
        }
        result = Optional.of(r);
        List<LevelPoint> sorted = r.points();
        double[] p = new double[sorted.size()], a = new double[sorted.size()], b = new double[sorted.size()];
        for (int i = 0; i < p.length; i++) { p[i] = sorted.get(i).powerWatts(); a[i] = sorted.get(i).thdRatio(); b[i] = sorted.get(i).thdNRatio(); }
        String rated = r.atOnePercent().powerWatts().isPresent()
                ? " — 1 % THD at " + AnalyzerBackend.num(r.atOnePercent().powerWatts().getAsDouble()) + " W" : "";
        sweepChart.setSpec(Charts.levelSweep("THD and THD+N against output power" + rated, p, a, b, 0.01));
    }
}
