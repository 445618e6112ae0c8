package org.outstage.ui;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Optional;
import java.util.OptionalInt;
import java.util.function.BooleanSupplier;
import java.util.function.DoubleConsumer;
import org.outstage.analysis.AnalysisSettings;
import org.outstage.analysis.Analyzer;
import org.outstage.analysis.Band;
import org.outstage.analysis.Levels;
import org.outstage.analysis.Measurement;
import org.outstage.analysis.Weighting;
import org.outstage.analysis.stage.LevelSeries;
import org.outstage.analysis.stage.Residual;
import org.outstage.analysis.stage.StageAnalyzer;
import org.outstage.analysis.stage.StageDiagnosis;
import org.outstage.analysis.stage.StageSettings;
import org.outstage.capture.Capture;
import org.outstage.capture.CaptureOptions;
import org.outstage.capture.CaptureReader;
import org.outstage.plot.MeasurementCharts;
import org.outstage.plot.Ticks;

/**
 * The workbench's backend on the real pipeline: {@link CaptureReader} opens files, {@link Analyzer} measures,
 * {@link StageAnalyzer} gives the residual waveform. Figures are formatted from the {@link Measurement}
 * as they are; the charts are {@link MeasurementCharts}' descriptions, the same the HTML report draws.
 */
final class AnalyzerBackend implements Backend {

    @Override
    public Capture open(Path file, Calibration calibration) throws Exception {
        CaptureOptions o = CaptureOptions.none();
        if (calibration.fullScaleVolts().isPresent()) o = o.withFullScaleVolts(calibration.fullScaleVolts().getAsDouble());
        if (calibration.probeRatio().isPresent()) o = o.withProbeFactor(calibration.probeRatio().getAsDouble());
        if (calibration.sampleRateHz().isPresent()) o = o.withSampleRateHz(calibration.sampleRateHz().getAsDouble());
        return CaptureReader.open(file, o);
    }

    static AnalysisSettings settingsFor(UiSettings s, Calibration cal) {
        AnalysisSettings a = AnalysisSettings.DEFAULT.withBand(new Band(s.band().lowHz, s.band().highHz))
                .withWeighting(s.aWeighting() ? Weighting.A : Weighting.NONE).withHarmonics(s.harmonics());
        if (cal.loadOhms().isPresent()) a = a.withLoadOhms(cal.loadOhms().getAsDouble());
        if (s.referenceChannel().isPresent()) a = a.withReferenceChannel(s.referenceChannel().getAsInt() + 1);
        return a;
    }

    @Override
    public ViewData analyze(Capture capture, int channel, Calibration calibration, UiSettings settings,
                            DoubleConsumer progress, BooleanSupplier cancelled) {
        progress.accept(0.02);
        OptionalInt ref = settings.referenceChannel();
        UiSettings s = ref.isPresent() && (ref.getAsInt() >= capture.channelCount() || ref.getAsInt() == channel)
                ? settings.withReference(OptionalInt.empty()) : settings;
        Measurement m;
        try {
            m = Analyzer.analyze(capture, channel, settingsFor(s, calibration));
        } catch (IllegalArgumentException | java.io.UncheckedIOException e) {
            return ViewData.failed(capture.name(), "Not measured: " + WorkbenchPane.oneLine(e));
        }
        if (cancelled.getAsBoolean()) return ViewData.failed(capture.name(), "cancelled");
        progress.accept(0.6);
        return fromMeasurement(capture, channel, m, calibration, cancelled, progress);
    }

