package org.outstage.report;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.outstage.analysis.Intermodulation;
import org.outstage.analysis.Measurement;
import org.outstage.analysis.NoiseFigures;
import org.outstage.analysis.stage.ClipSide;
import org.outstage.analysis.stage.ClippingMetrics;
import org.outstage.analysis.stage.CrossoverMetrics;
import org.outstage.analysis.stage.MeasuredTransfer;
import org.outstage.analysis.stage.StageDiagnosis;
import org.outstage.json.JsonText;

/**
 * The JSON face of a {@link Measurement}. The keys documented in docs/cli.md are a contract that users'
 * scripts rely on: add keys, never rename or remove one. Levels are in the capture's unit ({@code unit}).
 * A figure that could not be measured is {@code null}, with the reason in {@code not_measured}.
 */
public final class MeasurementJson {
    private MeasurementJson() {}

    /** One capture entry of {@code analyze --json}; {@code file} is the path as the user gave it. */
    public static Map<String, Object> capture(String file, Measurement m, List<String> warnings) {
        Map<String, Object> c = new LinkedHashMap<>();
        c.put("file", file);
        c.put("channel", m.channel());
        c.put("sample_rate_hz", m.sampleRateHz());
        c.put("unit", m.unit());
        c.put("duration_s", m.durationSeconds());
        c.put("not_measured", m.notMeasuredReason().orElse(null));
        c.put("fundamental", JsonText.obj("frequency_hz", m.fundamental().frequencyHz(), "rms", m.fundamental().rms(),
                "peak", m.fundamental().amplitudePeak(), "phase_deg", m.fundamental().phaseDeg()));
        c.put("thd", ratio(m.thd().ratio()));
        c.put("thd_r", ratio(m.thdR().ratio()));
        Map<String, Object> thdN = ratio(m.thdN().ratio());
        thdN.put("bandwidth_hz", new double[] {m.thdN().lowHz(), m.thdN().highHz()});
        thdN.put("weighting", m.thdN().weighting().name().toLowerCase(java.util.Locale.ROOT));
        thdN.put("at_floor", m.measured() ? m.thdN().atFloor() : null);
        c.put("thd_n", thdN);
        c.put("floor", JsonText.obj("ratio", m.floor().ratio(), "db", m.floor().db(),
                "kind", m.floor().kind().name().toLowerCase(java.util.Locale.ROOT).replace('_', '-'),
                "quantisation_ratio", m.floor().quantisationRatio(), "measured_noise_ratio", m.floor().measuredNoiseRatio()));
        c.put("sinad_db", m.sinadDb());
        c.put("enob", m.enob());
        c.put("dc_offset", m.dcOffset());
        c.put("total_rms", m.totalRms());
        c.put("power", m.powerWatts().map(p -> JsonText.obj("load_ohms", p.loadOhms(), "fundamental_w", p.fundamentalWatts(),
                "total_w", p.totalWatts())).orElse(null));
        c.put("method", m.method().name().toLowerCase(java.util.Locale.ROOT).replace('_', '-'));
        List<Object> hs = new ArrayList<>();
        for (Measurement.Harmonic h : m.harmonics())
            hs.add(JsonText.obj("order", h.order(), "frequency_hz", h.frequencyHz(), "rms", h.rms(), "ratio", h.ratio(),
                    "dbc", h.dbc(), "phase_deg", h.phaseDeg(), "resolved", h.resolved()));
        c.put("harmonics", hs);
        c.put("crossover", crossover(m.stage()));
        c.put("clipping", clipping(m.stage()));
        c.put("residual", residual(m.stage()));
        c.put("transfer", transfer(m.stage()));
        c.put("imd", m.imd().map(MeasurementJson::imd).orElse(null));
        c.put("noise", m.noise().map(n -> noise(n, m.unit())).orElse(null));
        c.put("crosstalk", m.crosstalk().map(MeasurementJson::crosstalk).orElse(null));
        c.put("warnings", List.copyOf(warnings));
        // added (issue 11): figures beyond any audio bench, why power is missing, and whether the record is long
        // enough for the crossover figures (analysis.Plausibility; when false, the crossover figures are not to be read)
        c.put("cautions", org.outstage.analysis.Plausibility.cautions(m, m.settings().loadOhms()));
        c.put("crossover_given", org.outstage.analysis.Plausibility.crossoverGiven(m));
        return c;
    }

