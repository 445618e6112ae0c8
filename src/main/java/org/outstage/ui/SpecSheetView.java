package org.outstage.ui;

import java.util.List;
import javafx.geometry.Insets;
import javafx.geometry.Orientation;
import javafx.scene.control.Label;
import javafx.scene.control.SplitPane;
import javafx.scene.control.Tab;
import javafx.scene.layout.BorderPane;
import javafx.scene.layout.FlowPane;
import javafx.scene.layout.VBox;

/**
 * The spec-sheet figures of the selected capture, when it carries a stimulus for them: a two-tone capture shows
 * its intermodulation products beside the tones with IMD, d2 and d3; a noise capture its noise spectrum with the
 * hum lines marked and the noise, A-weighted noise and S/N; a swept capture with a generator channel its gain
 * (with the −3 dB points) and phase against frequency. Figures and charts are the backend's ({@link SpecSheet}).
 */
final class SpecSheetView implements WorkbenchView {
    final ChartCanvas specChart = WorkbenchView.chart("specChart");
    final ChartCanvas specChart2 = WorkbenchView.chart("specChart2");
    /** What the capture was taken for ("Intermodulation (smpte)", "Noise and hum", "Swept response"). */
    final Label kindLabel = new Label();
    /** One small label pair per figure; each value label's id is {@code sheet} + the figure row's id ({@code sheetImdValue}). */
    final FlowPane figures = new FlowPane(16, 4);
    private final SplitPane charts = new SplitPane(specChart);
    private final Tab tab;

    SpecSheetView() {
        kindLabel.setId("specKind");
        kindLabel.setStyle("-fx-font-weight: bold;");
        figures.setId("specFigures");
        VBox top = new VBox(4, kindLabel, figures);
        top.setPadding(new Insets(4, 6, 4, 6));
        charts.setOrientation(Orientation.VERTICAL);
        BorderPane p = new BorderPane(charts);
        p.setTop(top);
        tab = WorkbenchView.tab("specTab", "Spec sheet", p);
    }

    /** The id of the label that shows a figure row's value in this view. */
    static String labelId(String rowId) { return "sheet" + Character.toUpperCase(rowId.charAt(0)) + rowId.substring(1); }

    @Override public Tab tab() { return tab; }
    @Override public List<ChartCanvas> charts() { return List.of(specChart, specChart2); }

    @Override
    public void show(ViewData d) {
        if (d.specSheet().isEmpty()) {
            clear(d.notMeasured().isPresent() ? d.notMeasured().get()
                    : "No spec-sheet figures for this capture: they come from a two-tone (IMD), a noise (input shorted) or a swept capture"
                    + " with its generator channel named.");
            return;
        }
        SpecSheet s = d.specSheet().get();
        kindLabel.setText(s.kind() + " — " + d.captureName());
        figures.getChildren().clear();
        for (FigureRow r : s.rows()) {
            Label name = new Label(r.quantity());
            name.setStyle("-fx-text-fill: #555555; -fx-font-size: 11px;");
            Label value = new Label(r.value() + (r.unit().isEmpty() ? "" : " " + r.unit()));
            value.setId(labelId(r.id()));
            value.setStyle("-fx-font-size: 14px; -fx-font-weight: bold;");
            if (!r.note().isEmpty()) value.setTooltip(new javafx.scene.control.Tooltip(r.note()));
            figures.getChildren().add(new VBox(0, name, value));
        }
        s.first().showOn(specChart);
        if (s.second().isPresent()) {
            s.second().get().showOn(specChart2);
            if (charts.getItems().size() < 2) { charts.getItems().add(specChart2); charts.setDividerPositions(0.5); }
        } else {
            specChart2.setMessage("");
            charts.getItems().remove(specChart2);
        }
    }

    @Override
    public void clear(String message) {
        kindLabel.setText("");
        figures.getChildren().clear();
        specChart.setMessage(message);
        specChart2.setMessage(message);
        charts.getItems().remove(specChart2);
    }
}