    /** Builds what the views show from a measurement (public to the tests, which compare against it). */
    static ViewData fromMeasurement(Capture capture, int channel, Measurement m, Calibration cal, BooleanSupplier cancelled,
                                    DoubleConsumer progress) {
        String unit = m.unit();
        String name = capture.name() + (capture.channelCount() > 1 ? " ch " + m.channel() : "");
        if (!m.measured()) {
            String why = m.notMeasuredReason().get();
            return ViewData.failed(name, "Not measured: " + why);
        }
        List<FigureRow> rows = figures(m);
        // waveform and residual over the analysis span (the fit refers to its first sample)
        int span = Analyzer.spanFrames(capture);
        double[] x = capture.readChannel(channel, span);
        if (cancelled.getAsBoolean()) return ViewData.failed(name, "cancelled");
        String part = span < capture.frameCount() ? " (first " + num(span / capture.sampleRateHz()) + " s of "
                + num(capture.durationSeconds()) + " s)" : "";
        // the chart descriptions are the ones the HTML report draws (plot.MeasurementCharts)
        Panel wave = Panel.of(MeasurementCharts.waveform(name, m, x, part));
        progress.accept(0.75);
        Panel res;
        try {
            Residual r = StageAnalyzer.residual(x, m.sampleRateHz(), m.sineFit(), StageSettings.defaults().withUnit(unit));
            res = Panel.of(MeasurementCharts.residual(name, m, r.samples()));
        } catch (IllegalArgumentException e) {
            res = Panel.message("No residual: " + WorkbenchPane.oneLine(e));
        }
        progress.accept(0.9);
        Panel spectrum = MeasurementCharts.spectrum(name, m).map(Panel::of).orElseGet(() -> Panel.message("No spectrum for this record"));
        Panel spectrumRelative = MeasurementCharts.spectrum(name, m, true).map(Panel::of)
                .orElseGet(() -> Panel.message("No spectrum for this record"));
        Panel harmonics = MeasurementCharts.harmonicProfile(name, m).map(Panel::of)
                .orElseGet(() -> Panel.message("No harmonics inside the band for this fundamental"));
        Optional<org.outstage.analysis.TransferCurve> curve = MeasurementCharts.measuredCurve(m);
        // the level point as sweep, bench and verify make it (LevelSeries.point: whole-output power, THD, THD+N)
        String label = cal.fullScaleVolts().isPresent() ? "fs-volts" : cal.probeRatio().isPresent() ? "probe" : "volts";
        Optional<ViewData.SweepPoint> sweep = LevelSeries.point(capture.name(), m, label, cal.fullScaleVolts().orElse(0))
                .filter(p -> p.thdRatio() > 0 && p.thdNRatio() > 0).map(ViewData.SweepPoint::new);
        progress.accept(1);
        return new ViewData(name, rows, Optional.empty(), wave, res, spectrum, spectrumRelative, harmonics, curve, sweep);
    }

