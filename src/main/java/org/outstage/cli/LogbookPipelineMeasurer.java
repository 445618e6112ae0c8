package org.outstage.cli;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.OptionalDouble;
import org.outstage.analysis.AnalysisSettings;
import org.outstage.analysis.Analyzer;
import org.outstage.analysis.Band;
import org.outstage.analysis.Measurement;
import org.outstage.analysis.Weighting;
import org.outstage.analysis.stage.ClippingMetrics;
import org.outstage.analysis.stage.CrossoverMetrics;
import org.outstage.analysis.stage.StageAnalyzer;
import org.outstage.analysis.stage.StageDiagnosis;
import org.outstage.analysis.stage.StageSettings;
import org.outstage.capture.Capture;
import org.outstage.capture.CaptureFormatException;
import org.outstage.capture.CaptureOptions;
import org.outstage.capture.CaptureReader;
import org.outstage.json.Json;
import org.outstage.verify.KeyFigures;

/**
 * The real measurer: {@link CaptureReader#open} then {@link Analyzer#analyze} (with its output-stage
 * diagnosis), and the key figures copied from the {@link Measurement}; nothing is recomputed here.
 * The stored JSON holds every figure of the measurement except the plotting arrays (spectrum and waveform
 * excerpt), which the stored capture reproduces.
 */
final class LogbookPipelineMeasurer implements LogbookMeasurer {
    @Override
    public Measured measure(Path file, LogbookAnalyzeOptions o) {
        o.validate();
        Capture cap;
        try {
            cap = CaptureReader.open(file, new CaptureOptions(opt(o.fsVolts), opt(o.probe), opt(o.sampleRateHz)));
        } catch (CaptureFormatException e) {
            throw new BadInputException(e.getMessage(), e);
        }
        int ch = o.channel();
        if (ch > cap.channelCount()) {
            throw new BadInputException(file + ": --channel " + ch + " does not exist (the capture has " + cap.channelCount() + ")");
        }
        double[] band = o.bandHz();
        AnalysisSettings s = new AnalysisSettings(new Band(band[0], band[1]), o.aWeighted() ? Weighting.A : Weighting.NONE, o.harmonics(),
                opt(o.fundamentalHz), opt(o.loadOhms));
        Measurement m = Analyzer.analyze(cap, ch - 1, s);
        if (!m.measured()) throw new BadInputException(file + ", channel " + ch + ": not measured: " + m.notMeasuredReason().get());
        StageDiagnosis stage = stage(cap, ch, m);
        return new Measured(ch, cap.channelCount(), figures(m, stage), Json.write(json(m, stage)), cap.warnings());
    }

    /**
     * The output-stage diagnosis of the same span the fit used (the first {@value #STAGE_SPAN} samples, t = 0 at the
     * first sample, as {@link Analyzer} fits). Made here until the measurement carries it itself.
     */
    static StageDiagnosis stage(Capture cap, int ch, Measurement m) {
        try {
            return StageAnalyzer.diagnose(cap.readChannel(ch - 1, STAGE_SPAN), cap.sampleRateHz(), m.sineFit(),
                    StageSettings.defaults().withUnit(m.unit()));
        } catch (IllegalArgumentException e) {
            return new StageDiagnosis.NotMeasured(e.getMessage());
        }
    }

    static final int STAGE_SPAN = 1 << 18;

    static KeyFigures figures(Measurement m, StageDiagnosis stage) {
        KeyFigures f = KeyFigures.basic(m.fundamental().frequencyHz(), m.fundamental().rms(), m.unit(), m.thd().ratio(), m.thdN().ratio());
        if (m.powerWatts().isPresent()) f = f.withPower(m.powerWatts().get().fundamentalWatts(), m.powerWatts().get().loadOhms());
        if (stage instanceof StageDiagnosis.Measured d) {
            if (Double.isFinite(d.residual().rmsVolts())) f = f.withResidualRms(d.residual().rmsVolts());
            if (Double.isFinite(d.crossover().gainAtZero())) f = f.withCrossover(d.crossover().gainAtZero(), d.crossover().verdict().label());
            if (d.clipping().asymmetryPercent().isPresent()) f = f.withClipAsymmetry(d.clipping().asymmetryPercent().getAsDouble() / 100);
        }
        return f;
    }

