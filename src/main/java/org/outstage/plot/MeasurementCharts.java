package org.outstage.plot;

import java.util.List;
import java.util.Optional;
import java.util.OptionalDouble;
import org.outstage.analysis.Levels;
import org.outstage.analysis.Measurement;
import org.outstage.analysis.TransferCurve;
import org.outstage.analysis.stage.LevelPoint;
import org.outstage.analysis.stage.LevelSweepResult;
import org.outstage.analysis.stage.StageDiagnosis;

/**
 * The charts of one {@link Measurement}, described once so the workbench and the HTML report show the same
 * pictures. Only presentation happens here (axis units, the dB reference of the spectrum); every figure comes
 * from the measurement.
 */
public final class MeasurementCharts {
    private MeasurementCharts() {}

    /**
     * The waveform with its fitted fundamental.
     *
     * @param samples the analysis span of the capture (from its first sample, which the fit refers to)
     */
    public static ChartSpec waveform(String name, Measurement m, double[] samples, String part) {
        return Charts.waveform(name + " — waveform" + part, samples, m.sampleRateHz(), 0, m.unit(), Optional.of(m.sineFit()));
    }

    /** The residual waveform (from {@code StageAnalyzer.residual}), magnified against the fundamental. */
    public static ChartSpec residual(String name, Measurement m, double[] residual) {
        return Charts.residual(name + " — residual", residual, m.sampleRateHz(), 0, m.unit(), m.fundamental().amplitudePeak(),
                m.fundamental().frequencyHz());
    }

    /** dB unit of the spectrum: dBV for a capture in volts, dBFS (re a full-scale sine, AES17) otherwise. */
    public static String spectrumUnit(Measurement m) {
        return m.unit().equals("V") ? "dBV" : "dBFS";
    }

    /** Shift from dB re fundamental to {@link #spectrumUnit}: the fundamental's level in dBV, or in dBFS (rms·√2 = peak re full scale). */
    public static double spectrumShiftDb(Measurement m) {
        return m.unit().equals("V") ? Levels.ratioToDb(m.fundamental().rms()) : Levels.ratioToDb(m.fundamental().rms() * Math.sqrt(2));
    }

    /** Spectrum in dBV or dBFS against log frequency, harmonic markers, the band shaded, the noise floor; empty without a spectrum. */
    public static Optional<ChartSpec> spectrum(String name, Measurement m) {
        return spectrum(name, m, false);
    }

    /** The unit label of the relative spectrum scale. */
    public static final String RELATIVE_UNIT = "dB re fundamental";

    /**
     * The spectrum on an absolute scale (dBV for a capture in volts, dBFS otherwise) or, with {@code relative},
     * in dB relative to the fundamental (so harmonics read their dBc directly).
     */
    public static Optional<ChartSpec> spectrum(String name, Measurement m, boolean relative) {
        Measurement.Spectrum sp = m.spectrum();
        if (sp.size() == 0) return Optional.empty();
        double shift = relative ? 0 : spectrumShiftDb(m);
        double[] lv = sp.levelDb();
        for (int i = 0; i < lv.length; i++) lv[i] += shift;
        int k = m.harmonics().size();
        int[] orders = new int[k];
        double[] hf = new double[k], hl = new double[k];
        for (int i = 0; i < k; i++) {
            Measurement.Harmonic h = m.harmonics().get(i);
            orders[i] = h.order();
            hf[i] = h.frequencyHz();
            hl[i] = h.dbc() + shift;
        }
        return Optional.of(Charts.spectrum(name + " — spectrum" + (sp.blocks() > 1 ? " (" + sp.blocks() + " blocks averaged)" : ""),
                sp.frequencyHz(), lv, relative ? RELATIVE_UNIT : spectrumUnit(m), Charts.harmonicMarkers(orders, hf, hl),
                Optional.of(new Range(m.thdN().lowHz(), m.thdN().highHz())),
                Double.isFinite(sp.noiseFloorDb()) ? OptionalDouble.of(sp.noiseFloorDb() + shift) : OptionalDouble.empty()));
    }

    /** Harmonic levels H2…HN as bars (dBc), odd and even apart; empty when no harmonic lies inside the band. */
    public static Optional<ChartSpec> harmonicProfile(String name, Measurement m) {
        int k = m.harmonics().size();
        if (k == 0) return Optional.empty();
        int[] orders = new int[k];
        double[] dbc = new double[k];
        boolean[] resolved = new boolean[k];
        for (int i = 0; i < k; i++) {
            orders[i] = m.harmonics().get(i).order();
            dbc[i] = m.harmonics().get(i).dbc();
            resolved[i] = m.harmonics().get(i).resolved();
        }
        return Optional.of(Charts.harmonicProfile(name + " — harmonic profile", orders, dbc, resolved));
    }

    /** The measured transfer curve of the stage diagnosis, if there is one. */
    public static Optional<TransferCurve> measuredCurve(Measurement m) {
        return m.stage() instanceof StageDiagnosis.Measured d ? Optional.of(d.transfer().curve()) : Optional.empty();
    }

    /** Measured incremental gain deviation against output, with a model's prediction when given. */
    public static Optional<ChartSpec> transfer(String name, Measurement m, Optional<TransferCurve> model, String modelName) {
        return measuredCurve(m).map(c -> Charts.transfer(name + " — incremental gain against output", c, model, modelName));
    }

    /** THD and THD+N against output power of a level series, with the 1 % line. */
    public static ChartSpec levelSweep(String title, LevelSweepResult r) {
        List<LevelPoint> pts = r.points();
        double[] p = new double[pts.size()], thd = new double[pts.size()], thdN = new double[pts.size()];
        for (int i = 0; i < pts.size(); i++) {
            p[i] = pts.get(i).powerWatts();
            thd[i] = pts.get(i).thdRatio();
            thdN[i] = pts.get(i).thdNRatio();
        }
        return Charts.levelSweep(title, p, thd, thdN, 0.01);
    }
}
