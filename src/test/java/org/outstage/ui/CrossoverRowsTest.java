package org.outstage.ui;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import org.junit.jupiter.api.Test;
import org.outstage.analysis.Analyzer;
import org.outstage.analysis.Measurement;
import org.outstage.capture.SampleUnit;

/**
 * The workbench's figures table leaves the crossover figures out where the command line does (analysis.Plausibility):
 * a tone locked to the sample rate, and a record of fewer than 10 cycles, show "not given" with the reason and no gain
 * at zero; a tone that is not locked shows them.
 */
class CrossoverRowsTest {
    private static double[] tone(double f, int n) { return tone(f, n, 48000); }

    private static double[] tone(double f, int n, double fs) {
        double[] y = new double[n];
        for (int i = 0; i < n; i++) {
            double x = 0.5 * Math.sin(2 * Math.PI * f * i / fs + 0.3);
            y[i] = x - 0.01 * x * x * x - 0.002 * Math.tanh(x / 0.01);
        }
        return y;
    }

    private static FigureRow row(List<FigureRow> rows, String id) {
        return rows.stream().filter(r -> r.id().equals(id)).findFirst().orElse(null);
    }

    @Test
    void lockedOrShort_notGivenWithTheReason_freeTone_givesTheGainAtZero() {
        Measurement locked = Analyzer.analyze(tone(1000, 48000), 48000, SampleUnit.FULL_SCALE);
        List<FigureRow> rows = AnalyzerBackend.figures(locked);
        assertEquals("not given", row(rows, "crossoverValue").value());
        assertTrue(row(rows, "crossoverValue").note().contains("do not cover the crossing"), row(rows, "crossoverValue").note());
        assertEquals(null, row(rows, "gainAtZeroValue"));

        // 8 cycles, sampled as a scope would (1 MHz): the stage is measured, the crossover not given
        Measurement shortOne = Analyzer.analyze(tone(997, 8025, 1e6), 1e6, SampleUnit.FULL_SCALE);
        List<FigureRow> s = AnalyzerBackend.figures(shortOne);
        assertEquals("not given", row(s, "crossoverValue").value());
        assertTrue(row(s, "crossoverValue").note().contains("cycles"), row(s, "crossoverValue").note());

        List<FigureRow> free = AnalyzerBackend.figures(Analyzer.analyze(tone(997, 48000), 48000, SampleUnit.FULL_SCALE));
        assertTrue(row(free, "gainAtZeroValue") != null, free.toString());
        assertTrue(!row(free, "crossoverValue").value().equals("not given"));
    }
}
