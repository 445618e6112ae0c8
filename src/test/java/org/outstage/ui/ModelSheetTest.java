package org.outstage.ui;

import static org.junit.jupiter.api.Assertions.*;

import java.util.HashMap;
import java.util.Map;
import java.util.Optional;
import java.util.concurrent.TimeUnit;
import javafx.scene.Node;
import javafx.scene.Scene;
import javafx.scene.control.TextField;
import javafx.stage.Stage;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.extension.ExtendWith;
import org.outstage.analysis.TransferCurve;
import org.outstage.plot.Charts;
import org.outstage.plot.Series;
import org.testfx.api.FxRobot;
import org.testfx.framework.junit5.ApplicationExtension;
import org.testfx.framework.junit5.Start;
import org.testfx.util.WaitForAsyncUtils;

/** Typing a value into the model's PropertySheet redraws the overlay with the model package's curve for it. */
@ExtendWith(ApplicationExtension.class)
class ModelSheetTest {
    private WorkbenchPane pane;

    @Start
    void start(Stage stage) {
        pane = new WorkbenchPane(new AnalyzerBackend(), new TransferPanel(Optional.of(new ModelStageAdapter())));
        stage.setScene(new Scene(pane, 1280, 800));
        stage.show();
        pane.views.getSelectionModel().select(3);
    }

    @Test
    void typingVq_redrawsOverlayWithThatBias(FxRobot robot) throws Exception {
        // the first editor of the sheet is Vq (mV)
        Node field = robot.lookup("#modelSheet").lookup(".text-field").nth(0).query();
        robot.doubleClickOn(field).eraseText(8).write("5");   // no Enter, no focus change: applied as typed
        Map<String, Double> v = new HashMap<>();
        for (StageModelAdapter.Parameter p : new ModelStageAdapter().parameters("pair")) v.put(p.key(), p.defaultValue());
        v.put("vq_mv", 5.0);
        TransferCurve expected = new ModelStageAdapter().predict("pair", v);
        double[] dev = Charts.gainDeviationPercent(expected)[1];
        WaitForAsyncUtils.waitFor(20, TimeUnit.SECONDS, () -> WaitForAsyncUtils.asyncFx(() ->
                pane.transferPanel.values().get("vq_mv") == 5.0 && pane.transferPanel.lastPrediction().isPresent()
                        && pane.transferPanel.lastPrediction().get().equals(expected)).get());
        Series shown = pane.transferChart.spec().orElseThrow().series().get(0);
        assertEquals(Series.Role.MODEL, shown.role());
        assertArrayEquals(dev, shown.y(), 0.0);
        assertEquals("5", ((TextField) field).getText());
    }
}
