package org.outstage.logbook;

import java.util.Locale;
import java.util.Objects;
import org.outstage.Require;

/**
 * A bias reading as the technician takes it: the voltage across the emitter resistor(s) in millivolts,
 * or the quiescent current in milliamps. Kept in the unit it was read in; nothing converts between them
 * (that needs the emitter resistance, which the log does not assume).
 */
public record BiasReading(double value, Unit unit) {
    public enum Unit {
        MILLIVOLTS("mV"), MILLIAMPS("mA");

        private final String symbol;

        Unit(String symbol) { this.symbol = symbol; }

        public String symbol() { return symbol; }

        public static Unit parse(String s) {
            for (Unit u : values()) if (u.symbol.equalsIgnoreCase(s.trim())) return u;
            throw new IllegalArgumentException("bias unit '" + s + "' must be mV or mA");
        }
    }

    public BiasReading {
        Require.nonNegative("bias reading", value);
        Objects.requireNonNull(unit, "unit");
    }

    public static BiasReading millivolts(double mv) { return new BiasReading(mv, Unit.MILLIVOLTS); }

    public static BiasReading milliamps(double ma) { return new BiasReading(ma, Unit.MILLIAMPS); }

    @Override
    public String toString() { return String.format(Locale.ROOT, "%s %s", trim(value), unit.symbol); }

    static String trim(double v) {
        String s = Double.toString(v);
        return s.endsWith(".0") ? s.substring(0, s.length() - 2) : s;
    }
}
