package org.outstage.stimulus;

import java.util.Locale;
import java.util.OptionalDouble;

/**
 * A test signal, as written on the command line. Closed family; every member knows its own text form
 * ({@link #spec()}) and {@link #parse(String)} reads it back.
 *
 * <ul>
 *   <li>{@code sine:F} one tone.</li>
 *   <li>{@code twin:F1,F2} two tones of equal amplitude.</li>
 *   <li>{@code smpte:F1,F2} a low tone F1 and a high tone F2 at 4:1 amplitude (SMPTE RP120 practice, typically
 *       60 Hz and 7 kHz; docs/references.md §13 "IMD (SMPTE-type)").</li>
 *   <li>{@code sweep:F1-F2} or {@code sweep:F1-F2,T} an exponential sine sweep of length T seconds (Farina 2000;
 *       docs/references.md §13); without T, the length is given by whoever renders it.</li>
 *   <li>{@code burst:F,ON,OFF} ON whole cycles of a tone starting at zero phase, then OFF cycles of silence,
 *       repeated (common practice for tone bursts).</li>
 *   <li>{@code silence}.</li>
 * </ul>
 * Frequencies accept a {@code k} suffix ({@code 7k} = 7000 Hz).
 */
public sealed interface Stimulus permits Stimulus.Sine, Stimulus.Twin, Stimulus.Smpte, Stimulus.Sweep, Stimulus.Burst, Stimulus.Silence {

    /** The text form, parseable by {@link #parse(String)}. */
    String spec();

    /**
     * Amplitude of the signal at level 1.0 (0 dBFS peak), as a multiple of the level: the components are scaled so
     * the sum of their peaks is 1, so the waveform never exceeds the stated peak level.
     */
    default double peakFraction() { return 1.0; }

    /** The frequency an analysis should lock on (the tone, the low tone of SMPTE, the first of twin), if any. */
    OptionalDouble mainFrequencyHz();

    /** One tone of {@code frequencyHz}. */
    record Sine(double frequencyHz) implements Stimulus {
        public Sine { checkFrequency("sine frequency", frequencyHz); }
        @Override public String spec() { return "sine:" + num(frequencyHz); }
        @Override public OptionalDouble mainFrequencyHz() { return OptionalDouble.of(frequencyHz); }
    }

    /** Two tones of equal amplitude, each at half the peak level. */
    record Twin(double firstHz, double secondHz) implements Stimulus {
        public Twin {
            checkFrequency("twin first frequency", firstHz);
            checkFrequency("twin second frequency", secondHz);
            if (firstHz == secondHz) throw new IllegalArgumentException("twin:" + num(firstHz) + "," + num(secondHz) + ": the two frequencies must differ");
        }
        @Override public String spec() { return "twin:" + num(firstHz) + "," + num(secondHz); }
        @Override public OptionalDouble mainFrequencyHz() { return OptionalDouble.of(firstHz); }
    }

    /** Low tone {@code lowHz} at 4/5 of the peak level and high tone {@code highHz} at 1/5 (amplitude ratio 4:1, SMPTE RP120 practice). */
    record Smpte(double lowHz, double highHz) implements Stimulus {
        public Smpte {
            checkFrequency("smpte low frequency", lowHz);
            checkFrequency("smpte high frequency", highHz);
            if (!(highHz > lowHz)) throw new IllegalArgumentException("smpte:" + num(lowHz) + "," + num(highHz) + ": the second (high) frequency must be above the first");
        }
        @Override public String spec() { return "smpte:" + num(lowHz) + "," + num(highHz); }
        @Override public OptionalDouble mainFrequencyHz() { return OptionalDouble.of(lowHz); }
    }

    /**
     * Exponential sine sweep from {@code startHz} to {@code endHz}. {@code lengthSeconds} is empty when the length is
     * left to the caller (the {@code tone --seconds}, or the block length in {@code live}).
     */
    record Sweep(double startHz, double endHz, OptionalDouble lengthSeconds) implements Stimulus {
        public Sweep {
            checkFrequency("sweep start frequency", startHz);
            checkFrequency("sweep end frequency", endHz);
            if (!(endHz > startHz)) throw new IllegalArgumentException("sweep:" + num(startHz) + "-" + num(endHz) + ": the end frequency must be above the start");
            if (lengthSeconds.isPresent() && !(lengthSeconds.getAsDouble() > 0 && Double.isFinite(lengthSeconds.getAsDouble())))
                throw new IllegalArgumentException("sweep length " + lengthSeconds.getAsDouble() + " s must be a positive number");
        }
        @Override public String spec() {
            return "sweep:" + num(startHz) + "-" + num(endHz) + (lengthSeconds.isPresent() ? "," + num(lengthSeconds.getAsDouble()) : "");
        }
        @Override public OptionalDouble mainFrequencyHz() { return OptionalDouble.empty(); }
    }

