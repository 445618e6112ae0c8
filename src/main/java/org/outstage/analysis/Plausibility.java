package org.outstage.analysis;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.OptionalDouble;

/**
 * Cautions about a measurement whose figures no audio amplifier bench can produce, or that lacks a figure the user
 * asked for. One place, so the command line, the report and the workbench say the same thing. Pure; no I/O.
 *
 * <p>Limits (common practice, from memory; they are generous on purpose so that a real bench never trips them):
 * the largest audio power amplifiers deliver some 10 kW into their rated load, and 10 kW into 8 Ω is 283 V rms,
 * so an output above {@value #MAX_PLAUSIBLE_VOLTS_RMS} V rms or {@value #MAX_PLAUSIBLE_WATTS} W is taken as a
 * calibration mistake (a wrong {@code --fs-volts} or probe ratio). The crossover figures average the transfer curve
 * over the record's passes through zero; with fewer than {@value #MIN_CYCLES_FOR_CROSSOVER} cycles (our rule: 20
 * zero crossings, enough for the bin averages to beat the quantisation of an 8-bit scope export) they are not given;
 * nor when the samples near zero do not cover the crossing ({@link #crossoverNotGiven}).
 */
public final class Plausibility {
    private Plausibility() {}

    /** Above this fundamental RMS (volts) the calibration is taken to be wrong. */
    public static final double MAX_PLAUSIBLE_VOLTS_RMS = 300;
    /** Above this output power (watts) the calibration is taken to be wrong. */
    public static final double MAX_PLAUSIBLE_WATTS = 20_000;
    /** The fewest cycles of the tone for which the crossover figures are given. */
    public static final int MIN_CYCLES_FOR_CROSSOVER = 10;

    /** Cycles of the fitted tone in the record. */
    public static double cycles(Measurement m) {
        return m.measured() ? m.fundamental().frequencyHz() * m.durationSeconds() : 0;
    }

    /**
     * Whether the crossover figures are given: the record spans at least {@link #MIN_CYCLES_FOR_CROSSOVER} cycles, and
     * its samples cover the crossing ({@link #crossoverNotGiven}).
     */
    public static boolean crossoverGiven(Measurement m) {
        return crossoverNotGiven(m).isEmpty();
    }

    /**
     * Why the crossover figures are not given, if they are not: the record is shorter than
     * {@link #MIN_CYCLES_FOR_CROSSOVER} cycles, or its samples near zero do not cover the crossing (a tone locked to the
     * sample rate repeats a few sample values there, and a notch may lie whole between two of them: the gain at zero
     * read between them is then off by more than any uncertainty it could state; {@code
     * CrossoverMetrics.Resolution#crossingObserved}). One sentence without a trailing period.
     */
    public static java.util.Optional<String> crossoverNotGiven(Measurement m) {
        if (cycles(m) < MIN_CYCLES_FOR_CROSSOVER)
            return java.util.Optional.of(String.format(Locale.ROOT, "the record spans %.1f cycles; at least %d are needed", cycles(m),
                    MIN_CYCLES_FOR_CROSSOVER));
        if (m.stage() instanceof org.outstage.analysis.stage.StageDiagnosis.Measured d && !d.crossover().resolution().crossingObserved())
            return java.util.Optional.of(UNOBSERVED_CROSSING);
        return java.util.Optional.empty();
    }

    /** {@link #crossoverNotGiven} when the samples do not cover the crossing. */
    static final String UNOBSERVED_CROSSING = "the samples near zero do not cover the crossing: they sit on a few values there "
            + "(a tone locked to the sample rate, such as 1 kHz at 48 kHz, repeats a few sample phases), and a notch may lie between them; "
            + "use a tone such as 997 Hz, whose samples fall on new phases cycle after cycle";

    /**
     * The cautions for a measurement, each one sentence without a trailing period.
     *
     * @param loadOhms the load the user gave, if any (to say why there is no power)
     */
    public static List<String> cautions(Measurement m, OptionalDouble loadOhms) {
        List<String> out = new ArrayList<>();
        if (!m.measured()) return out;
        if (loadOhms.isPresent() && m.powerWatts().isEmpty())
            out.add(String.format(Locale.ROOT, "no output power although a %s ohm load was given: the capture is in %s, not volts; "
                    + "give --fs-volts (the volts at digital full scale) for a WAV, or a scope export in volts", num(loadOhms.getAsDouble()), m.unit()));
        if (m.unit().equals("V") && m.fundamental().rms() > MAX_PLAUSIBLE_VOLTS_RMS)
            out.add(String.format(Locale.ROOT, "%s V rms is beyond any audio amplifier (above %s V rms): check the calibration (--fs-volts, --probe)",
                    num(m.fundamental().rms()), num(MAX_PLAUSIBLE_VOLTS_RMS)));
        if (m.powerWatts().isPresent() && m.powerWatts().get().totalWatts() > MAX_PLAUSIBLE_WATTS)
            out.add(String.format(Locale.ROOT, "%s W is beyond any audio amplifier (above %s W): check the calibration and --load",
                    num(m.powerWatts().get().totalWatts()), num(MAX_PLAUSIBLE_WATTS)));
        if (cycles(m) < MIN_CYCLES_FOR_CROSSOVER)
            out.add(String.format(Locale.ROOT, "the record spans %.1f cycles: too short for the crossover figures (at least %d cycles are needed)",
                    cycles(m), MIN_CYCLES_FOR_CROSSOVER));
        else if (!crossoverGiven(m))
            out.add("no crossover figures: " + UNOBSERVED_CROSSING);
        return List.copyOf(out);
    }

    private static String num(double v) {
        if (Math.abs(v) >= 1000) return String.format(Locale.ROOT, "%.0f", v);
        String s = String.format(Locale.ROOT, "%.4g", v);
        if (s.contains(".") && !s.contains("e")) s = s.replaceAll("0+$", "").replaceAll("\\.$", "");
        return s;
    }
}
