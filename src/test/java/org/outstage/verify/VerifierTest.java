package org.outstage.verify;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;

class VerifierTest {
    static KeyFigures at(double hz, double rmsVolts, double thd, double loadOhms) {
        return KeyFigures.basic(hz, rmsVolts, "V", thd, thd * 1.2).withPower(rmsVolts * rmsVolts / loadOhms, loadOhms);
    }

    static LimitResult only(String spec, List<MeasuredChannel> ch) {
        return Verifier.verify(SpecParser.parse(spec, "t.spec"), ch).results().get(0);
    }

    @Test
    void thdAtOneWatt_picksCaptureAtThatPower_marginInPercent() {
        // 1 W into 8 ohm = 2.828 V rms (docs/references.md §3)
        List<MeasuredChannel> ch = List.of(new MeasuredChannel("1w.wav", 1, at(1000, Math.sqrt(8), 0.0003, 8)),
                new MeasuredChannel("10w.wav", 1, at(1000, Math.sqrt(80), 0.002, 8)));
        LimitResult r = only("thd <= 0.05 % at 1 kHz, 1 W, 8 ohm", ch);
        assertEquals(Verdict.PASS, r.verdict());
        assertEquals(0.0003, r.measured().getAsDouble(), 1e-15);
        assertEquals(0.02, r.margin().getAsDouble(), 1e-12);
        assertTrue(r.evidence().contains("1w.wav"));
        LimitResult f = only("thd <= 0.02 % at 1 kHz, 1 W, 8 ohm", ch);
        assertEquals(Verdict.FAIL, f.verdict());
        assertEquals(-0.01, f.margin().getAsDouble(), 1e-12);
    }

    @Test
    void noMatchingCapture_isNotMeasured_withReason() {
        List<MeasuredChannel> ch = List.of(new MeasuredChannel("a.wav", 1, at(100, 2.828, 0.0003, 8)));
        LimitResult r = only("thd <= 0.05 % at 1 kHz, 1 W, 8 ohm", ch);
        assertEquals(Verdict.NOT_MEASURED, r.verdict());
        assertTrue(r.evidence().contains("1000 Hz"), r.evidence());
    }

    @Test
    void powerAtOnePercent_powerLawThd_isExact() {
        // THD = 1e-4 * P^2 (a power law is a straight line in log THD vs log P, so log-log interpolation is exact):
        // THD = 1 % at P = sqrt(0.01 / 1e-4) = 10 W.
        List<MeasuredChannel> ch = new ArrayList<>();
        for (double p : new double[] {1, 4, 9, 16}) {
            ch.add(new MeasuredChannel(p + "w.wav", 1, at(1000, Math.sqrt(p * 8), 1e-4 * p * p, 8)));
        }
        LimitResult r = only("power >= 55 W at 1 kHz, 1 % thd, 8 ohm", ch);
        assertEquals(10.0, r.measured().getAsDouble(), 1e-9);
        assertEquals(Verdict.FAIL, r.verdict());
        assertEquals(-45.0, r.margin().getAsDouble(), 1e-9);
        LimitResult never = only("power >= 5 W at 1 kHz, 5 % thd, 8 ohm", ch);
        assertEquals(Verdict.NOT_MEASURED, never.verdict());
        assertTrue(never.evidence().contains("raise the level"), never.evidence());
    }

    @Test
    void balance_isLevelDifferenceOfTwoChannels() {
        List<MeasuredChannel> ch = List.of(new MeasuredChannel("st.wav", 1, at(1000, 2.0, 1e-4, 8)),
                new MeasuredChannel("st.wav", 2, at(1000, 2.1, 1e-4, 8)));
        LimitResult r = only("balance <= 0.5 dB at 1 kHz", ch);
        // 20*log10(2.1/2.0) = 0.42379 dB (computed)
        assertEquals(20 * Math.log10(2.1 / 2.0), r.measured().getAsDouble(), 1e-12);
        assertEquals(Verdict.PASS, r.verdict());
    }

    @Test
    void noise_needsToneFreeCalibratedCapture() {
        KeyFigures silent = KeyFigures.basic(50, 1e-4, "V", 0, 0).withResidualRms(4e-4);
        KeyFigures silentFs = KeyFigures.basic(50, 1e-6, "FS", 0, 0).withResidualRms(4e-6);
        KeyFigures tone = at(1000, 2.8, 1e-4, 8).withResidualRms(1e-3);
        LimitResult r = only("noise <= 1 mV", List.of(new MeasuredChannel("short.wav", 1, silent), new MeasuredChannel("t.wav", 1, tone)));
        assertEquals(Verdict.PASS, r.verdict());
        // hum line and residual add in power (Parseval): sqrt(0.1^2 + 0.4^2) mV = 0.41231 mV
        assertEquals(Math.sqrt(1e-8 + 16e-8), r.measured().getAsDouble(), 1e-15);
        assertEquals(1 - Math.sqrt(0.01 + 0.16), r.margin().getAsDouble(), 1e-12);
        LimitResult u = only("noise <= 1 mV", List.of(new MeasuredChannel("short.wav", 1, silentFs)));
        assertEquals(Verdict.NOT_MEASURED, u.verdict());
        assertTrue(u.evidence().contains("--fs-volts"), u.evidence());
    }

    @Test
    void clipAsymmetry_worstAbsoluteValue() {
        List<MeasuredChannel> ch = List.of(new MeasuredChannel("a.wav", 1, at(1000, 20, 0.05, 8).withClipAsymmetry(-0.07)),
                new MeasuredChannel("b.wav", 1, at(1000, 20, 0.05, 8).withClipAsymmetry(0.03)));
        LimitResult r = only("clip-asymmetry <= 5 %", ch);
        assertEquals(Verdict.FAIL, r.verdict());
        assertEquals(0.07, r.measured().getAsDouble(), 1e-15);
    }
}
