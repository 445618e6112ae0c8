package org.outstage.verify;

import java.util.List;
import org.outstage.analysis.FrequencyResponse;
import org.outstage.analysis.Intermodulation;
import org.outstage.analysis.NoiseFigures;

/**
 * The limits on the spec-sheet figures (docs/spec-format.md). Nothing is measured here; each limit reads the
 * worst matching figure:
 * <ul>
 * <li>imd: the largest IMD of the captures of the stated method (any method when none is stated);</li>
 * <li>snr: 20·lg(√(P·R)/noise) of each noise capture in volts with a load, P the stated power, R the limit's load
 *     or the capture's, noise A-weighted when the limit says {@code a-weighted}; the smallest counts
 *     (common practice, docs/references.md §13);</li>
 * <li>crosstalk: the highest crosstalk (closest to 0 dB) at the stated frequency;</li>
 * <li>response-deviation: the largest |deviation| re 1 kHz over the response's deviation band;</li>
 * <li>bandwidth-low / -high: the highest lower / lowest upper −3 dB point;</li>
 * <li>damping-factor: the smallest damping factor at the stated frequency and load.</li>
 * </ul>
 */
final class SpecLimits {
    private SpecLimits() {}

    static String where(SpecReading r) { return r.captureName() + " ch" + r.channel(); }

    static boolean frequencyMatches(SpecProfile spec, Limit l, double hz) {
        if (l.frequencyHz().isEmpty()) return true;
        double f0 = l.frequencyHz().getAsDouble();
        return Math.abs(hz - f0) <= spec.frequencyTolerance() * f0;
    }

    static LimitResult check(SpecProfile spec, Limit l, List<SpecReading> readings) {
        double worst = Double.NaN;
        String at = null;
        for (SpecReading r : readings) {
            double v = Double.NaN;
            switch (l.quantity()) {
                case IMD -> {
                    if (r.imd().isEmpty()) continue;
                    Intermodulation i = r.imd().get();
                    if (!l.qualifier().isEmpty() && !l.qualifier().equals(i.method().label())) continue;
                    v = i.imdRatio();
                }
                case SNR -> {
                    if (r.noise().isEmpty() || !r.unit().equals("V")) continue;
                    double load = l.loadOhms().isPresent() ? l.loadOhms().getAsDouble() : r.loadOhms().orElse(Double.NaN);
                    if (!(load > 0)) continue;
                    NoiseFigures n = r.noise().get();
                    double noise = l.qualifier().equals("a-weighted") ? n.rmsA() : n.rms();
                    if (!(noise > 0)) continue;
                    v = 20 * Math.log10(Math.sqrt(l.powerWatts().getAsDouble() * load) / noise);
                }
                case CROSSTALK -> {
                    if (r.crosstalk().isEmpty() || !frequencyMatches(spec, l, r.crosstalk().get().frequencyHz())) continue;
                    v = r.crosstalk().get().db();
                }
                case RESPONSE_DEVIATION, BANDWIDTH_LOW, BANDWIDTH_HIGH -> {
                    if (r.response().isEmpty()) continue;
                    FrequencyResponse fr = r.response().get();
                    if (l.quantity() == Quantity.RESPONSE_DEVIATION) v = Math.max(Math.abs(fr.deviationMinDb()), Math.abs(fr.deviationMaxDb()));
                    else if (l.quantity() == Quantity.BANDWIDTH_LOW) {
                        if (fr.minus3dbLowHz().isEmpty()) continue;
                        v = fr.minus3dbLowHz().getAsDouble();
                    } else {
                        if (fr.minus3dbHighHz().isEmpty()) continue;
                        v = fr.minus3dbHighHz().getAsDouble();
                    }
                }
                case DAMPING_FACTOR -> {
                    if (r.impedance().isEmpty() || !frequencyMatches(spec, l, r.impedance().get().frequencyHz())) continue;
                    if (l.loadOhms().isPresent() && Math.abs(r.impedance().get().loadOhms() - l.loadOhms().getAsDouble()) > 0.01 * l.loadOhms().getAsDouble())
                        continue;
                    v = r.impedance().get().dampingFactor();
                }
                default -> throw new IllegalStateException(l.quantity().toString());
            }
            if (!Double.isFinite(v)) continue;
            // the worst value: the one closest to failing
            boolean worse = Double.isNaN(worst) || (l.atMost() ? v > worst : v < worst);
            if (worse) {
                worst = v;
                at = where(r);
            }
        }
        if (at == null) return Verifier.notMeasured(l, missing(l));
        return Verifier.result(l, worst, at);
    }

    private static String missing(Limit l) {
        return switch (l.quantity()) {
            case IMD -> "no two-tone capture" + (l.qualifier().isEmpty() ? "" : " (" + l.qualifier() + ")");
            case SNR -> "no noise capture in volts with a load (input shorted; give --fs-volts and --load)";
            case CROSSTALK -> "no crosstalk capture (give --driven N)" + (l.frequencyHz().isPresent() ? " at " + Verifier.fmt(l.frequencyHz().getAsDouble()) + " Hz" : "");
            case RESPONSE_DEVIATION, BANDWIDTH_LOW, BANDWIDTH_HIGH -> "no sweep capture with a reference channel (give --stimulus sweep --reference N)"
                    + (l.quantity() == Quantity.RESPONSE_DEVIATION ? "" : ", or the −3 dB point lies outside the sweep");
            case DAMPING_FACTOR -> "no open-circuit / loaded pair (give --open-circuit FILE and --load)";
            default -> "not measured";
        };
    }
}
