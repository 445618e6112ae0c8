package org.outstage.verify;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.Optional;
import java.util.OptionalDouble;
import org.junit.jupiter.api.Test;
import org.outstage.analysis.Crosstalk;
import org.outstage.analysis.FrequencyResponse;
import org.outstage.analysis.Intermodulation;
import org.outstage.analysis.NoiseFigures;
import org.outstage.analysis.OutputImpedance;

/** The issue-12 limits: parsing (docs/spec-format.md) and the verdicts on given figures (the figures themselves are tested in analysis). */
class SpecSheetLimitsTest {
    static final String SPEC = """
            name T
            rated-power 60 W
            rated-load 8 ohm
            imd                <= 0.05 %   at smpte
            imd                <= 0.1 %    at difference-frequency
            snr                >= 100 dB   at rated power, a-weighted
            snr                >= 80 dB    at 1 W
            crosstalk          <= -60 dB   at 1 kHz
            response-deviation <= 0.5 dB
            bandwidth-low      <= 10 Hz
            bandwidth-high     >= 50 kHz
            damping-factor     >= 100      at 1 kHz, 8 ohm
            """;

    static Intermodulation imd(Intermodulation.Method m, double ratio) {
        return new Intermodulation(m, 60, 7000, 0.4, 0.1, 4, ratio, List.of(ratio), List.of(), true);
    }

    @Test
    void parses_everyNewQuantity() {
        SpecProfile p = SpecParser.parse(SPEC, "t.spec");
        assertEquals(9, p.limits().size());
        assertEquals("smpte", p.limits().get(0).qualifier());
        assertEquals(0.0005, p.limits().get(0).bound(), 1e-15);
        assertEquals(60, p.limits().get(2).powerWatts().getAsDouble());
        assertEquals("a-weighted", p.limits().get(2).qualifier());
        assertEquals(-60, p.limits().get(4).bound());
        assertEquals(50000, p.limits().get(7).bound());
        assertEquals(100, p.limits().get(8).bound());
        assertThrows(IllegalArgumentException.class, () -> SpecParser.parse("crosstalk <= 60 dB at 1 kHz", "x"), "crosstalk must be negative");
        assertThrows(IllegalArgumentException.class, () -> SpecParser.parse("snr >= 90 dB", "x"), "snr needs its power");
        assertThrows(IllegalArgumentException.class, () -> SpecParser.parse("damping-factor >= 100 ohm", "x"));
    }

    @Test
    void verdicts_onGivenFigures() {
        SpecProfile p = SpecParser.parse(SPEC, "t.spec");
        // noise 20 µV rms A-weighted: S/N re 60 W into 8 Ω = 20·lg(√480/20e-6) = 120.8 dB (common practice, §13)
        NoiseFigures noise = new NoiseFigures(50e-6, 20e-6, 20, 20000, OptionalDouble.empty(), List.of(), OptionalDouble.empty(),
                OptionalDouble.empty(), OptionalDouble.empty(), OptionalDouble.empty());
        FrequencyResponse resp = new FrequencyResponse(List.of(), 26, OptionalDouble.of(4.2), OptionalDouble.of(41000), 20, 20000, -0.3, 0.1,
                List.of(), 2, 46000, 10, true);
        List<SpecReading> r = List.of(
                SpecReading.of("smpte.wav", 1, "V", OptionalDouble.empty()).withImd(Optional.of(imd(Intermodulation.Method.MODULATION, 0.0003))),
                SpecReading.of("twin.wav", 1, "V", OptionalDouble.empty()).withImd(Optional.of(imd(Intermodulation.Method.DIFFERENCE_FREQUENCY, 0.002))),
                SpecReading.of("noise.wav", 1, "V", OptionalDouble.of(8)).withNoise(Optional.of(noise)),
                SpecReading.of("xtalk.wav", 2, "V", OptionalDouble.empty()).withCrosstalk(Optional.of(new Crosstalk(1, 1000, 1e-3, true))),
                SpecReading.of("sweep.wav", 2, "V", OptionalDouble.empty()).withResponse(Optional.of(resp)),
                SpecReading.of("loaded.wav", 1, "V", OptionalDouble.of(8)).withImpedance(Optional.of(OutputImpedance.of(8, 1000, 2, 1.996))));
        List<LimitResult> res = Verifier.verify(p, List.of(), r).results();
        assertEquals(Verdict.PASS, res.get(0).verdict());                       // 0.03 % <= 0.05 %
        assertEquals(Verdict.FAIL, res.get(1).verdict());                       // 0.2 % > 0.1 %
        assertEquals(20 * Math.log10(Math.sqrt(480) / 20e-6), res.get(2).measured().getAsDouble(), 1e-9);
        assertEquals(20 * Math.log10(Math.sqrt(8) / 50e-6), res.get(3).measured().getAsDouble(), 1e-9);
        assertEquals(-60, res.get(4).measured().getAsDouble(), 1e-9);
        assertEquals(Verdict.PASS, res.get(4).verdict());                       // −60 <= −60
        assertEquals(0.3, res.get(5).measured().getAsDouble(), 1e-12);
        assertEquals(Verdict.PASS, res.get(6).verdict());
        assertEquals(Verdict.FAIL, res.get(7).verdict());                       // 41 kHz < 50 kHz
        assertEquals(499, res.get(8).measured().getAsDouble(), 1e-6);
        List<LimitResult> none = Verifier.verify(p, List.of(), List.of()).results();
        assertTrue(none.stream().allMatch(x -> x.verdict() == Verdict.NOT_MEASURED));
    }
}
