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
import org.outstage.analysis.FrequencyResponse;
import org.outstage.analysis.Intermodulation;
import org.outstage.analysis.NoiseFigures;
import org.outstage.analysis.SpecConditions;
import org.outstage.analysis.SweepResponse;
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
import org.outstage.model.CaptureBand;
import org.outstage.plot.MeasurementCharts;
import org.outstage.plot.SpecSheetCharts;
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
        Optional<FrequencyResponse> response = Optional.empty();
        String responseProblem = "";
        try {
            // the spec-sheet figures as analyze and verify find them with no stated stimulus (SpecConditions.AUTO)
            m = Analyzer.analyze(capture, channel, settingsFor(s, calibration), SpecConditions.AUTO);
            if (s.referenceChannel().isPresent() && sweepLike(m)) {
                if (cancelled.getAsBoolean()) return ViewData.failed(capture.name(), "cancelled");
                progress.accept(0.3);
                try {
                    response = Optional.of(SweepResponse.measure(capture.readChannel(channel), capture.readChannel(s.referenceChannel().getAsInt()),
                            capture.sampleRateHz(), true, Band.AUDIO_20_20K));
                } catch (IllegalArgumentException e) {
                    if (m.imd().isEmpty()) responseProblem = WorkbenchPane.oneLine(e);   // a two-tone capture is not a failed sweep
                }
            }
        } catch (IllegalArgumentException | java.io.UncheckedIOException e) {
            return ViewData.failed(capture.name(), "Not measured: " + WorkbenchPane.oneLine(e));
        }
        if (cancelled.getAsBoolean()) return ViewData.failed(capture.name(), "cancelled");
        progress.accept(0.6);
        return fromMeasurement(capture, channel, m, calibration, cancelled, progress, response, responseProblem);
    }

    /** Whether a capture with a generator channel is taken for a sweep: {@link SweepResponse#sweepCandidate}, no stated stimulus. */
    static boolean sweepLike(Measurement m) {
        return SweepResponse.sweepCandidate(m, org.outstage.analysis.StimulusKind.AUTO);
    }

    /** Builds what the views show from a measurement (public to the tests, which compare against it). */
    static ViewData fromMeasurement(Capture capture, int channel, Measurement m, Calibration cal, BooleanSupplier cancelled,
                                    DoubleConsumer progress, Optional<FrequencyResponse> response, String responseProblem) {
        String unit = m.unit();
        String name = capture.name() + (capture.channelCount() > 1 ? " ch " + m.channel() : "");
        Optional<SpecSheet> sheet = specSheet(name, m, response);
        if (!m.measured()) {
            String why = "Not measured: " + m.notMeasuredReason().get()
                    + (responseProblem.isEmpty() ? "" : "; no swept response: " + responseProblem);
            if (sheet.isEmpty()) return ViewData.failed(name, why);
            Panel p = Panel.message(why);
            return new ViewData(name, sheet.get().rows(), Optional.of(why + " — see the Spec sheet view"),
                    p, p, p, p, p, Optional.empty(), Optional.empty(), sheet, Optional.empty());
        }
        List<FigureRow> rows = new ArrayList<>(figures(m));
        sheet.ifPresent(x -> rows.addAll(x.rows()));
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
        return new ViewData(name, rows, Optional.empty(), wave, res, spectrum, spectrumRelative, harmonics, curve, sweep, sheet,
                captureBand(capture, m));
    }

    /**
     * The band a capture kept, for the stage model's overlay: a soundcard WAV's anti-alias filter, its edge taken as
     * {@link CaptureBand#SOUNDCARD_BAND_FRACTION} of the sample rate, as {@code fit} takes it by default; none for a
     * scope CSV or a capture with no file name of a WAV, nor when the edge does not reach the tone.
     */
    static Optional<CaptureBand> captureBand(Capture capture, Measurement m) {
        double f0 = m.fundamental().frequencyHz();
        double edge = CaptureBand.SOUNDCARD_BAND_FRACTION * capture.sampleRateHz();
        if (!CaptureReader.isWavName(capture.name()) || !(f0 > 0) || edge < f0) return Optional.empty();
        return Optional.of(new CaptureBand(edge, f0));
    }

    /**
     * The spec-sheet view's figures and charts: the swept response when there is one (a swept capture also reads as
     * noise, see {@link #sweepLike}), else the intermodulation, else the noise and hum; empty for an ordinary tone.
     * The charts are {@link SpecSheetCharts}' descriptions, the ones the HTML report draws.
     */
    static Optional<SpecSheet> specSheet(String name, Measurement m, Optional<FrequencyResponse> response) {
        if (response.isPresent()) {
            FrequencyResponse r = response.get();
            return Optional.of(new SpecSheet("Swept response", responseRows(r), Panel.of(SpecSheetCharts.responseGain(name, r)),
                    Optional.of(Panel.of(SpecSheetCharts.responsePhase(name, r)))));
        }
        if (m.imd().isPresent()) {
            Intermodulation i = m.imd().get();
            return Optional.of(new SpecSheet("Intermodulation (" + i.method().label() + ")", imdRows(i),
                    Panel.of(SpecSheetCharts.intermodulation(name, i)), Optional.empty()));
        }
        if (m.noise().isPresent()) {
            NoiseFigures n = m.noise().get();
            return Optional.of(new SpecSheet("Noise and hum", noiseRows(n, m.unit()), Panel.of(SpecSheetCharts.noiseSpectrum(name, m, n)),
                    Optional.empty()));
        }
        return Optional.empty();
    }

    /** One decimal place in dB, as the text table of {@code analyze} gives them. */
    static String db(double v) { return Double.isFinite(v) ? String.format(Locale.ROOT, "%.1f", v) : "—"; }

    /** The intermodulation figures: IMD in % and dB by its method, and the orders d2 and d3. */
    static List<FigureRow> imdRows(Intermodulation i) {
        List<FigureRow> rows = new ArrayList<>();
        String tones = Levels.formatHz(i.f1Hz()) + " + " + Levels.formatHz(i.f2Hz()) + " at " + String.format(Locale.ROOT, "%.2f", i.ratio()) + ":1";
        rows.add(new FigureRow("imdValue", "IMD", pct(i.percent()), "%", i.method().label() + " method; " + tones));
        rows.add(new FigureRow("imdDbValue", "IMD", db(i.db()), "dB", i.method() == Intermodulation.Method.MODULATION
                ? "re the f2 tone" : "re the two tones together"));
        for (int order : new int[] {2, 3})
            rows.add(new FigureRow("imdD" + order + "Value", "d" + order, pct(100 * i.order(order)), "%",
                    i.order(order) > 0 ? db(Levels.ratioToDb(i.order(order))) + " dB" : "no product inside the band"));
        return rows;
    }

    /** The noise figures: rms and A-weighted in the band, S/N when a load is known, the mains hum lines. */
    static List<FigureRow> noiseRows(NoiseFigures n, String unit) {
        List<FigureRow> rows = new ArrayList<>();
        // dBV in volts; in full-scale units dBFS (AES17: re the rms of a full-scale sine), as the command line prints
        String dbUnit = Levels.levelDbUnit(unit);
        double noiseDb = Levels.levelDb(n.rms(), unit), noiseDbA = Levels.levelDb(n.rmsA(), unit);
        String band = Levels.formatHz(n.lowHz()) + "–" + Levels.formatHz(n.highHz());
        rows.add(new FigureRow("noiseValue", "Noise (rms)", num(n.rms()), unit, db(noiseDb) + " " + dbUnit + "; " + band + ", unweighted"));
        rows.add(new FigureRow("noiseAValue", "Noise A-wtd", num(n.rmsA()), unit, db(noiseDbA) + " " + dbUnit + "; IEC 61672-1 A-weighting"));
        rows.add(new FigureRow("noiseDbValue", "Noise", db(noiseDb), dbUnit, "unweighted, " + band));
        if (n.snrRe1WDb().isPresent())
            rows.add(new FigureRow("snrValue", "S/N re 1 W", db(n.snrRe1WDb().getAsDouble()), "dB",
                    "A-weighted " + db(n.snrRe1WADb().getAsDouble()) + " dB"));
        else
            rows.add(new FigureRow("snrValue", "S/N re 1 W", "—", "", "enter the load (and the full-scale volts) for S/N"));
        if (n.snrReRatedDb().isPresent())
            rows.add(new FigureRow("snrRatedValue", "S/N re rated", db(n.snrReRatedDb().getAsDouble()), "dB",
                    "A-weighted " + db(n.snrReRatedADb().getAsDouble()) + " dB"));
        StringBuilder lines = new StringBuilder();
        for (NoiseFigures.HumLine h : n.hum()) {
            if (lines.length() > 0) lines.append("; ");
            lines.append(num(h.frequencyHz())).append(" Hz ").append(num(h.rms())).append(' ').append(unit);
        }
        rows.add(new FigureRow("humValue", "Mains hum", n.mainsHz().isPresent() ? num(n.mainsHz().getAsDouble()) : "none",
                n.mainsHz().isPresent() ? "Hz" : "", n.hum().isEmpty() ? "no hum line stands clear of the noise" : lines.toString()));
        return rows;
    }

    /** The swept-response figures: the −3 dB points, the deviation over the band, the sweep itself. */
    static List<FigureRow> responseRows(FrequencyResponse r) {
        List<FigureRow> rows = new ArrayList<>();
        double first = r.points().isEmpty() ? Double.NaN : r.points().get(0).frequencyHz();
        double last = r.points().isEmpty() ? Double.NaN : r.points().get(r.points().size() - 1).frequencyHz();
        // frequencies with their unit (Levels.formatHz: "3.48 Hz", "29.99 kHz"), so the unit column stays empty
        rows.add(new FigureRow("responseLowValue", "−3 dB low", r.minus3dbLowHz().isPresent() ? Levels.formatHz(r.minus3dbLowHz().getAsDouble()) : "—",
                "", r.minus3dbLowHz().isPresent() ? "re the gain at 1 kHz" : "not reached down to " + Levels.formatHz(first)));
        rows.add(new FigureRow("responseHighValue", "−3 dB high", r.minus3dbHighHz().isPresent() ? Levels.formatHz(r.minus3dbHighHz().getAsDouble()) : "—",
                "", r.minus3dbHighHz().isPresent() ? "re the gain at 1 kHz" : "not reached up to " + Levels.formatHz(last)));
        rows.add(new FigureRow("deviationValue", "Deviation",
                Double.isFinite(r.deviationMaxDb()) ? String.format(Locale.ROOT, "%+.2f / %+.2f", r.deviationMaxDb(), r.deviationMinDb()) : "—",
                "dB", "max / min re 1 kHz, " + Levels.formatHz(r.deviationLowHz()) + "–" + Levels.formatHz(r.deviationHighHz())));
        rows.add(new FigureRow("gainAt1kValue", "Gain at 1 kHz", String.format(Locale.ROOT, "%.2f", r.gainAt1kHzDb()), "dB",
                r.fromReference() ? "output re the generator channel" : "output re the generated sweep"));
        rows.add(new FigureRow("sweepValue", "Sweep", Levels.formatHz(r.sweepLowHz()) + "–" + Levels.formatHz(r.sweepHighHz()), "",
                num(r.sweepSeconds()) + " s exponential sweep"));
        return rows;
    }

    /** The figures table, formatted from the measurement. */
    static List<FigureRow> figures(Measurement m) {
        List<FigureRow> rows = new ArrayList<>();
        String u = m.unit();
        if (m.noise().isPresent()) {
            // a noise capture: its strongest line is hum or noise, not a test tone; the noise and hum rows follow
            // (Spec sheet), and no distortion, power or stage figures of that line are given (as analyze's table)
            String why = "noise capture: no test tone";
            rows.add(new FigureRow("frequencyValue", "Strongest line", num(m.fundamental().frequencyHz()), "Hz", "hum or noise, not a test tone"));
            rows.add(new FigureRow("levelValue", "Its level (rms)", num(m.fundamental().rms()), u, ""));
            rows.add(new FigureRow("dcValue", "DC offset", num(m.dcOffset()), u, ""));
            rows.add(new FigureRow("crossoverValue", "Crossover", "not measured", "", why));
            rows.add(new FigureRow("clippingValue", "Clipping", "not measured", "", why));
            return rows;
        }
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
            // as the command line and the report: a record too short, or whose samples miss the crossing, gives none
            java.util.Optional<String> notGiven = org.outstage.analysis.Plausibility.crossoverNotGiven(m);
            if (notGiven.isPresent()) {
                rows.add(new FigureRow("crossoverValue", "Crossover", "not given", "", notGiven.get()));
            } else {
                rows.add(new FigureRow("crossoverValue", "Crossover", d.crossover().verdict().label(), "",
                        d.crossover().explanation()));
                rows.add(new FigureRow("gainAtZeroValue", "Gain at zero", String.format(Locale.ROOT, "%.4f", d.crossover().gainAtZero()), "",
                        "relative; ± " + String.format(Locale.ROOT, "%.4f", d.crossover().gainAtZeroStdError())));
            }
            rows.addAll(clippingRows(d.clipping(), u, CaptureReader.isWavName(m.captureName())));
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
    static List<FigureRow> clippingRows(org.outstage.analysis.stage.ClippingMetrics c, String unit) { return clippingRows(c, unit, false); }

    /** As above; for a soundcard capture ({@code bandLimited}) each row says the figures are approximate, as the command line does. */
    static List<FigureRow> clippingRows(org.outstage.analysis.stage.ClippingMetrics c, String unit, boolean bandLimited) {
        if (!c.detected())
            return List.of(new FigureRow("clippingValue", "Clipping", "none", "", "no flat top on either side (tolerance "
                    + num(c.toleranceVolts()) + " " + unit + ")"));
        String band = bandLimited ? "; " + org.outstage.analysis.stage.ClippingMetrics.BAND_LIMITED_NOTE : "";
        List<FigureRow> rows = new ArrayList<>();
        c.positive().ifPresent(p -> rows.add(new FigureRow("clipPositiveValue", "Clip level +", num(p.levelVolts()), unit, knee(p) + band)));
        c.negative().ifPresent(p -> rows.add(new FigureRow("clipNegativeValue", "Clip level −", num(p.levelVolts()), unit, knee(p) + band)));
        rows.add(new FigureRow("clippingValue", "Clip asymmetry", c.asymmetryPercent().isPresent() ? num(c.asymmetryPercent().getAsDouble()) : "—",
                c.asymmetryPercent().isPresent() ? "%" : "", (c.asymmetryPercent().isPresent() ? "" : "one side only; ")
                + "clips first: " + c.clipsFirst().label() + band));
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
