package org.outstage.ui;

import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.concurrent.atomic.AtomicLong;
import javafx.application.Platform;
import javafx.beans.value.ObservableValue;
import javafx.collections.FXCollections;
import javafx.collections.ObservableList;
import javafx.geometry.Insets;
import javafx.scene.Node;
import javafx.scene.control.ComboBox;
import javafx.scene.control.Label;
import javafx.scene.layout.Priority;
import javafx.scene.layout.VBox;
import org.controlsfx.control.PropertySheet;
import org.outstage.analysis.TransferCurve;
import org.outstage.model.CaptureBand;
import org.outstage.plot.ChartSpec;
import org.outstage.plot.Charts;

/**
 * The model side of the transfer view: topology choice and parameters in a ControlsFX PropertySheet; every
 * change of a value recomputes the model's prediction and redraws the overlay on the measured curve. The
 * prediction runs on a worker thread; only the newest request is shown.
 */
final class TransferPanel {
    private final Optional<StageModelAdapter> model;
    private final VBox box = new VBox(6);
    final ComboBox<String> topologyChoice = new ComboBox<>();
    final PropertySheet sheet = new PropertySheet();
    final Label modelMessage = new Label();
    private final Map<String, Double> values = new LinkedHashMap<>();
    private final java.util.Set<String> edited = new java.util.HashSet<>();
    /** Text typed into a parameter's field that is not a number, by parameter name: shown under the sheet. */
    private final Map<String, String> entryProblems = new LinkedHashMap<>();
    private String modelError = "";
    private Runnable onChange = () -> {};
    private final AtomicLong generation = new AtomicLong();
    private volatile TransferCurve lastPrediction;
    private ChartCanvas target;
    private Optional<TransferCurve> measured = Optional.empty();
    private Optional<CaptureBand> band = Optional.empty();

    /** Parameter key of the output span, which follows the measured curve until edited. */
    static final String SPAN_KEY = "span_v";

    TransferPanel(Optional<StageModelAdapter> model) {
        this.model = model;
        box.setPadding(new Insets(6));
        box.setId("modelPanel");
        topologyChoice.setId("topologyChoice");
        sheet.setId("modelSheet");
        sheet.setModeSwitcherVisible(false);
        sheet.setPropertyEditorFactory(item -> new LiveNumberEditor(item, this::entryProblem));
        sheet.setSearchBoxVisible(false);
        modelMessage.setId("modelMessage");
        modelMessage.setWrapText(true);
        modelMessage.setStyle("-fx-text-fill: #a0281e;");
        VBox.setVgrow(sheet, Priority.ALWAYS);
        if (model.isEmpty()) {
            modelMessage.setText("No stage model is part of this build: the transfer view shows the measured curve only.");
            box.getChildren().addAll(new Label("Stage model"), modelMessage);
        } else {
            topologyChoice.getItems().setAll(model.get().topologies());
            topologyChoice.valueProperty().addListener((o, a, b) -> { if (b != null) loadTopology(b); });
            box.getChildren().addAll(new Label("Stage model (topology)"), topologyChoice, sheet, modelMessage);
            if (!topologyChoice.getItems().isEmpty()) {
                topologyChoice.setValue(topologyChoice.getItems().get(0));
                loadTopology(topologyChoice.getValue());
            }
        }
    }

    Node node() { return box; }

    void setOnChange(Runnable r) { this.onChange = r; }

    Map<String, Double> values() { return Map.copyOf(values); }

    /** The prediction now drawn, if any (tests compare it with the model's own result). */
    Optional<TransferCurve> lastPrediction() { return Optional.ofNullable(lastPrediction); }

