package org.outstage.ui;

import java.util.List;
import javafx.geometry.Orientation;
import javafx.scene.control.SplitPane;
import javafx.scene.control.Tab;

/** Waveform with the fitted fundamental above, the magnified residual below (both from the analysis). */
final class WaveformView implements WorkbenchView {
    final ChartCanvas waveformChart = WorkbenchView.chart("waveformChart");
    final ChartCanvas residualChart = WorkbenchView.chart("residualChart");
    private final Tab tab;

    WaveformView() {
        SplitPane wave = new SplitPane(waveformChart, residualChart);
        wave.setOrientation(Orientation.VERTICAL);
        wave.setDividerPositions(0.5);
        tab = WorkbenchView.tab("waveformTab", "Waveform and residual", wave);
    }

    @Override public Tab tab() { return tab; }
    @Override public List<ChartCanvas> charts() { return List.of(waveformChart, residualChart); }

    @Override
    public void show(ViewData d) {
        d.waveform().showOn(waveformChart);
        d.residual().showOn(residualChart);
    }
}
