package org.outstage.ui;

import java.util.List;
import java.util.Optional;
import javafx.scene.control.SplitPane;
import javafx.scene.control.Tab;
import org.outstage.analysis.TransferCurve;

/**
 * The measured transfer curve (incremental gain against output) with the stage model's prediction over it;
 * the model's topology and parameters are edited in the {@link TransferPanel} beside the chart.
 */
final class TransferView implements WorkbenchView {
    final ChartCanvas transferChart = WorkbenchView.chart("transferChart");
    final TransferPanel panel;
    private final Tab tab;
    private Optional<TransferCurve> measured = Optional.empty();
    private Optional<org.outstage.model.CaptureBand> band = Optional.empty();

    TransferView(TransferPanel panel) {
        this.panel = panel;
        // chart above, model sheet below: side by side, between the capture list and the figures, the chart
        // was left a few hundred pixels and its x axis a single tick
        SplitPane tr = new SplitPane(transferChart, panel.node());
        tr.setOrientation(javafx.geometry.Orientation.VERTICAL);
        tr.setDividerPositions(0.6);
        tab = WorkbenchView.tab("transferTab", "Transfer and model", tr);
        panel.setOnChange(this::refresh);
    }

    @Override public Tab tab() { return tab; }
    @Override public List<ChartCanvas> charts() { return List.of(transferChart); }

    @Override
    public void show(ViewData d) {
        measured = d.measuredCurve();
        band = d.captureBand();
        refresh();
    }

    @Override
    public void clear(String message) {
        measured = Optional.empty();
        band = Optional.empty();
        refresh();
    }

    /** Draws the measured curve (if any) and the model's prediction again. */
    void refresh() { panel.show(transferChart, measured, band); }
}
