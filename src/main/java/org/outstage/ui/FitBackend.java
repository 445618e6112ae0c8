package org.outstage.ui;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import java.util.function.BooleanSupplier;
import java.util.function.DoubleConsumer;
import org.outstage.analysis.SineFit;
import org.outstage.analysis.SineFitter;
import org.outstage.capture.Capture;
import org.outstage.plot.Charts;
import org.outstage.plot.Ticks;

/**
 * Backend that only fits the fundamental (IEEE 1057 four-parameter fit, {@link SineFitter}): waveform,
 * residual and the fit's own figures. Used while the full analysis pipeline and the file readers are not
 * part of the build; the other views say so in place.
 */
final class FitBackend implements Backend {
    /** Longest stretch of a record the waveform views hold (about 42 s at 96 kHz). */
    static final int MAX_VIEW_FRAMES = 4_000_000;

    @Override
    public Capture open(Path file, Calibration calibration) throws Exception {
        throw new IllegalArgumentException(file.getFileName() + ": no capture reader in this build");
    }

    @Override
    public ViewData analyze(Capture capture, int channel, Calibration calibration, UiSettings settings,
                            DoubleConsumer progress, BooleanSupplier cancelled) {
        progress.accept(0.05);
        int frames = (int) Math.min(capture.frameCount(), MAX_VIEW_FRAMES);
        double[] x = capture.readChannel(channel, frames);
        if (cancelled.getAsBoolean()) return ViewData.failed(capture.name(), "cancelled");
        progress.accept(0.4);
        String unit = capture.unit().symbol();
        SineFit fit;
        try {
            fit = SineFitter.fit(x, capture.sampleRateHz());
        } catch (IllegalArgumentException e) {
            return ViewData.failed(capture.name(), "not measured: " + e.getMessage());
        }
        progress.accept(0.8);
        List<FigureRow> rows = new ArrayList<>();
        rows.add(new FigureRow("frequencyValue", "Frequency", fmt(fit.frequencyHz()), "Hz", fit.converged() ? "" : "fit did not converge"));
        rows.add(new FigureRow("levelValue", "Level (rms)", fmt(fit.rms()), unit, ""));
        rows.add(new FigureRow("dcValue", "DC offset", fmt(fit.dcOffset()), unit, ""));
        rows.add(new FigureRow("residualValue", "Residual (rms)", fmt(fit.residualRms()), unit, "noise + distortion"));
        String part = frames < capture.frameCount() ? " (first " + fmt(frames / capture.sampleRateHz()) + " s)" : "";
        Panel wave = Panel.of(Charts.waveform(capture.name() + " — waveform" + part, x, capture.sampleRateHz(), 0, unit, Optional.of(fit)));
        Panel res = Panel.of(Charts.residual(capture.name() + " — residual", Charts.residualOf(x, capture.sampleRateHz(), 0, fit),
                capture.sampleRateHz(), 0, unit, fit.amplitudePeak(), fit.frequencyHz()));
        Panel none = Panel.message("Spectrum and harmonics need the analysis pipeline, which is not in this build.");
        progress.accept(1);
        return new ViewData(capture.name(), rows, Optional.empty(), wave, res, none, none, Optional.empty(), Optional.empty());
    }

    static String fmt(double v) {
        return Ticks.withUnit(v, "").trim();
    }
}
