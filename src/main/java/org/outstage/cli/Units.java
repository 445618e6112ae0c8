package org.outstage.cli;

import java.util.regex.Matcher;
import java.util.regex.Pattern;
import picocli.CommandLine.ITypeConverter;
import picocli.CommandLine.TypeConversionException;

/**
 * picocli converters for option values with units, so a technician can type what is written on the bench:
 * {@code --fs-volts 40V}, {@code --load 8ohm}, {@code --load 8Ω}, {@code --fundamental 1kHz}, {@code --bias-mv 26mV}.
 * A plain number is in the option's own unit. A bad value is refused with one line that says what was expected
 * ("a number of volts"), never "is not a double".
 *
 * <p>Accepted: a decimal number (point, optional exponent), then optionally a prefix (p n u µ m k M) and the unit's
 * symbol or name, spaces allowed between. {@code k} and {@code M} may stand alone ({@code 1k} = 1000). A decimal
 * comma is refused by name.
 */
final class Units {
    private Units() {}

    private static final Pattern VALUE = Pattern.compile("([-+]?(?:\\d+\\.?\\d*|\\.\\d+)(?:[eE][-+]?\\d+)?)\\s*(.*)");

    /**
     * Parses {@code text} as a quantity and returns it in the option's unit, whose SI factor is {@code outFactor}
     * (1 for volts, 1e-3 for millivolts): a plain number is taken as it is, {@code 26mV} or {@code 0.026V} is converted.
     */
    static double parse(String text, String quantity, double outFactor, String examples, String... symbols) {
        String t = text == null ? "" : text.trim();
        String expected = "'" + text + "' is not " + quantity + " (e.g. " + examples + ")";
        if (t.matches("[-+]?\\d*,\\d+.*"))
            throw new TypeConversionException(expected + "; write the decimal comma as a point");
        Matcher m = VALUE.matcher(t);
        if (!m.matches()) throw new TypeConversionException(expected);
        double number = Double.parseDouble(m.group(1));
        String suffix = m.group(2).trim();
        double factor = suffixFactor(suffix, symbols);
        if (Double.isNaN(factor)) throw new TypeConversionException(expected);
        // a plain number (or one with a bare k or M) is in the option's own unit; a unit symbol is converted from SI
        boolean withSymbol = !suffix.isEmpty() && !suffix.equals("k") && !suffix.equals("K") && !suffix.equals("M");
        double v = withSymbol ? number * factor / outFactor : number * factor;
        if (!Double.isFinite(v)) throw new TypeConversionException(expected + "; it is out of range");
        return v;
    }

    /** SI factor of a suffix such as "", "V", "mV", "kohm", "k"; NaN when it is not one of {@code symbols} with a prefix. */
    static double suffixFactor(String suffix, String... symbols) {
        if (suffix.isEmpty()) return 1;
        for (String s : symbols) if (suffix.equalsIgnoreCase(s) || suffix.equals(s)) return 1;
        if (suffix.equals("k") || suffix.equals("K")) return 1e3;
        if (suffix.equals("M")) return 1e6;
        String prefix;
        String rest;
        prefix = suffix.substring(0, 1);
        rest = suffix.substring(1).trim();
        boolean known = false;
        for (String s : symbols) if (rest.equalsIgnoreCase(s)) known = true;
        if (!known) return Double.NaN;
        switch (prefix) {
            case "p": return 1e-12;
            case "n": return 1e-9;
            case "u": case "µ": case "μ": return 1e-6;
            case "m": return 1e-3;
            case "k": case "K": return 1e3;
            case "M": return 1e6;
            default: return Double.NaN;
        }
    }

    /** Volts: {@code 40}, {@code 40V}, {@code 400mV}, {@code 0.04kV}. */
    static final class Volts implements ITypeConverter<Double> {
        @Override public Double convert(String v) { return parse(v, "a number of volts", 1, "40, 40V, 400mV", "V", "volt", "volts"); }
    }

    /** Millivolts: a plain number is mV; {@code 26mV}, {@code 0.026V}. */
    static final class MilliVolts implements ITypeConverter<Double> {
        @Override public Double convert(String v) { return parse(v, "a number of millivolts", 1e-3, "26, 26mV, 0.026V", "V", "volt", "volts"); }
    }

    /** Amperes: {@code 0.12}, {@code 0.12A}, {@code 120mA}. */
    static final class Amps implements ITypeConverter<Double> {
        @Override public Double convert(String v) { return parse(v, "a number of amperes", 1, "0.12, 0.12A, 120mA", "A", "amp", "amps", "ampere", "amperes"); }
    }

    /** Milliamperes: a plain number is mA; {@code 120mA}, {@code 0.12A}. */
    static final class MilliAmps implements ITypeConverter<Double> {
        @Override public Double convert(String v) { return parse(v, "a number of milliamperes", 1e-3, "120, 120mA, 0.12A", "A", "amp", "amps", "ampere", "amperes"); }
    }

    /** Ohms: {@code 8}, {@code 8ohm}, {@code 8 ohms}, {@code 8Ω}, {@code 8R}, {@code 1k}, {@code 1kohm}. */
    static final class Ohms implements ITypeConverter<Double> {
        @Override public Double convert(String v) { return parse(v, "a number of ohms", 1, "8, 8ohm, 8Ω, 4.7k", "ohm", "ohms", "Ω", "\u2126", "R"); }
    }

    /** Watts: {@code 100}, {@code 100W}, {@code 500mW}, {@code 1kW}. */
    static final class Watts implements ITypeConverter<Double> {
        @Override public Double convert(String v) { return parse(v, "a number of watts", 1, "100, 100W, 500mW", "W", "watt", "watts"); }
    }

    /** Hertz: {@code 1000}, {@code 1kHz}, {@code 1k}, {@code 48 kHz}. */
    static final class Hertz implements ITypeConverter<Double> {
        @Override public Double convert(String v) { return parse(v, "a frequency in hertz", 1, "1000, 1kHz, 48 kHz", "Hz", "hertz"); }
    }

    /** A logbook session id: a whole number, as printed by {@code outstage session list}. */
    static final class SessionId implements ITypeConverter<Long> {
        @Override
        public Long convert(String v) {
            try {
                return Long.parseLong(v.trim());
            } catch (NumberFormatException e) {
                throw new TypeConversionException("'" + v + "' is not a session id (a number, as listed by 'outstage session list')");
            }
        }
    }
}