    /** The figures table, formatted from the measurement. */
    static List<FigureRow> figures(Measurement m) {
        List<FigureRow> rows = new ArrayList<>();
        String u = m.unit();
        rows.add(new FigureRow("frequencyValue", "Fundamental", num(m.fundamental().frequencyHz()), "Hz", ""));
        String levelNote = num(MeasurementCharts.spectrumShiftDb(m)) + " " + MeasurementCharts.spectrumUnit(m);
        rows.add(new FigureRow("levelValue", "Level (rms)", num(m.fundamental().rms()), u, levelNote));
        m.powerWatts().ifPresent(p -> rows.add(new FigureRow("powerValue", "Power", num(p.totalWatts()), "W",
                "into " + num(p.loadOhms()) + " Ω")));
        if (!u.equals("V"))
            rows.add(new FigureRow("calibrationValue", "Calibration", "none", "",
                    "levels in FS; enter the full-scale volts for dBV and power"));
        else if (m.powerWatts().isEmpty())
            rows.add(new FigureRow("calibrationValue", "Power", "—", "", "enter the load to measure power"));
        rows.add(new FigureRow("thdValue", "THD", pct(m.thd().percent()), "%",
                num(m.thd().db()) + " dB; H2–H" + m.settings().harmonics()));
        Measurement.ThdN t = m.thdN();
        String band = Levels.formatHz(t.lowHz()) + "–" + Levels.formatHz(t.highHz()) + (t.weighting() == Weighting.A ? ", A-wtd" : "");
        rows.add(new FigureRow("thdnValue", "THD+N", pct(t.percent()), "%",
                "floor " + pct(Levels.ratioToPercent(m.floor().ratio())) + " %" + (t.atFloor() ? " (at the floor)" : "") + "; " + band));
        rows.add(new FigureRow("floorValue", "Floor", pct(Levels.ratioToPercent(m.floor().ratio())), "%",
                m.floor().kind().name().toLowerCase(Locale.ROOT).replace('_', ' ')));
        rows.add(new FigureRow("sinadValue", "SINAD", num(m.sinadDb()), "dB", "ENOB " + num(m.enob()) + " bits"));
        rows.add(new FigureRow("dcValue", "DC offset", num(m.dcOffset()), u, ""));
        for (Measurement.Harmonic h : m.harmonics())
            rows.add(new FigureRow("h" + h.order() + "Value", "H" + h.order(), (h.resolved() ? "" : "< ") + num(h.dbc()), "dBc",
                    pct(Levels.ratioToPercent(h.ratio())) + " %" + (h.resolved() ? "" : "; not above the noise (an upper bound)")));
        if (m.stage() instanceof StageDiagnosis.Measured d) {
            rows.add(new FigureRow("crossoverValue", "Crossover", d.crossover().verdict().label(), "",
                    d.crossover().explanation()));
            rows.add(new FigureRow("gainAtZeroValue", "Gain at zero", String.format(Locale.ROOT, "%.4f", d.crossover().gainAtZero()), "",
                    "relative; ± " + String.format(Locale.ROOT, "%.4f", d.crossover().gainAtZeroStdError())));
            rows.addAll(clippingRows(d.clipping(), u));
        } else if (m.stage() instanceof StageDiagnosis.NotMeasured n) {
            rows.add(new FigureRow("crossoverValue", "Crossover", "not measured", "", n.reason()));
            rows.add(new FigureRow("clippingValue", "Clipping", "not measured", "", n.reason()));
        }
        return rows;
    }

    /**
     * The clipping rows: each clip level (flat top) with its shape, and the asymmetry with the side that clips
     * first, as measured; one row "none" when neither side clips.
     */
    static List<FigureRow> clippingRows(org.outstage.analysis.stage.ClippingMetrics c, String unit) {
        if (!c.detected())
            return List.of(new FigureRow("clippingValue", "Clipping", "none", "", "no flat top on either side (tolerance "
                    + num(c.toleranceVolts()) + " " + unit + ")"));
        List<FigureRow> rows = new ArrayList<>();
        c.positive().ifPresent(p -> rows.add(new FigureRow("clipPositiveValue", "Clip level +", num(p.levelVolts()), unit, knee(p))));
        c.negative().ifPresent(p -> rows.add(new FigureRow("clipNegativeValue", "Clip level −", num(p.levelVolts()), unit, knee(p))));
        rows.add(new FigureRow("clippingValue", "Clip asymmetry", c.asymmetryPercent().isPresent() ? num(c.asymmetryPercent().getAsDouble()) : "—",
                c.asymmetryPercent().isPresent() ? "%" : "", (c.asymmetryPercent().isPresent() ? "" : "one side only; ")
                + "clips first: " + c.clipsFirst().label()));
        return rows;
    }

    private static String knee(org.outstage.analysis.stage.ClipSide s) {
        return (s.knee() == org.outstage.analysis.stage.ClipSide.Knee.HARD ? "hard flat top" : "soft knee") + ", "
                + pct(100 * s.fractionOfCycle()) + " % of the cycle";
    }

    static String num(double v) { return Double.isFinite(v) ? Ticks.withUnit(v, "").trim() : "—"; }

    /** Percent with 3 significant digits, plain notation down to 0.0001 %. */
    static String pct(double p) {
        if (!Double.isFinite(p)) return "—";
        if (p == 0) return "0";
        return new java.math.BigDecimal(p).round(new java.math.MathContext(3)).stripTrailingZeros().toPlainString();
    }
}
