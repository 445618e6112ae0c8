package org.outstage.plot;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.OptionalDouble;
import org.junit.jupiter.api.Test;
import org.outstage.analysis.FrequencyResponse;
import org.outstage.analysis.Intermodulation;

/** The spec-sheet charts carry what the figures say (the renderer is tested elsewhere). */
class SpecSheetChartsTest {
    @Test
    void response_marksBothMinus3dbPoints_andIMD_marksEachProduct() {
        FrequencyResponse r = new FrequencyResponse(List.of(new FrequencyResponse.Point(10, -3, -3, 40), new FrequencyResponse.Point(1000, 0, 0, 0)),
                0, OptionalDouble.of(9.9), OptionalDouble.of(41000), 20, 20000, -0.2, 0, List.of(), 2, 46000, 10, true);
        ChartSpec c = SpecSheetCharts.responseGain("x", r);
        assertEquals(2, c.markers().size());
        assertEquals(9.9, c.markers().get(0).x());
        assertEquals(-3.0103, c.markers().get(0).y(), 1e-4);   // 10·lg ½
        Intermodulation imd = new Intermodulation(Intermodulation.Method.MODULATION, 60, 7000, 0.4, 0.1, 4, 0.01, List.of(0.01),
                List.of(new Intermodulation.Product(2, 6940, 0.0005, 0.005, true), new Intermodulation.Product(2, 7060, 0.0005, 0.005, true)), true);
        ChartSpec i = SpecSheetCharts.intermodulation("y", imd);
        assertEquals(2, i.markers().size());
        assertEquals(20 * Math.log10(0.005), i.series().get(1).y()[0], 1e-12);   // dB re U(f2)
        assertEquals(20 * Math.log10(4), i.series().get(0).y()[0], 1e-12);        // the low tone 12.04 dB above f2
        assertTrue(i.title().contains("smpte"));
    }
}