    /**
     * Shows the parameters of {@code topology}. A value the user edited (a bias, a load…) stays when the new
     * topology has the same parameter; the others take the topology's defaults.
     */
    private void loadTopology(String topology) {
        Map<String, Double> kept = new LinkedHashMap<>();
        for (String k : edited) if (values.containsKey(k)) kept.put(k, values.get(k));
        values.clear();
        edited.clear();
        entryProblems.clear();
        ObservableList<PropertySheet.Item> items = FXCollections.observableArrayList();
        for (StageModelAdapter.Parameter p : model.get().parameters(topology)) {
            if (kept.containsKey(p.key())) { values.put(p.key(), kept.get(p.key())); edited.add(p.key()); }
            else values.put(p.key(), p.defaultValue());
            items.add(new Item(p));
        }
        sheet.getItems().setAll(items);
        onChange.run();
    }

    /** Sets a parameter as the sheet's editor would, and recomputes. */
    void set(String key, double value) {
        values.put(key, value);
        edited.add(key);
        sheet.getItems().setAll(FXCollections.observableArrayList(sheet.getItems()));
        onChange.run();
    }

    /** Draws the measured curve and the model's prediction on {@code chart}. */
    void show(ChartCanvas chart, Optional<TransferCurve> measuredCurve) { show(chart, measuredCurve, Optional.empty()); }

    /**
     * Draws the measured curve and the model's prediction on {@code chart}; with {@code band} (a soundcard capture's
     * band and tone) the prediction is the model's curve through that band at the model's output span, the way the
     * capture recorded the stage, so a notch or a bump compares like with like.
     */
    void show(ChartCanvas chart, Optional<TransferCurve> measuredCurve, Optional<CaptureBand> band) {
        this.target = chart;
        this.measured = measuredCurve;
        this.band = band;
        if (model.isEmpty() || topologyChoice.getValue() == null) {
            if (measuredCurve.isPresent())
                chart.setSpec(Charts.transfer("Incremental gain against output", measuredCurve.get(), Optional.empty(), ""));
            else chart.setMessage("No transfer curve: this result carries no measured curve and no model is available.");
            return;
        }
        String topology = topologyChoice.getValue();
        // the model's output span follows the measured swing until the user sets it
        if (measuredCurve.isPresent() && values.containsKey(SPAN_KEY) && !edited.contains(SPAN_KEY)) {
            double peak = 0;
            for (double o : measuredCurve.get().outputVolts()) if (Double.isFinite(o)) peak = Math.max(peak, Math.abs(o));
            peak = new java.math.BigDecimal(peak).round(new java.math.MathContext(3)).doubleValue();
            if (peak > 0 && !Double.valueOf(peak).equals(values.get(SPAN_KEY))) {
                values.put(SPAN_KEY, peak);
                ObservableList<PropertySheet.Item> items = FXCollections.observableArrayList(sheet.getItems());
                sheet.getItems().setAll(items);
            }
        }
        Map<String, Double> v = Map.copyOf(values);
        long gen = generation.incrementAndGet();
        Thread th = new Thread(() -> {
            TransferCurve pred = null;
            String err = "";
            try {
                pred = model.get().predict(topology, v, band);
            } catch (RuntimeException e) {
                err = "Model: " + WorkbenchPane.oneLine(e);
            }
            TransferCurve p = pred;
            String m = err;
            Platform.runLater(() -> {
                if (gen != generation.get()) return;
                lastPrediction = p;
                modelError = m;
                showMessage();
                draw(p, topology, m);
            });
        }, "outstage-model");
        th.setDaemon(true);
        th.start();
    }

    /** Called by an editor: the text of {@code item} is not a usable number ({@code problem}), or fine again (empty). */
    private void entryProblem(PropertySheet.Item item, String problem) {
        if (problem.isEmpty()) entryProblems.remove(item.getName()); else entryProblems.put(item.getName(), problem);
        showMessage();
    }

    /** The entry problems first (what to correct), then the model's own message. */
    private void showMessage() {
        List<String> lines = new java.util.ArrayList<>(entryProblems.values());
        if (!modelError.isEmpty()) lines.add(modelError);
        modelMessage.setText(String.join("\n", lines));
    }

