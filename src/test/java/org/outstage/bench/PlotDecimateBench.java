package org.outstage.bench;

import java.util.List;
import java.util.Random;
import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.outstage.plot.Axis;
import org.outstage.plot.ChartSpec;
import org.outstage.plot.Decimator;
import org.outstage.plot.Series;
import org.outstage.report.SvgRenderer;

/** Min/max column decimation of a 1,000,000-sample waveform to 1200 columns, and the SVG render of it. */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
public class PlotDecimateBench {
    double[] t, y;
    ChartSpec spec;

    @Setup
    public void setup() {
        int n = 1_000_000;
        t = new double[n];
        y = new double[n];
        Random r = new Random(1);
        for (int i = 0; i < n; i++) { t[i] = i / 96_000.0; y[i] = Math.sin(2 * Math.PI * 1000 * t[i]) + 1e-3 * r.nextGaussian(); }
        spec = ChartSpec.of("bench", Axis.linear("Time", "s"), Axis.linear("Output", "V"),
                List.of(new Series("capture", t, y, Series.Style.LINE, Series.Role.MEASURED)));
    }

    @Benchmark
    public Decimator.Result decimateMillionTo1200Columns() {
        return Decimator.minMax(t, y, t[0], t[t.length - 1], 1200, Axis.Scale.LINEAR);
    }

    @Benchmark
    public String svgOfMillionPoints() {
        return SvgRenderer.render(spec, 1200, 600);
    }
}
