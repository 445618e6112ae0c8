package org.outstage.ui;

import java.util.List;
import javafx.geometry.Insets;
import javafx.scene.control.CheckBox;
import javafx.scene.control.Tab;
import javafx.scene.layout.BorderPane;
import javafx.scene.layout.HBox;

/**
 * The spectrum, on the absolute scale (dBV or dBFS) or in dB re fundamental. The switch chooses between the
 * two chart descriptions the backend built from one measurement; it changes the view only, no re-analysis.
 */
final class SpectrumView implements WorkbenchView {
    final ChartCanvas spectrumChart = WorkbenchView.chart("spectrumChart");
    final CheckBox relativeBox = new CheckBox("dB re fundamental");
    private final Tab tab;
    private ViewData shown;

    SpectrumView() {
        relativeBox.setId("spectrumRelativeBox");
        relativeBox.selectedProperty().addListener((o, a, b) -> { if (shown != null) showScale(); });
        HBox bar = new HBox(8, relativeBox);
        bar.setPadding(new Insets(4, 6, 2, 6));
        BorderPane p = new BorderPane(spectrumChart);
        p.setTop(bar);
        tab = WorkbenchView.tab("spectrumTab", "Spectrum", p);
    }

    @Override public Tab tab() { return tab; }
    @Override public List<ChartCanvas> charts() { return List.of(spectrumChart); }

    @Override
    public void show(ViewData d) {
        shown = d;
        showScale();
    }

    @Override
    public void clear(String message) {
        shown = null;
        spectrumChart.setMessage(message);
    }

    private void showScale() {
        (relativeBox.isSelected() ? shown.spectrumRelative() : shown.spectrum()).showOn(spectrumChart);
    }
}
