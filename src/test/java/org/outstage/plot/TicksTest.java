package org.outstage.plot;

import static org.junit.jupiter.api.Assertions.*;

import java.util.List;
import org.junit.jupiter.api.Test;

class TicksTest {
    @Test
    void logRange_20HzTo20kHz_hasDecadeMajorsAndMinors() {
        List<Ticks.Tick> t = Ticks.of(new Range(20, 20_000), Axis.Scale.LOG10, 8);
        List<String> majors = t.stream().filter(Ticks.Tick::major).map(Ticks.Tick::label).toList();
        assertEquals(List.of("100", "1k", "10k"), majors);
        // minors 20..90 (8), 200..900 (8), 2k..9k (8), 20k (1)
        assertEquals(25, t.stream().filter(k -> !k.major()).count());
    }

    @Test
    void linearTicks_useNiceSteps() {
        List<Ticks.Tick> t = Ticks.of(new Range(-1.07, 1.07), Axis.Scale.LINEAR, 5);
        assertEquals(List.of("-1.0", "-0.5", "0", "0.5", "1.0"), t.stream().map(Ticks.Tick::label).toList());
    }

    @Test
    void labels_useSiPrefixes() {
        assertEquals("20k", Ticks.format(20_000, 10_000));
        assertEquals("2.5m", Ticks.format(0.0025, 0.0005));
        assertEquals("1.234 kHz", Ticks.withUnit(1234, "Hz"));
        assertEquals("-3.500 mV", Ticks.withUnit(-0.0035, "V"));
    }
}
