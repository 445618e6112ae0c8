package org.outstage.ui;

import java.util.List;
import java.util.Optional;
import org.outstage.analysis.TransferCurve;

/**
 * Everything the views show for one capture, built by a {@link Backend} from a measurement result.
 * Views only display this; they never compute a figure.
 *
 * @param captureName   name of the capture
 * @param figures       rows of the figures table (THD+N with its floor beside it)
 * @param notMeasured   why there are no figures, if so
 * @param waveform      waveform with the fitted fundamental
 * @param residual      residual, magnified
 * @param spectrum      spectrum on the absolute scale (dBV or dBFS)
 * @param spectrumRelative the same spectrum in dB re fundamental
 * @param harmonics     harmonic profile
 * @param measuredCurve measured transfer curve for the transfer view, if the result has one
 * @param sweepPoint    this capture's point for the level sweep: power (W), THD and THD+N (fractions)
 * @param specSheet     the spec-sheet figures (intermodulation, noise and hum, swept response), when the capture
 *                      carries a stimulus for them
 * @param captureBand   the band the capture kept (a soundcard WAV's anti-alias filter) and its tone, for the stage
 *                      model's overlay; empty for a scope CSV, whose curve the model is compared with as it is
 */
record ViewData(String captureName, List<FigureRow> figures, Optional<String> notMeasured, Panel waveform, Panel residual,
                Panel spectrum, Panel spectrumRelative, Panel harmonics, Optional<TransferCurve> measuredCurve,
                Optional<SweepPoint> sweepPoint, Optional<SpecSheet> specSheet, Optional<org.outstage.model.CaptureBand> captureBand) {

    ViewData {
        figures = List.copyOf(figures);
    }

    /** One point of a level sweep: the analysis's level point (power, THD, THD+N and its conditions). */
    record SweepPoint(org.outstage.analysis.stage.LevelPoint point) {
        double powerWatts() { return point.powerWatts(); }
        double thd() { return point.thdRatio(); }
        double thdN() { return point.thdNRatio(); }
    }

    static ViewData failed(String name, String message) {
        Panel p = Panel.message(message);
        return new ViewData(name, List.of(), Optional.of(message), p, p, p, p, p, Optional.empty(), Optional.empty(), Optional.empty(), Optional.empty());
    }

    /**
     * The same result without its charts (figures, transfer curve and sweep point kept), for captures that are
     * not on screen: a waveform view holds up to 2^20 samples in several arrays, too much to keep for every file.
     */
    ViewData light() {
        Panel p = Panel.message(LIGHT);
        return new ViewData(captureName, figures, notMeasured, p, p, p, p, p, measuredCurve, sweepPoint, specSheet.map(s -> s.light(p)), captureBand);
    }

    /** Whether the charts are here (not a {@link #light} copy). */
    boolean full() { return !(waveform.prepared().isEmpty() && waveform.message() == LIGHT); }

    private static final String LIGHT = "Analysing…";

    Optional<FigureRow> figure(String id) {
        return figures.stream().filter(f -> f.id().equals(id)).findFirst();
    }

}
