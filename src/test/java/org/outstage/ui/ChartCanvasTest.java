package org.outstage.ui;

import static org.junit.jupiter.api.Assertions.*;

import java.util.List;
import javafx.scene.Scene;
import javafx.scene.input.MouseButton;
import javafx.stage.Stage;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.extension.ExtendWith;
import org.outstage.plot.Axis;
import org.outstage.plot.ChartLayout;
import org.outstage.plot.ChartSpec;
import org.outstage.plot.Range;
import org.outstage.plot.Series;
import org.testfx.api.FxRobot;
import org.testfx.framework.junit5.ApplicationExtension;
import org.testfx.framework.junit5.Start;

@ExtendWith(ApplicationExtension.class)
class ChartCanvasTest {
    private ChartCanvas chart;

    @Start
    void start(Stage stage) {
        chart = new ChartCanvas();
        chart.setSpec(ChartSpec.of("t", Axis.log("Frequency", "Hz").withRange(10, 100_000), Axis.db("Level", "dBV").withRange(-140, 0),
                List.of(new Series("s", new double[] {10, 100_000}, new double[] {-100, -20}, Series.Style.LINE, Series.Role.MEASURED))));
        stage.setScene(new Scene(chart, 800, 400));
        stage.show();
    }

    @Test
    void logZoom_keepsThePointUnderThePointerFixed() {
        // zooming by factor k around c on a log axis: log10 distances to c scale by k (definition of the log scale)
        Range r = ChartCanvas.zoomRange(new Range(10, 100_000), Axis.Scale.LOG10, 1000, 0.5);
        assertEquals(Math.pow(10, 3 - 2 * 0.5), r.min(), 1e-9);
        assertEquals(Math.pow(10, 3 + 2 * 0.5), r.max(), 1e-6);
        Range lin = ChartCanvas.zoomRange(new Range(-1, 3), Axis.Scale.LINEAR, 1, 0.5);
        assertEquals(new Range(0, 2), lin);
    }

    @Test
    void readout_namesValuesWithUnits(FxRobot robot) {
        robot.interact(() -> {});
        // plot area: left 74, width 800-74-22 = 704 -> the middle of a 4-decade axis from 10 Hz is 1 kHz
        double px = ChartLayout.MARGIN_LEFT + (800 - ChartLayout.MARGIN_LEFT - ChartLayout.MARGIN_RIGHT) / 2;
        double py = ChartLayout.MARGIN_TOP + (400 - ChartLayout.MARGIN_TOP - ChartLayout.MARGIN_BOTTOM) / 2;
        assertEquals("Frequency 1.000 kHz    Level -70.00 dBV", chart.readoutText(px, py));
    }

    @Test
    void dragBox_zoomsToTheBox(FxRobot robot) {
        double l = ChartLayout.MARGIN_LEFT, t = ChartLayout.MARGIN_TOP;
        double w = 800 - l - ChartLayout.MARGIN_RIGHT, h = 400 - t - ChartLayout.MARGIN_BOTTOM;
        var origin = chart.localToScreen(0, 0);
        robot.drag(origin.getX() + l + w / 4, origin.getY() + t + h / 4, MouseButton.PRIMARY)
                .dropTo(origin.getX() + l + w / 2, origin.getY() + t + h / 2);
        // a quarter to a half of 4 decades from 10 Hz: 100 Hz to 1 kHz; levels -35 .. -70 dBV
        assertEquals(100, chart.visibleX().min(), 2);
        assertEquals(1000, chart.visibleX().max(), 20);
        assertEquals(-70, chart.visibleY().min(), 0.6);
        assertEquals(-35, chart.visibleY().max(), 0.6);
        robot.doubleClickOn(chart);
        assertEquals(new Range(10, 100_000), chart.visibleX());
    }
}
