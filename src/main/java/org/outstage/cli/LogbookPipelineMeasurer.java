package org.outstage.cli;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.OptionalInt;
import org.outstage.analysis.Measurement;
import org.outstage.analysis.stage.StageDiagnosis;
import org.outstage.capture.Capture;
import org.outstage.json.JsonText;
import org.outstage.report.MeasurementJson;
import org.outstage.verify.KeyFigures;

/**
 * The real measurer: {@link Measuring} (capture reader, {@code Analyzer} with its output-stage diagnosis),
 * the key figures copied from the {@link Measurement}, and the measurement serialised by
 * {@link MeasurementJson} (the same JSON as {@code analyze --json}). Nothing is recomputed here.
 */
final class LogbookPipelineMeasurer implements LogbookMeasurer {
    @Override
    public List<Measured> measure(Path file, AnalyzeOptions options, OptionalInt channel) {
        return measured(Measuring.analyse(file, options, channel), channel);
    }

    /** The measured channels of a file already analysed for {@code channel} ({@link Measuring#analyse}). */
    List<Measured> measured(Measuring.Analysed a, OptionalInt channel) {
        Path file = a.file();
        Capture cap = a.capture();
        List<Measurement> ms = a.measurements();
        List<Measured> out = new ArrayList<>();
        List<String> skipped = new ArrayList<>();
        for (Measurement m : ms) {
            if (!m.measured()) {
                String why = file + ", channel " + m.channel() + ": not measured: " + m.notMeasuredReason().get();
                if (channel.isPresent()) throw new BadInputException(why);
                skipped.add(why);
                continue;
            }
            List<String> warnings = new ArrayList<>(cap.warnings());
            warnings.addAll(skipped);
            warnings.addAll(Measuring.clippingNotes(file, List.of(m)));   // as analyze and bench say it
            out.add(new Measured(m.channel(), cap.channelCount(), figures(m), JsonText.write(MeasurementJson.capture(file.toString(), m, cap.warnings())),
                    warnings, java.util.Optional.of(m)));
        }
        if (out.isEmpty()) throw new BadInputException(skipped.isEmpty() ? file + ": no channel to measure" : skipped.get(0));
        return out;
    }

    static KeyFigures figures(Measurement m) {
        KeyFigures f = KeyFigures.basic(m.fundamental().frequencyHz(), m.fundamental().rms(), m.unit(), m.thd().ratio(), m.thdN().ratio());
        if (m.powerWatts().isPresent()) f = f.withPower(m.powerWatts().get().totalWatts(), m.powerWatts().get().loadOhms());
        if (m.stage() instanceof StageDiagnosis.Measured d) {
            if (Double.isFinite(d.residual().rmsVolts())) f = f.withResidualRms(d.residual().rmsVolts());
            // the crossover figures only where analyze gives them (analysis.Plausibility): a bias step must not carry a
            // gain at zero read between the samples of a locked tone, or from too few cycles
            if (org.outstage.analysis.Plausibility.crossoverGiven(m)) {
                if (Double.isFinite(d.crossover().gainAtZero())) f = f.withCrossover(d.crossover().gainAtZero(), d.crossover().verdict().label());
                if (Double.isFinite(d.crossover().verdictRatio())) f = f.withCrossoverRatio(d.crossover().verdictRatio());
            }
            if (d.clipping().asymmetryPercent().isPresent()) f = f.withClipAsymmetry(d.clipping().asymmetryPercent().getAsDouble() / 100);
        }
        return f;
    }
}