    static Map<String, Object> json(Measurement m, StageDiagnosis stage) {
        List<Object> harmonics = new ArrayList<>();
        for (Measurement.Harmonic h : m.harmonics()) {
            harmonics.add(Json.obj("order", h.order(), "frequency_hz", h.frequencyHz(), "rms", h.rms(), "ratio", h.ratio(), "dbc", h.dbc(),
                    "phase_deg", h.phaseDeg()));
        }
        AnalysisSettings s = m.settings();
        Map<String, Object> o = Json.obj("capture", m.captureName(), "channel", m.channel(), "sample_rate_hz", m.sampleRateHz(), "unit", m.unit(),
                "frame_count", m.frameCount(), "duration_seconds", m.durationSeconds(),
                "settings", Json.obj("band_low_hz", s.band().lowHz(), "band_high_hz", s.band().highHz(), "weighting", s.weighting(),
                        "harmonics", s.harmonics(), "fundamental_hz", s.fundamentalHz(), "load_ohms", s.loadOhms(), "bit_depth", s.bitDepth()),
                "method", m.method(),
                "fundamental", Json.obj("frequency_hz", m.fundamental().frequencyHz(), "rms", m.fundamental().rms(),
                        "amplitude_peak", m.fundamental().amplitudePeak(), "phase_deg", m.fundamental().phaseDeg()),
                "dc_offset", m.dcOffset(), "harmonics", harmonics, "thd_ratio", m.thd().ratio(), "thd_r_ratio", m.thdR().ratio(),
                "thdn", Json.obj("ratio", m.thdN().ratio(), "low_hz", m.thdN().lowHz(), "high_hz", m.thdN().highHz(),
                        "weighting", m.thdN().weighting(), "at_floor", m.thdN().atFloor()),
                "sinad_db", m.sinadDb(), "enob", m.enob(),
                "floor", Json.obj("ratio", m.floor().ratio(), "kind", m.floor().kind(), "quantisation_ratio", m.floor().quantisationRatio(),
                        "measured_noise_ratio", m.floor().measuredNoiseRatio()),
                "total_rms", m.totalRms(),
                "power", m.powerWatts().map(p -> Json.obj("load_ohms", p.loadOhms(), "fundamental_watts", p.fundamentalWatts(),
                        "total_watts", p.totalWatts())),
                "sine_fit", Json.obj("frequency_hz", m.sineFit().frequencyHz(), "amplitude_peak", m.sineFit().amplitudePeak(),
                        "phase_radians", m.sineFit().phaseRadians(), "dc_offset", m.sineFit().dcOffset(),
                        "residual_rms", m.sineFit().residualRms(), "iterations", m.sineFit().iterations(), "converged", m.sineFit().converged()));
        if (stage instanceof StageDiagnosis.Measured d) {
            CrossoverMetrics c = d.crossover();
            ClippingMetrics k = d.clipping();
            o.put("stage", Json.obj(
                    "residual", Json.obj("rms_volts", d.residual().rmsVolts(), "peak_volts", d.residual().peakVolts(),
                            "peak_time_seconds", d.residual().peakTimeSeconds()),
                    "crossover", Json.obj("gain_at_zero", c.gainAtZero(), "gain_at_zero_std_error", c.gainAtZeroStdError(),
                            "incremental_gain_at_zero", c.incrementalGainAtZero(), "outer_mean_gain", c.outerMeanGain(),
                            "notch_width_volts", c.notchWidthVolts(), "notch_depth_volts", c.notchDepthVolts(),
                            "verdict", c.verdict().label(), "confidence", c.confidence(), "explanation", c.explanation()),
                    "clipping", Json.obj("detected", k.detected(), "asymmetry_percent", k.asymmetryPercent(),
                            "positive_volts", k.positive().map(p -> p.levelVolts()), "negative_volts", k.negative().map(p -> p.levelVolts()),
                            "clips_first", k.clipsFirst().label())));
        } else if (stage instanceof StageDiagnosis.NotMeasured n) {
            o.put("stage", Json.obj("not_measured", n.reason()));
        }
        return o;
    }

    private static OptionalDouble opt(Double v) { return v == null ? OptionalDouble.empty() : OptionalDouble.of(v); }
}
