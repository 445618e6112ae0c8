package org.outstage.analysis;

import java.util.List;
import java.util.Optional;
import org.outstage.capture.Capture;
import org.outstage.capture.SampleUnit;

/** The measurement pipeline (work in progress: API shape only in this commit). */
public final class Analyzer {
    private Analyzer() {}

    /** Analyses channel {@code channelIndex} (0-based) of {@code capture}. Pure, thread-safe, deterministic. */
    public static Measurement analyze(Capture capture, int channelIndex, AnalysisSettings settings) {
        return notMeasured(capture.name(), channelIndex + 1, capture.sampleRateHz(), capture.unit().symbol(), capture.frameCount(), settings,
                "analysis not implemented yet");
    }

    /** Analyses a record held in memory. */
    public static Measurement analyze(double[] samples, double sampleRateHz, SampleUnit unit, AnalysisSettings settings) {
        return analyze(Capture.inMemory("samples", sampleRateHz, unit, samples), 0, settings);
    }

    static Measurement notMeasured(String name, int channel, double fs, String unit, long frames, AnalysisSettings settings, String reason) {
        double nan = Double.NaN;
        return new Measurement(name, channel, fs, unit, frames, frames / fs, settings, Optional.of(reason), Measurement.Method.NONE,
                new Measurement.Fundamental(nan, nan, nan, nan), nan, List.of(), new Measurement.Ratio(nan), new Measurement.Ratio(nan),
                new Measurement.ThdN(nan, settings.band().lowHz(), settings.band().effectiveHighHz(fs), settings.weighting(), false), nan, nan,
                new Measurement.Floor(nan, Measurement.FloorKind.NONE, nan, nan), nan, Optional.empty(),
                new SineFit(nan, nan, nan, nan, nan, 0, false), Measurement.Spectrum.empty(), Measurement.Waveform.empty(fs));
    }
}