    private void draw(TransferCurve prediction, String topology, String error) {
        ChartCanvas chart = target;
        if (chart == null) return;
        ChartSpec spec;
        // the legend says when the model's curve went through the capture's band
        String name = band.isPresent() && measured.isPresent()
                ? topology + ", through the capture's " + org.outstage.analysis.Levels.formatHz(band.get().bandHz()) + " band" : topology;
        if (measured.isPresent())
            spec = Charts.transfer("Incremental gain against output", measured.get(), Optional.ofNullable(prediction), name);
        else if (prediction != null)
            spec = Charts.transferModelOnly("Incremental gain against output (model)", prediction, topology);
        else {
            chart.setMessage(error.isEmpty() ? "No transfer curve" : error);
            return;
        }
        if (chart.spec().isPresent() && chart.spec().get().title().equals(spec.title())) chart.updateSpec(spec); else chart.setSpec(spec);
    }

    /**
     * Sheet editor for a number that hands every valid value to the item as it is typed (the stock numeric
     * editor commits only when the field loses focus), so the overlay follows the keyboard. Text that is not
     * a number is left in the field, marked, and not applied.
     */
    static final class LiveNumberEditor implements org.controlsfx.property.editor.PropertyEditor<Object> {
        private final javafx.scene.control.TextField field = new javafx.scene.control.TextField();
        private final PropertySheet.Item item;
        private boolean setting;

        LiveNumberEditor(PropertySheet.Item item, java.util.function.BiConsumer<PropertySheet.Item, String> problems) {
            this.item = item;
            field.setPrefColumnCount(7);
            field.textProperty().addListener((o, a, b) -> {
                if (setting) return;
                String why = "";
                try {
                    double v = Double.parseDouble(b.trim().replace(',', '.'));
                    if (Double.isFinite(v)) item.setValue(v); else why = "is not a finite number";
                } catch (NumberFormatException e) {
                    why = b.trim().isEmpty() ? "is empty" : "is not a number";
                }
                String problem = why.isEmpty() ? "" : item.getName() + ": “" + b.trim() + "” " + why + "; the model keeps "
                        + (item.getValue() instanceof Number n ? format(n.doubleValue()) : String.valueOf(item.getValue()));
                field.setStyle(why.isEmpty() ? "" : "-fx-text-fill: #a0281e;");
                field.setTooltip(why.isEmpty() ? null : new javafx.scene.control.Tooltip(problem));
                problems.accept(item, problem);
            });
        }

        @Override public javafx.scene.Node getEditor() { return field; }
        @Override public Object getValue() { return item.getValue(); }

        @Override
        public void setValue(Object value) {
            setting = true;
            try {
                String t = value instanceof Number n ? format(n.doubleValue()) : String.valueOf(value);
                if (!field.getText().equals(t)) {
                    try {
                        if (value instanceof Number n && Double.parseDouble(field.getText().trim().replace(',', '.')) == n.doubleValue()) return;
                    } catch (NumberFormatException keep) { /* replace the text */ }
                    field.setText(t);
                }
            } finally {
                setting = false;
            }
        }

        static String format(double v) {
            return v == Math.rint(v) && Math.abs(v) < 1e9 ? Long.toString((long) v) : Double.toString(v);
        }
    }

    /** A PropertySheet row bound to one model parameter. */
    private final class Item implements PropertySheet.Item {
        private final StageModelAdapter.Parameter p;

        Item(StageModelAdapter.Parameter p) { this.p = p; }

        @Override public Class<?> getType() { return Double.class; }
        @Override public String getCategory() { return topologyChoice.getValue(); }
        @Override public String getName() { return p.label() + (p.unit().isEmpty() ? "" : " (" + p.unit() + ")"); }
        @Override public String getDescription() { return p.description(); }
        @Override public Object getValue() { return values.getOrDefault(p.key(), p.defaultValue()); }

        @Override
        public void setValue(Object value) {
            if (value instanceof Number n && Double.isFinite(n.doubleValue())) {
                if (java.util.Objects.equals(values.get(p.key()), n.doubleValue())) return;
                values.put(p.key(), n.doubleValue());
                edited.add(p.key());
                onChange.run();
            }
        }

        @Override public Optional<ObservableValue<? extends Object>> getObservableValue() { return Optional.empty(); }
    }

}