    /** The {@code crosstalk} object (docs/cli.md); {@code points} only when the driven channel carried a sweep. */
    static Map<String, Object> crosstalk(org.outstage.analysis.Crosstalk x) {
        Map<String, Object> o = JsonText.obj("from_channel", x.fromChannel(), "frequency_hz", x.frequencyHz(), "db", x.db(),
                "ratio", x.ratio(), "resolved", x.resolved());
        if (!x.points().isEmpty()) {
            List<Object> ps = new ArrayList<>();
            for (var p : x.points()) ps.add(JsonText.obj("frequency_hz", p.frequencyHz(), "db", p.db()));
            o.put("points", ps);
        }
        return o;
    }

    /** The {@code imd} object (docs/cli.md). */
    public static Map<String, Object> imd(Intermodulation i) {
        List<Object> ps = new ArrayList<>();
        for (Intermodulation.Product p : i.products())
            ps.add(JsonText.obj("order", p.order(), "frequency_hz", p.frequencyHz(), "rms", p.rms(), "dbc", p.dbc(), "resolved", p.resolved()));
        Map<String, Object> o = new LinkedHashMap<>();
        o.put("method", i.method().label());
        o.put("f1_hz", i.f1Hz());
        o.put("f2_hz", i.f2Hz());
        o.put("f1_rms", i.f1Rms());
        o.put("f2_rms", i.f2Rms());
        o.put("ratio", i.ratio());
        o.put("percent", i.percent());
        o.put("db", i.db());
        o.put("d2", i.order(2));
        o.put("d3", i.order(3));
        if (i.method() == Intermodulation.Method.MODULATION) {
            o.put("d4", i.order(4));
            o.put("d5", i.order(5));
        }
        o.put("stimulus_recognised", i.stimulusFromCapture());
        o.put("products", ps);
        return o;
    }

    /** The {@code noise} object (docs/cli.md); dBV only for a capture in volts, dBFS only for one in full-scale units. */
    public static Map<String, Object> noise(NoiseFigures n, String unit) {
        boolean volts = "V".equals(unit);
        List<Object> hum = new ArrayList<>();
        for (NoiseFigures.HumLine h : n.hum()) hum.add(JsonText.obj("harmonic", h.harmonic(), "frequency_hz", h.frequencyHz(), "rms", h.rms()));
        Map<String, Object> o = new LinkedHashMap<>();
        o.put("rms", n.rms());
        o.put("rms_a", n.rmsA());
        o.put("dbv", volts ? n.db() : null);
        o.put("dbv_a", volts ? n.dbA() : null);
        // added: AES17 dBFS (re the rms of a full-scale sine) for a capture in full-scale units, else null
        boolean fs = "FS".equals(unit);
        o.put("dbfs", fs ? org.outstage.analysis.Levels.dbfs(n.rms()) : null);
        o.put("dbfs_a", fs ? org.outstage.analysis.Levels.dbfs(n.rmsA()) : null);
        o.put("band_hz", new double[] {n.lowHz(), n.highHz()});
        o.put("mains_hz", n.mainsHz().isPresent() ? n.mainsHz().getAsDouble() : null);
        o.put("hum", hum);
        o.put("snr_db", JsonText.obj("re_1w", opt(n.snrRe1WDb()), "re_1w_a", opt(n.snrRe1WADb()), "re_rated", opt(n.snrReRatedDb()),
                "re_rated_a", opt(n.snrReRatedADb())));
        return o;
    }

    private static Object opt(java.util.OptionalDouble v) { return v.isPresent() ? v.getAsDouble() : null; }

    static Map<String, Object> ratio(double r) {
        return JsonText.obj("ratio", r, "percent", 100 * r, "db", 20 * Math.log10(r));
    }

