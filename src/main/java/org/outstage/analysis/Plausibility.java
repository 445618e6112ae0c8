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
 * zero crossings, enough for the bin averages to beat the quantisation of an 8-bit scope export) they are not given.
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

    /** Whether the record is long enough for the crossover figures ({@link #MIN_CYCLES_FOR_CROSSOVER}). */
    public static boolean crossoverGiven(Measurement m) {
        return cycles(m) >= MIN_CYCLES_FOR_CROSSOVER;
    }

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
        if (!crossoverGiven(m))
            out.add(String.format(Locale.ROOT, "the record spans %.1f cycles: too short for the crossover figures (at least %d cycles are needed)",
                    cycles(m), MIN_CYCLES_FOR_CROSSOVER));
        return List.copyOf(out);
    }

    private static String num(double v) {
        if (Math.abs(v) >= 1000) return String.format(Locale.ROOT, "%.0f", v);
        String s = String.format(Locale.ROOT, "%.4g", v);
        if (s.contains(".") && !s.contains("e")) s = s.replaceAll("0+$", "").replaceAll("\\.$", "");
        return s;
    }
}
