package org.outstage.verify;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;

class SpecParserTest {
    static Path sample() {
        return Path.of(System.getProperty("outstage.project.dir", "."), "sample-captures", "spec", "da-60.spec");
    }

    @Test
    void sampleProfile_readsEveryLimitInSiUnits() {
        SpecProfile p = SpecParser.read(sample());
        assertEquals("DA-60 (invented demo amplifier)", p.name());
        assertEquals(60.0, p.ratedPowerWatts().getAsDouble());
        assertEquals(7, p.limits().size());
        Limit thd = p.limits().get(0);
        assertEquals(Quantity.THD, thd.quantity());
        assertEquals(0.0005, thd.bound(), 1e-15);
        assertEquals(1000.0, thd.frequencyHz().getAsDouble());
        assertEquals(1.0, thd.powerWatts().getAsDouble());
        assertEquals(8.0, thd.loadOhms().getAsDouble());
        assertEquals(60.0, p.limits().get(1).powerWatts().getAsDouble(), "rated power resolved");
        Limit power = p.limits().get(3);
        assertEquals(Quantity.POWER, power.quantity());
        assertEquals(false, power.atMost());
        assertEquals(0.01, power.thdThreshold().getAsDouble(), 1e-15);
        assertEquals(0.001, p.limits().get(5).bound(), 1e-15, "1 mV noise");
        assertEquals(0.5, p.limits().get(6).bound());
    }

    @Test
    void thdInDecibels_convertsToRatio() {
        // -60 dB = 0.1 % (docs/references.md §11)
        SpecProfile p = SpecParser.parse("thd <= -60 dB at 1 kHz\n", "x.spec");
        assertEquals(0.001, p.limits().get(0).bound(), 1e-12);
        assertEquals(-60.0, p.limits().get(0).boundDisplay(), 1e-9);
    }

    @Test
    void errors_nameFileAndLine() {
        record Case(String text, String expected) {}
        for (Case c : List.of(
                new Case("name X\n\nthd <= 0.05 furlongs\n", "x.spec, line 3: thd takes % or dB"),
                new Case("thd < 0.05 %\n", "x.spec, line 1: expected <= or >="),
                new Case("# c\nloudness <= 3 %\n", "x.spec, line 2: unknown statement 'loudness'"),
                new Case("thd <= 0.05 % at 1 parsec\n", "x.spec, line 1: unknown condition unit"),
                new Case("thd+n <= 0.1 % at rated power\n", "x.spec, line 1: 'rated power' needs a rated-power line"),
                new Case("power >= 55 W at 1 kHz\n", "x.spec, line 1: power needs the THD"),
                new Case("rated-power sixty W\nthd <= 1 %\n", "x.spec, line 1: expected a number"),
                new Case("# only comments\n", "x.spec: the spec has no limits"))) {
            IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> SpecParser.parse(c.text(), "x.spec"));
            assertTrue(e.getMessage().startsWith(c.expected()), e.getMessage());
        }
    }
}