    static Map<String, Object> crossover(StageDiagnosis d) {
        if (!(d instanceof StageDiagnosis.Measured s)) {
            return JsonText.obj("verdict", "unclear", "gain_at_zero", null, "not_measured", reason(d));
        }
        CrossoverMetrics x = s.crossover();
        Map<String, Object> o = new LinkedHashMap<>();
        o.put("gain_at_zero", x.gainAtZero());
        o.put("gain_at_zero_std_error", x.gainAtZeroStdError());
        o.put("gain_at_zero_noise_std_error", x.resolution().noiseStdError());
        o.put("gain_at_zero_resolution_bias", x.resolution().resolutionBias());
        o.put("gain_at_zero_window", x.resolution().windowHalfWidthVolts());
        o.put("verdict", x.verdict().label());
        o.put("verdict_ratio", x.verdictRatio());
        o.put("verdict_ratio_std_error", x.verdictRatioStdError());
        o.put("large_current_asymptote", x.asymptoticGain());
        o.put("confidence", x.confidence());
        o.put("notch_width", x.notchWidthVolts());
        o.put("notch_width_std_error", x.resolution().notchWidthStdErrorVolts());
        o.put("notch_depth", x.notchDepthVolts());
        o.put("notch_depth_std_error", x.resolution().notchDepthStdErrorVolts());
        o.put("notch_depth_percent", 100 * x.notchDepthFraction());
        o.put("near_zero_residual_share", x.nearZeroResidualShare());
        o.put("near_zero_time_share", x.nearZeroTimeShare());
        o.put("incremental_gain_at_zero", x.incrementalGainAtZero());
        o.put("large_signal_gain", x.outerMeanGain());
        o.put("hysteresis", s.transfer().hysteresis().detected());
        o.put("explanation", x.explanation());
        // added: false when the samples near zero do not cover the crossing (then "crossover_given" is false too)
        o.put("crossing_observed", x.resolution().crossingObserved());
        return o;
    }

    static Map<String, Object> clipping(StageDiagnosis d) {
        if (!(d instanceof StageDiagnosis.Measured s)) return JsonText.obj("detected", null, "not_measured", reason(d));
        ClippingMetrics c = s.clipping();
        Map<String, Object> o = new LinkedHashMap<>();
        o.put("detected", c.detected());
        o.put("positive_level", c.positive().map(ClipSide::levelVolts).orElse(null));
        o.put("negative_level", c.negative().map(ClipSide::levelVolts).orElse(null));
        o.put("asymmetry_percent", c.asymmetryPercent());
        o.put("clips_first", c.clipsFirst().label());
        o.put("positive", c.positive().map(MeasurementJson::side).orElse(null));
        o.put("negative", c.negative().map(MeasurementJson::side).orElse(null));
        return o;
    }

    private static Map<String, Object> side(ClipSide s) {
        return JsonText.obj("level", s.levelVolts(), "fraction_of_cycle", s.fractionOfCycle(), "onset_ideal", s.onsetIdealVolts(),
                "recovery_time_s", s.recoveryTimeSeconds(), "knee", s.knee().name().toLowerCase(java.util.Locale.ROOT),
                "knee_depth", s.kneeDepthVolts(), "flat_tops", s.flatTops());
    }

    static Map<String, Object> residual(StageDiagnosis d) {
        if (!(d instanceof StageDiagnosis.Measured s)) return null;
        var r = s.residual();
        return JsonText.obj("rms", r.rmsVolts(), "peak", r.peakVolts(), "peak_time_s", r.peakTimeSeconds(),
                "high_pass_hz", r.highPassHz(), "low_pass_hz", r.lowPassHz());
    }

    static Map<String, Object> transfer(StageDiagnosis d) {
        if (!(d instanceof StageDiagnosis.Measured s)) return null;
        MeasuredTransfer t = s.transfer();
        Map<String, Object> o = new LinkedHashMap<>();
        o.put("points", t.size());
        o.put("from_reference", t.fromReference());
        o.put("large_signal_gain", t.largeSignalGain());
        o.put("noise_rms", t.noiseRmsVolts());
        o.put("hysteresis", JsonText.obj("detected", t.hysteresis().detected(), "chi_square_per_bin", t.hysteresis().chiSquarePerBin(),
                "rms_difference", t.hysteresis().rmsDifferenceVolts()));
        s.reference().ifPresent(a -> o.put("reference", JsonText.obj("delay_s", a.delaySeconds(), "delay_samples", a.delaySamples(),
                "gain", a.gain(), "correlation_delay_samples", a.correlationDelaySamples(),
                "correlation_significance", a.correlationSignificance())));
        return o;
    }

    private static String reason(StageDiagnosis d) {
        return d instanceof StageDiagnosis.NotMeasured n ? n.reason() : null;
    }
}
