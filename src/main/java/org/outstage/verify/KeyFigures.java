package org.outstage.verify;

import java.util.Objects;
import java.util.Optional;
import java.util.OptionalDouble;
import org.outstage.Require;

/**
 * The indexed figures of one measured channel of one capture: what the logbook keeps in columns (so a
 * session charts without parsing JSON) and what a spec limit is checked against. The caller fills it
 * from the full measurement; nothing here is recomputed. Ratios are fractions (0.001 = 0.1 %).
 *
 * @param fundamentalHz        frequency of the fitted fundamental
 * @param fundamentalRms       RMS of the fundamental in {@code unit}
 * @param unit                 "V" for calibrated captures, "FS" for uncalibrated full-scale values
 * @param thdRatio             THD, harmonics 2..N relative to the fundamental (fraction)
 * @param thdNRatio            THD+N in the measurement band relative to the total (fraction, AES17 convention)
 * @param residualRms          RMS of everything but the fundamental in the band (noise on a capture without a tone)
 * @param powerWatts           output power {@code fundamentalRms²/loadOhms}, when volts and a load are known
 * @param loadOhms             the load the capture was made into, when given
 * @param gainAtZero           incremental gain at zero output relative to the large-signal gain (1 = flat)
 * @param crossoverVerdict     the crossover diagnosis in words (e.g. "under-biased", "near-optimal", "gm-doubling")
 * @param clipAsymmetryRatio   (|upper clip| − |lower clip|) / mean, as a fraction, when the capture clips
 * @param crossoverRatio       what the crossover verdict reads: the gain at zero against the large-current asymptote
 *                             when the outer gain still rises at the capture's level, else {@code gainAtZero}
 *                             (docs/diagnosis.md); empty for records made before it was kept
 */
public record KeyFigures(double fundamentalHz, double fundamentalRms, String unit, double thdRatio, double thdNRatio,
                         OptionalDouble residualRms, OptionalDouble powerWatts, OptionalDouble loadOhms,
                         OptionalDouble gainAtZero, Optional<String> crossoverVerdict, OptionalDouble clipAsymmetryRatio,
                         OptionalDouble crossoverRatio) {
    public KeyFigures {
        Require.nonNegative("fundamentalHz", fundamentalHz);
        Require.nonNegative("fundamentalRms", fundamentalRms);
        Objects.requireNonNull(unit, "unit");
        Require.nonNegative("thdRatio", thdRatio);
        Require.nonNegative("thdNRatio", thdNRatio);
        Objects.requireNonNull(residualRms, "residualRms");
        Objects.requireNonNull(powerWatts, "powerWatts");
        Objects.requireNonNull(loadOhms, "loadOhms");
        Objects.requireNonNull(gainAtZero, "gainAtZero");
        Objects.requireNonNull(crossoverVerdict, "crossoverVerdict");
        Objects.requireNonNull(clipAsymmetryRatio, "clipAsymmetryRatio");
        residualRms.ifPresent(v -> Require.nonNegative("residualRms", v));
        powerWatts.ifPresent(v -> Require.nonNegative("powerWatts", v));
        loadOhms.ifPresent(v -> Require.positive("loadOhms", v));
        gainAtZero.ifPresent(v -> Require.finite("gainAtZero", v));
        clipAsymmetryRatio.ifPresent(v -> Require.finite("clipAsymmetryRatio", v));
        Objects.requireNonNull(crossoverRatio, "crossoverRatio");
        crossoverRatio.ifPresent(v -> Require.finite("crossoverRatio", v));
    }

    /** The figures without a crossover ratio (records made before it was kept). */
    public KeyFigures(double fundamentalHz, double fundamentalRms, String unit, double thdRatio, double thdNRatio,
                      OptionalDouble residualRms, OptionalDouble powerWatts, OptionalDouble loadOhms,
                      OptionalDouble gainAtZero, Optional<String> crossoverVerdict, OptionalDouble clipAsymmetryRatio) {
        this(fundamentalHz, fundamentalRms, unit, thdRatio, thdNRatio, residualRms, powerWatts, loadOhms, gainAtZero, crossoverVerdict,
                clipAsymmetryRatio, OptionalDouble.empty());
    }

    /** The ratio bias advice and drift should read: {@link #crossoverRatio} when kept, otherwise {@link #gainAtZero}. */
    public OptionalDouble crossoverReading() {
        return crossoverRatio.isPresent() ? crossoverRatio : gainAtZero;
    }

    public KeyFigures withCrossoverRatio(double ratio) {
        return new KeyFigures(fundamentalHz, fundamentalRms, unit, thdRatio, thdNRatio, residualRms, powerWatts, loadOhms,
                gainAtZero, crossoverVerdict, clipAsymmetryRatio, OptionalDouble.of(ratio));
    }

    /** Only the figures every measurement has; the optional ones empty. */
    public static KeyFigures basic(double fundamentalHz, double fundamentalRms, String unit, double thdRatio, double thdNRatio) {
        return new KeyFigures(fundamentalHz, fundamentalRms, unit, thdRatio, thdNRatio, OptionalDouble.empty(), OptionalDouble.empty(),
                OptionalDouble.empty(), OptionalDouble.empty(), Optional.empty(), OptionalDouble.empty());
    }

    public KeyFigures withResidualRms(double v) {
        return new KeyFigures(fundamentalHz, fundamentalRms, unit, thdRatio, thdNRatio, OptionalDouble.of(v), powerWatts, loadOhms,
                gainAtZero, crossoverVerdict, clipAsymmetryRatio, crossoverRatio);
    }

    public KeyFigures withPower(double watts, double ohms) {
        return new KeyFigures(fundamentalHz, fundamentalRms, unit, thdRatio, thdNRatio, residualRms, OptionalDouble.of(watts),
                OptionalDouble.of(ohms), gainAtZero, crossoverVerdict, clipAsymmetryRatio, crossoverRatio);
    }

    public KeyFigures withCrossover(double gain, String verdict) {
        return new KeyFigures(fundamentalHz, fundamentalRms, unit, thdRatio, thdNRatio, residualRms, powerWatts, loadOhms,
                OptionalDouble.of(gain), Optional.ofNullable(verdict), clipAsymmetryRatio, crossoverRatio);
    }

    public KeyFigures withClipAsymmetry(double ratio) {
        return new KeyFigures(fundamentalHz, fundamentalRms, unit, thdRatio, thdNRatio, residualRms, powerWatts, loadOhms,
                gainAtZero, crossoverVerdict, OptionalDouble.of(ratio), crossoverRatio);
    }
}
