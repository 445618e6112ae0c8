package org.outstage.bench;

import java.util.Random;
import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.outstage.analysis.TransferCurve;
import org.outstage.model.Bias;
import org.outstage.model.BiasFit;
import org.outstage.model.BiasFitResult;
import org.outstage.model.Distortion;
import org.outstage.model.SolverSettings;
import org.outstage.model.StageModel;
import org.outstage.model.StageParameters;

/**
 * Stage-model speed targets (warm): a 2001-point transfer curve under 10 ms; THD at 20 levels under 100 ms;
 * a bias fit under 300 ms. Default Darlington stage (the slowest of the four to converge).
 * Run: {@code mvn -B -o -Pbench verify -Djmh.include=ModelBench}.
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
public class ModelBench {
    StageModel model;
    double[] levels;
    TransferCurve measured;
    StageParameters stage;

    @Setup
    public void setUp() {
        stage = StageParameters.builder().topology("darlington").build();
        model = StageModel.of(stage, SolverSettings.defaults());
        levels = new double[20];
        for (int i = 0; i < 20; i++) levels[i] = 0.5 + 1.5 * i;
        StageParameters at9 = stage.withBias(new Bias.EmitterDropVolts(0.009));
        TransferCurve c = StageModel.of(at9, SolverSettings.defaults()).transferCurve(-10, 10, 2001).curve();
        double[] in = c.inputVolts(), g = c.incrementalGain();
        Random r = new Random(5);
        for (int i = 0; i < in.length; i++) { in[i] *= 0.97; g[i] = g[i] / 0.97 + 1e-4 * r.nextGaussian(); }
        measured = new TransferCurve(in, c.outputVolts(), g, "V");
    }

    @Benchmark
    public TransferCurve transferCurve2001Points() {
        return model.transferCurve(-35, 35, 2001).curve();
    }

    @Benchmark
    public java.util.List<Distortion> thdVersusLevel20Levels() {
        return model.distortionVersusLevel(levels);
    }

    @Benchmark
    public BiasFitResult biasFit() {
        return BiasFit.fit(measured, stage, 21, 0.002, SolverSettings.defaults());
    }
}