    /** {@code onCycles} whole cycles of {@code frequencyHz}, then {@code offCycles} cycles of silence, repeated. */
    record Burst(double frequencyHz, int onCycles, int offCycles) implements Stimulus {
        public Burst {
            checkFrequency("burst frequency", frequencyHz);
            if (onCycles < 1) throw new IllegalArgumentException("burst on cycles " + onCycles + " must be 1 or more");
            if (offCycles < 0) throw new IllegalArgumentException("burst off cycles " + offCycles + " must be 0 or more");
        }
        @Override public String spec() { return "burst:" + num(frequencyHz) + "," + onCycles + "," + offCycles; }
        @Override public OptionalDouble mainFrequencyHz() { return OptionalDouble.of(frequencyHz); }
    }

    /** No signal. */
    record Silence() implements Stimulus {
        @Override public String spec() { return "silence"; }
        @Override public OptionalDouble mainFrequencyHz() { return OptionalDouble.empty(); }
    }

    /**
     * Reads the text form. The message of the {@link IllegalArgumentException} names the text and the rule.
     */
    static Stimulus parse(String text) {
        if (text == null || text.isBlank()) throw new IllegalArgumentException("empty signal: expected sine:F, twin:F1,F2, smpte:F1,F2, sweep:F1-F2, burst:F,ON,OFF or silence");
        String t = text.trim().toLowerCase(Locale.ROOT);
        if (t.equals("silence")) return new Silence();
        int colon = t.indexOf(':');
        if (colon < 0) throw new IllegalArgumentException("signal \"" + text + "\": expected KIND:PARAMETERS (sine:F, twin:F1,F2, smpte:F1,F2, sweep:F1-F2, burst:F,ON,OFF) or silence");
        String kind = t.substring(0, colon);
        String[] p = t.substring(colon + 1).split(",", -1);
        try {
            switch (kind) {
                case "sine":
                    count(text, p, 1, 1);
                    return new Sine(freq(p[0]));
                case "twin":
                    count(text, p, 2, 2);
                    return new Twin(freq(p[0]), freq(p[1]));
                case "smpte":
                    count(text, p, 2, 2);
                    return new Smpte(freq(p[0]), freq(p[1]));
                case "sweep": {
                    count(text, p, 1, 2);
                    int dash = p[0].indexOf('-', 1);
                    if (dash < 0) throw new IllegalArgumentException("expected F1-F2");
                    OptionalDouble len = p.length == 2 ? OptionalDouble.of(number(p[1])) : OptionalDouble.empty();
                    return new Sweep(freq(p[0].substring(0, dash)), freq(p[0].substring(dash + 1)), len);
                }
                case "burst":
                    count(text, p, 3, 3);
                    return new Burst(freq(p[0]), integer(p[1]), integer(p[2]));
                default:
                    throw new IllegalArgumentException("unknown kind \"" + kind + "\" (sine, twin, smpte, sweep, burst, silence)");
            }
        } catch (IllegalArgumentException e) {
            String m = e.getMessage();
            throw new IllegalArgumentException(m.contains(text.trim()) ? m : "signal \"" + text.trim() + "\": " + m, e);
        }
    }

    private static void count(String text, String[] p, int min, int max) {
        if (p.length < min || p.length > max)
            throw new IllegalArgumentException("expected " + (min == max ? min : min + " or " + max) + " comma-separated value" + (max > 1 ? "s" : "") + ", got " + p.length);
    }

    private static double freq(String s) {
        String v = s.trim();
        double mul = 1;
        if (v.endsWith("hz")) v = v.substring(0, v.length() - 2);
        if (v.endsWith("k")) {
            mul = 1000;
            v = v.substring(0, v.length() - 1);
        }
        return number(v) * mul;
    }

    private static double number(String s) {
        try {
            double d = Double.parseDouble(s.trim());
            if (!Double.isFinite(d)) throw new NumberFormatException();
            return d;
        } catch (NumberFormatException e) {
            throw new IllegalArgumentException("\"" + s.trim() + "\" is not a number");
        }
    }

    private static int integer(String s) {
        try {
            return Integer.parseInt(s.trim());
        } catch (NumberFormatException e) {
            throw new IllegalArgumentException("\"" + s.trim() + "\" is not a whole number of cycles");
        }
    }

    private static void checkFrequency(String name, double hz) {
        if (!(hz > 0 && Double.isFinite(hz))) throw new IllegalArgumentException(name + " " + hz + " Hz must be a positive number");
    }

    private static String num(double v) {
        return v == Math.rint(v) && Math.abs(v) < 1e15 ? Long.toString((long) v) : Double.toString(v);
    }
}
