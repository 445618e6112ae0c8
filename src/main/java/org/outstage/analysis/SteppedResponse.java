package org.outstage.analysis;

import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import java.util.Optional;
import java.util.OptionalDouble;
import org.outstage.Require;

/**
 * Frequency response from a stepped-tone series: one capture per test frequency, each measured as {@code analyze}
 * measures a tone (the sine fit of IEEE Std 1057, docs/references.md §4). With the generator captured
 * beside the output, each point is the output over the generator: gain = 20·lg(U_out/U_gen) and phase = φ_out − φ_gen
 * (both fitted on the same samples, so the soundcard's own response cancels, as with a swept reference); without it,
 * the output level in dB of its unit, and no phase. THD against frequency comes from each tone's THD.
 *
 * <p>Between the tones the response is read by linear interpolation in log f (the −3 dB points and the gain at 1 kHz
 * when 1 kHz is not one of the tones): the resolution is the series' own. The deviation is over the tones inside the
 * band. This is the classic point-by-point method (common practice): the level at each frequency relative to the
 * level at 1 kHz; the sweep ({@link SweepResponse}, Farina 2000) gives the same figures from one capture.
 */
public final class SteppedResponse {
    private SteppedResponse() {}

    /**
     * One tone of the series.
     *
     * @param frequencyHz the fitted fundamental
     * @param gainDb      20·lg of the output over the generator, or of the output level in its unit without a generator
     * @param phaseDeg    output phase minus generator phase, wrapped to (−180, 180]; empty without a generator
     * @param thdRatio    the output's THD (ratio)
     */
    public record Tone(double frequencyHz, double gainDb, OptionalDouble phaseDeg, double thdRatio) {}

    /**
     * The point of one capture: its output channel's measurement and, when the generator was captured beside it, the
     * generator channel's.
     *
     * @throws IllegalArgumentException when a channel has no tone to measure, or the two tones differ in frequency
     */
    public static Tone tone(Measurement output, Optional<Measurement> generator) {
        Require.notNull("output", output);
        if (!output.measured()) throw new IllegalArgumentException("no tone: " + output.notMeasuredReason().orElse(""));
        double f = output.fundamental().frequencyHz();
        if (generator.isEmpty())
            return new Tone(f, Levels.ratioToDb(output.fundamental().rms()), OptionalDouble.empty(), output.thd().ratio());
        Measurement g = generator.get();
        if (!g.measured()) throw new IllegalArgumentException("no tone on the generator channel: " + g.notMeasuredReason().orElse(""));
        if (Math.abs(g.fundamental().frequencyHz() - f) > 1e-3 * f)
            throw new IllegalArgumentException(String.format(java.util.Locale.ROOT, "the output's tone (%.6g Hz) is not the generator's (%.6g Hz)", f,
                    g.fundamental().frequencyHz()));
        double ph = Math.IEEEremainder(output.fundamental().phaseDeg() - g.fundamental().phaseDeg(), 360);
        if (ph <= -180) ph += 360;
        return new Tone(f, Levels.ratioToDb(output.fundamental().rms() / g.fundamental().rms()), OptionalDouble.of(ph), output.thd().ratio());
    }

    /**
     * The response of a series of at least two tones at different frequencies.
     *
     * @param fromReference whether the gains are output over a captured generator
     * @param deviationBand band of the deviation figure
     */
    public static FrequencyResponse of(List<Tone> tones, boolean fromReference, Band deviationBand) {
        Require.notNull("tones", tones);
        List<Tone> t = new ArrayList<>(tones);
        t.sort(Comparator.comparingDouble(Tone::frequencyHz));
        if (t.size() < 2) throw new IllegalArgumentException("a stepped-tone series needs at least two tones, got " + t.size());
        for (int i = 1; i < t.size(); i++)
            if (t.get(i).frequencyHz() <= t.get(i - 1).frequencyHz() * (1 + 1e-6))
                throw new IllegalArgumentException(String.format(java.util.Locale.ROOT, "two tones at %.6g Hz: one capture per frequency",
                        t.get(i).frequencyHz()));
        double lo = t.get(0).frequencyHz(), hi = t.get(t.size() - 1).frequencyHz();
        double fRef = 1000 >= lo && 1000 <= hi ? 1000 : Math.sqrt(lo * hi);
        double ref = gainAt(t, fRef);
        List<FrequencyResponse.Point> pts = new ArrayList<>();
        List<FrequencyResponse.ThdPoint> thd = new ArrayList<>();
        for (Tone x : t) {
            pts.add(new FrequencyResponse.Point(x.frequencyHz(), x.gainDb(), x.gainDb() - ref, x.phaseDeg().orElse(Double.NaN)));
            thd.add(new FrequencyResponse.ThdPoint(x.frequencyHz(), x.thdRatio()));
        }
        double target = ref + 20 * Math.log10(Math.sqrt(0.5));
        OptionalDouble low = crossing(t, fRef, target, true), high = crossing(t, fRef, target, false);
        double dLo = deviationBand.lowHz(), dHi = deviationBand.highHz();
        double dMin = Double.POSITIVE_INFINITY, dMax = Double.NEGATIVE_INFINITY;
        for (FrequencyResponse.Point p : pts) {
            if (p.frequencyHz() < dLo || p.frequencyHz() > dHi) continue;
            dMin = Math.min(dMin, p.gainRe1kHzDb());
            dMax = Math.max(dMax, p.gainRe1kHzDb());
        }
        if (dMin > dMax) { dMin = Double.NaN; dMax = Double.NaN; }
        return new FrequencyResponse(pts, ref, low, high, Math.max(dLo, lo), Math.min(dHi, hi), dMin, dMax, thd, lo, hi, Double.NaN, fromReference);
    }

    /** Gain at f by linear interpolation in log f between the neighbouring tones (f inside the series). */
    static double gainAt(List<Tone> t, double f) {
        for (int i = 1; i < t.size(); i++) {
            Tone a = t.get(i - 1), b = t.get(i);
            if (f >= a.frequencyHz() && f <= b.frequencyHz()) {
                double u = Math.log(f / a.frequencyHz()) / Math.log(b.frequencyHz() / a.frequencyHz());
                return a.gainDb() + u * (b.gainDb() - a.gainDb());
            }
        }
        return t.get(f < t.get(0).frequencyHz() ? 0 : t.size() - 1).gainDb();
    }

    /** The first frequency, walking down (or up) from fRef, where the interpolated gain falls to target; empty if none. */
    private static OptionalDouble crossing(List<Tone> t, double fRef, double target, boolean down) {
        // tones strictly on the walking side of fRef, nearest first, starting from the interpolated point at fRef
        double fPrev = fRef, gPrev = gainAt(t, fRef);
        List<Tone> side = new ArrayList<>();
        for (Tone x : t) if (down ? x.frequencyHz() < fRef : x.frequencyHz() > fRef) side.add(x);
        if (down) java.util.Collections.reverse(side);
        for (Tone x : side) {
            if (x.gainDb() <= target && gPrev > target) {
                double u = (gPrev - target) / (gPrev - x.gainDb());
                return OptionalDouble.of(Math.exp(Math.log(fPrev) + u * (Math.log(x.frequencyHz()) - Math.log(fPrev))));
            }
            fPrev = x.frequencyHz();
            gPrev = x.gainDb();
        }
        return OptionalDouble.empty();
    }
}
