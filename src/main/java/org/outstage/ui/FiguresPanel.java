package org.outstage.ui;

import java.util.List;
import java.util.function.Consumer;
import javafx.beans.property.ReadOnlyStringWrapper;
import javafx.scene.control.Button;
import javafx.scene.control.Label;
import javafx.scene.control.SelectionMode;
import javafx.scene.control.TableColumn;
import javafx.scene.control.TableRow;
import javafx.scene.control.TableView;
import javafx.scene.control.Tooltip;
import javafx.scene.input.Clipboard;
import javafx.scene.input.ClipboardContent;
import javafx.scene.input.KeyCode;
import javafx.scene.input.KeyCodeCombination;
import javafx.scene.input.KeyCombination;
import javafx.scene.layout.FlowPane;
import javafx.scene.layout.Priority;
import javafx.scene.layout.VBox;

/**
 * The figures of the selected capture: the main ones large (summary), all of them in a table with a note
 * each, as the backend formatted them from the measurement; copied as tab-separated text.
 */
final class FiguresPanel {
    final TableView<FigureRow> figuresTable = new TableView<>();
    final FlowPane summary = new FlowPane(14, 4);
    final Button copyButton = new Button("Copy figures");
    private final Consumer<String> status;

    /** The figures shown large above the table. */
    static final List<String> SUMMARY_IDS = List.of("thdValue", "thdnValue", "floorValue", "frequencyValue", "levelValue", "powerValue",
            "imdValue", "noiseValue", "noiseAValue", "snrValue", "responseLowValue", "responseHighValue");

    FiguresPanel(Consumer<String> status) {
        this.status = status;
        figuresTable.setId("figuresTable");
        figuresTable.setColumnResizePolicy(TableView.CONSTRAINED_RESIZE_POLICY);
        figuresTable.getColumns().add(column("Quantity", FigureRow::quantity, 120));
        figuresTable.getColumns().add(column("Value", FigureRow::value, 86));
        figuresTable.getColumns().add(column("Unit", FigureRow::unit, 42));
        TableColumn<FigureRow, String> note = column("Note", FigureRow::note, 194);
        // the note (a diagnosis can be two sentences) wraps inside its cell; the row grows to hold it
        note.setCellFactory(c -> new javafx.scene.control.TableCell<>() {
            private final javafx.scene.text.Text text = new javafx.scene.text.Text();
            {
                text.wrappingWidthProperty().bind(note.widthProperty().subtract(10));
                text.getStyleClass().add("note-text");
                setPrefHeight(javafx.scene.control.Control.USE_COMPUTED_SIZE);
            }

            @Override protected void updateItem(String item, boolean empty) {
                super.updateItem(item, empty);
                setText(null);
                text.setText(empty || item == null ? "" : item);
                setGraphic(empty ? null : text);
                setTooltip(empty || item == null || item.isEmpty() ? null : new Tooltip(item));
            }
        });
        figuresTable.getColumns().add(note);
        figuresTable.getSelectionModel().setSelectionMode(SelectionMode.MULTIPLE);
        figuresTable.setOnKeyPressed(e -> {
            if (new KeyCodeCombination(KeyCode.C, KeyCombination.SHORTCUT_DOWN).match(e)) copy();
        });
        figuresTable.setPlaceholder(new Label("No figures yet"));
        figuresTable.setRowFactory(tv -> new TableRow<>() {
            @Override protected void updateItem(FigureRow r, boolean empty) {
                super.updateItem(r, empty);
                setTooltip(empty || r == null ? null : new Tooltip(r.quantity() + ": " + r.value() + " " + r.unit() + (r.note().isEmpty() ? "" : "\n" + r.note())));
            }
        });
        VBox.setVgrow(figuresTable, Priority.ALWAYS);
        copyButton.setId("copyFigures");
        copyButton.setOnAction(e -> copy());
        summary.setId("summary");
    }

    private static TableColumn<FigureRow, String> column(String title, java.util.function.Function<FigureRow, String> f, double w) {
        TableColumn<FigureRow, String> c = new TableColumn<>(title);
        c.setCellValueFactory(d -> new ReadOnlyStringWrapper(f.apply(d.getValue())));
        c.setPrefWidth(w);
        c.setSortable(false);
        return c;
    }

    void clear() {
        figuresTable.getItems().clear();
        summary.getChildren().clear();
    }

    void show(ViewData d) {
        figuresTable.getItems().setAll(d.figures());
        summary.getChildren().clear();
        if (d.notMeasured().isPresent()) {
            Label l = new Label(d.notMeasured().get());
            l.setId("notMeasured");
            l.setWrapText(true);
            // wraps inside the side column (a long reason would otherwise widen the column and squeeze the views)
            l.setPrefWidth(440);
            l.setMaxWidth(440);
            l.setMinWidth(0);
            l.setMinHeight(javafx.scene.layout.Region.USE_PREF_SIZE);
            l.setStyle("-fx-text-fill: #a0281e;");
            summary.getChildren().add(l);
        }
        for (FigureRow r : d.figures()) {
            if (!SUMMARY_IDS.contains(r.id())) continue;
            Label name = new Label(r.quantity());
            name.setStyle("-fx-text-fill: #555555; -fx-font-size: 11px;");
            Label value = new Label(r.value() + (r.unit().isEmpty() ? "" : " " + r.unit()));
            value.setId(r.id());
            value.setStyle("-fx-font-size: 15px; -fx-font-weight: bold;");
            summary.getChildren().add(new VBox(0, name, value));
        }
    }

    /** Copies the selected rows (all when none is selected) as tab-separated text. */
    void copy() {
        List<FigureRow> rows = figuresTable.getSelectionModel().getSelectedItems().isEmpty()
                ? figuresTable.getItems() : figuresTable.getSelectionModel().getSelectedItems();
        StringBuilder sb = new StringBuilder("Quantity\tValue\tUnit\tNote\n");
        for (FigureRow r : rows) sb.append(r.tsv()).append('\n');
        ClipboardContent c = new ClipboardContent();
        c.putString(sb.toString());
        Clipboard.getSystemClipboard().setContent(c);
        status.accept("Copied " + rows.size() + " figure(s) to the clipboard");
    }
}
