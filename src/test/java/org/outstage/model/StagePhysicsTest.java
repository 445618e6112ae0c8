package org.outstage.model;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import org.junit.jupiter.api.Test;
import org.outstage.analysis.TransferCurve;

/** The model against physics and facts of the trade. Each check names its source. */
class StagePhysicsTest {
    static final SolverSettings S = SolverSettings.defaults();

    static StageModel model(StageParameters.Builder b) { return StageModel.of(b.build(), S); }

    static double gainAtZero(StageModel m) { return m.transferCurve(-1e-6, 1e-6, 3).curve().incrementalGain()[1]; }

    @Test
    void thermalVoltage_matchesExactSiValues() {
        // docs/references.md §7: VT = kT/q with exact 2019 SI k and q: 25.852 mV at 300 K, 25.693 mV at 298.15 K.
        assertEquals(25.852e-3, StageParameters.builder().temperatureCelsius(300 - 273.15).build().thermalVolts(), 0.5e-6);
        assertEquals(25.693e-3, StageParameters.builder().build().thermalVolts(), 0.5e-6);
    }

    @Test
    void cfpCompositeCurrentGain_isBeta1TimesBeta2PlusBeta1() {
        // Common practice (docs/references.md §7): CFP composite gain β1·β2 + β1; driver β 120, output β 40 gives 4920.
        // Measured on the model: current the upper pair draws from the rail (output emitter) over the driver's base current.
        // The formula is for the bare pair, so no Rbe here (the default CFP has one: it takes part of the driver's current).
        StageModel m = model(StageParameters.builder().topology("cfp").betaDriver(120).betaOutput(40).outputBaseEmitterOhms(Double.POSITIVE_INFINITY));
        OperatingPoint op = m.operatingPoint(10);
        OperatingPoint.DeviceCurrent drv = op.device("upper driver"), out = op.device("upper output");
        double composite = (out.collectorAmps() + out.baseAmps()) / drv.baseAmps();
        assertEquals(4920, composite, 4920 * 1e-6);
    }

    /** Input at which the load current first reaches 10 mA, class B (no bias), found by bisection. */
    static double turnOnVolts(String topology) {
        StageModel m = model(StageParameters.builder().topology(topology).bias(new Bias.GeneratorVolts(0)));
        double lo = 0, hi = 3, target = 0.010 * 8;
        for (int i = 0; i < 50; i++) {
            double mid = (lo + hi) / 2;
            if (m.operatingPoint(mid).outputVolts() < target) lo = mid; else hi = mid;
        }
        return (lo + hi) / 2 - target; // the drop between input and output at 10 mA
    }

    @Test
    void classB_darlingtonNeedsTwoJunctionDropsCfpOne() {
        // Common practice: an emitter-follower Darlington needs about 2 × 0.65 V of drive to conduct, a CFP about 0.65 V.
        double darlington = turnOnVolts("darlington"), cfp = turnOnVolts("cfp");
        assertTrue(darlington > 1.0 && darlington < 1.5, "darlington turn-on drop " + darlington);
        assertTrue(cfp > 0.5 && cfp < 0.75, "cfp turn-on drop " + cfp);
        assertEquals(2.0, darlington / cfp, 0.3, "ratio of turn-on drops");
    }

    @Test
    void cfpAtFullDrive_keepsAboutOneVbeAndOutputDoesNotSaturate() {
        // Common practice: the CFP output device cannot saturate; the pair keeps about one Vbe (plus the Re drop)
        // from the rail at full drive. (Default placement: Re outside the local loop.)
        StageModel m = model(StageParameters.builder().topology("cfp"));
        ClipLevels clip = m.clipLevels();
        double reDrop = clip.positiveVolts() / 8 * 0.22;
        double headroom = 35 - clip.positiveVolts() - reDrop;
        assertTrue(headroom > 0.6 && headroom < 1.2, "cfp headroom less the Re drop " + headroom);
        OperatingPoint op = m.operatingPoint(40);
        double vceOutput = 35 - op.nodeVolts().get("c3");
        assertTrue(vceOutput > 0.5, "output device Vce at full drive " + vceOutput);
        // The emitter follower loses more: two junctions plus the drive's own saturation.
        double efHeadroom = 35 - model(StageParameters.builder().topology("darlington")).clipLevels().positiveVolts() - reDrop;
        assertTrue(efHeadroom > headroom + 0.5, "darlington headroom " + efHeadroom + " vs cfp " + headroom);
    }

    @Test
    void cfpWithReInsideLoop_outputDeviceSaturatesWhenReDropExceedsVbe() {
        // A finding of this model: with Re inside the loop (driver emitter at the output) Re sits in the output
        // device's collector, so at 4.2 A its 0.94 V drop pushes that device into saturation before the driver.
        StageModel m = model(StageParameters.builder().topology("cfp").cfpEmitterResistorInLoop(true));
        OperatingPoint op = m.operatingPoint(40);
        assertTrue(35 - op.nodeVolts().get("c3") < 0.1, "output device Vce " + (35 - op.nodeVolts().get("c3")));
    }

    @Test
    void cfpWithBaseEmitterResistor_outputOffUntilItsDropNears065V() {
        // Common practice: with a resistor from the output device's base to its emitter, the driver carries the current
        // until the drop across the resistor nears 0.65 V.
        StageModel m = model(StageParameters.builder().topology("cfp").outputBaseEmitterOhms(100).bias(new Bias.GeneratorVolts(0)));
        double prevShare = 0;
        boolean seenOn = false;
        for (double vin = 0.5; vin <= 2.5; vin += 0.05) {
            OperatingPoint op = m.operatingPoint(vin);
            double vrbe = 35 - op.nodeVolts().get("b3");
            double driver = op.device("upper driver").collectorAmps(), output = op.device("upper output").collectorAmps();
            double share = output / (output + driver);
            if (vrbe < 0.45) assertTrue(share < 0.02, "output share " + share + " at Rbe drop " + vrbe);
            if (share > 0.5 && !seenOn) {
                seenOn = true;
                assertTrue(vrbe > 0.55 && vrbe < 0.75, "output takes over at Rbe drop " + vrbe);
            }
            assertTrue(share >= prevShare - 1e-12, "output share must rise with drive");
            prevShare = share;
        }
        assertTrue(seenOn, "the output device never took over");
    }

    @Test
    void pairAtOliverBias_gainAtZeroEqualsLargeCurrentAsymptote() {
        // Oliver (HP Journal 1971), derivation in docs/references.md §7: with Iq·Re = VT each half's re = Re, so Zout at
        // crossover = Re and the gain there is RL/(RL + Re) = 0.97324 for Re 0.22 Ω, RL 8 Ω.
        StageParameters base = StageParameters.builder().build();
        StageModel m = StageModel.of(base.withBias(new Bias.EmitterDropVolts(base.thermalVolts())), S);
        assertEquals(8 / 8.22, gainAtZero(m), 2e-6);
        assertEquals(0.97324, gainAtZero(m), 1e-5);
    }

    @Test
    void pairAroundOliverBias_gainDipsBelowAndDoublesAbove() {
        // docs/references.md §7 (COMPUTED with an exponential model): gain at crossover 0.9604 at 0.5× and 0.9798 at 2× the
        // Oliver current, against 0.9710 at large signal (gm-doubling above the optimum).
        StageParameters base = StageParameters.builder().build();
        double vt = base.thermalVolts();
        assertEquals(0.9604, gainAtZero(StageModel.of(base.withBias(new Bias.EmitterDropVolts(0.5 * vt)), S)), 5e-4);
        assertEquals(0.9798, gainAtZero(StageModel.of(base.withBias(new Bias.EmitterDropVolts(2 * vt)), S)), 5e-4);
    }

    @Test
    void emitterFollowerOptimum_isNearOneThermalVoltage() {
        // Oliver (1971), docs/references.md §7 (PARTIAL, from a summary): optimum near Iq·Re = VT for an emitter follower.
        // Our criterion (flattest gain over |Vout| <= 21 V) lands above VT because re = VT/I is not yet negligible at 21 V.
        StageModel m = model(StageParameters.builder());
        OptimumBias o = m.optimumBias(21);
        double vt = m.parameters().thermalVolts();
        assertFalse(o.atSearchLimit());
        assertTrue(o.vqVolts() > 0.8 * vt && o.vqVolts() < 1.3 * vt, "pair optimum " + o.vqVolts() + " V vs VT " + vt);
        // The Darlington's driver adds its own re (through Rd and β) so it wants more bias than the plain pair.
        OptimumBias d = model(StageParameters.builder().topology("darlington")).optimumBias(21);
        assertTrue(d.vqVolts() > o.vqVolts(), "darlington optimum " + d.vqVolts() + " vs pair " + o.vqVolts());
    }

    @Test
    void cfpWithRbe_optimumMuchLowerThanEmitterFollower() {
        // From memory (docs/references.md §7, low confidence): a CFP stage wants much less Vq than an emitter follower.
        // With the usual output base-emitter resistor the driver's standing current (about Vbe/Rbe) raises the
        // crossover transconductance, so the optimum falls: about 5 mV with 100 ohm against 46 mV for the Darlington.
        double darlington = model(StageParameters.builder().topology("darlington")).optimumBias(21).vqVolts();
        OptimumBias cfp = model(StageParameters.builder().topology("cfp").outputBaseEmitterOhms(100)).optimumBias(21);
        assertFalse(cfp.atSearchLimit());
        assertTrue(cfp.vqVolts() < 0.25 * darlington, "cfp optimum " + cfp.vqVolts() + " vs darlington " + darlington);
    }

    @Test
    void cfpWithoutRbe_behavesExactlyLikeOnePairAtTheSameVq() {
        // Without Rbe and with Re outside the loop, a CFP half's current through Re is If1·(1 + 1/β1 + β2): a single
        // exponential of the driver's Vbe, like one emitter follower's If·(1 + 1/β). At equal Vq the curves coincide.
        TransferCurve cfp = model(StageParameters.builder().topology("cfp").outputBaseEmitterOhms(Double.POSITIVE_INFINITY)).transferCurve(-3, 3, 61).curve();
        TransferCurve pair = model(StageParameters.builder()).transferCurve(-3, 3, 61).curve();
        for (int i = 0; i < 61; i++) {
            assertEquals(pair.outputVolts()[i], cfp.outputVolts()[i], 1e-9);
            assertEquals(pair.incrementalGain()[i], cfp.incrementalGain()[i], 1e-8);
        }
    }

    @Test
    void cfpWithReInsideLoop_gainDeviationFallsSteadily_noOptimumBelowClassA() {
        // A finding of this model: with Re inside the local loop (in series with the output device's collector, a
        // current source) a CFP half's output resistance is VT/I and Re does not appear, so the crossover gain rises
        // towards the large-signal gain steadily with bias; the optimum search ends at its top.
        StageModel m = model(StageParameters.builder().topology("cfp").cfpEmitterResistorInLoop(true).outputBaseEmitterOhms(Double.POSITIVE_INFINITY));
        double prev = Double.POSITIVE_INFINITY;
        for (double vq : new double[] {0.002, 0.005, 0.01, 0.02, 0.05, 0.1}) {
            StageModel at = m.withBias(new Bias.EmitterDropVolts(vq));
            double dev = at.gainDeviation(at.biasVolts(), 21);
            assertTrue(dev < prev, "deviation " + dev + " at Vq " + vq + " should be below " + prev);
            prev = dev;
        }
        assertTrue(m.optimumBias(21).atSearchLimit());
    }

    @Test
    void symmetricStage_hasNoEvenHarmonics_quasiHas() {
        // Fourier series: an odd-symmetric transfer curve driven by a sine has only odd harmonics; the quasi stage's
        // halves differ, so its even harmonics appear (domain.md: asymmetry shows as even harmonics).
        Distortion sym = model(StageParameters.builder().topology("darlington")).distortion(5);
        assertTrue(sym.harmonic(2) < 1e-12 && sym.harmonic(4) < 1e-12, "even harmonics " + sym.harmonic(2));
        assertTrue(sym.harmonic(3) > 1e-6);
        Distortion quasi = model(StageParameters.builder().topology("quasi")).distortion(5);
        assertTrue(quasi.harmonic(2) > 1e-4, "quasi H2 " + quasi.harmonic(2));
        assertEquals(5, sym.outputPeakVolts(), 5e-6);
    }

    @Test
    void thd_isRootSumSquareOfHarmonics() {
        Distortion d = model(StageParameters.builder().topology("cfp").bias(new Bias.EmitterDropVolts(0.005))).distortion(2);
        double[] h = d.harmonicRatios();
        double s = 0;
        for (int k = 2; k < h.length; k++) s += h[k] * h[k];
        assertEquals(Math.sqrt(s), d.thd(), 1e-15);
        assertEquals(1, h[1], 1e-15);
    }

    @Test
    void gainFromJacobian_matchesCentralDifferenceOfModel() {
        // Invariant: the derivative of the model's own output (a naive central difference, kept here) equals its Jacobian gain.
        for (String t : List.of("pair", "darlington", "cfp", "quasi")) {
            StageModel m = model(StageParameters.builder().topology(t).bias(new Bias.EmitterDropVolts(0.01)));
            double h = 1e-5;
            for (double vin : new double[] {-20, -1.3, -0.4, 0, 0.25, 0.9, 12}) {
                TransferCurve c = m.transferCurve(vin - h, vin + h, 3).curve();
                double diff = (c.outputVolts()[2] - c.outputVolts()[0]) / (2 * h);
                assertEquals(diff, c.incrementalGain()[1], 1e-6, t + " at " + vin);
            }
        }
    }

    @Test
    void thermalSensitivity_biasDerivativeMatchesResolving_andTrackingCancels() {
        StageModel m = model(StageParameters.builder().topology("darlington"));
        ThermalSensitivity fixed = m.thermalSensitivity(0), tracked = m.thermalSensitivity(4);
        double dv = 1e-4;
        double up = StageModel.of(m.parameters().withBias(new Bias.GeneratorVolts(m.biasVolts() + dv)), S).quiescentAmps();
        double dn = StageModel.of(m.parameters().withBias(new Bias.GeneratorVolts(m.biasVolts() - dv)), S).quiescentAmps();
        assertEquals((up - dn) / (2 * dv), fixed.ampsPerBiasVolt(), 1e-4 * fixed.ampsPerBiasVolt());
        // −2 mV/K per junction at constant current: Sedra & Smith, Microelectronic Circuits, as quoted in
        // docs/references.md §7 (CONFIRMED there); also common practice (domain.md). Four junctions in a Darlington's loop.
        assertEquals(fixed.ampsPerBiasVolt() * 4 * 2e-3, fixed.untrackedAmpsPerKelvin(), 1e-12);
        assertEquals(0, tracked.trackedAmpsPerKelvin(), 1e-15);
        assertEquals(4, fixed.junctionsInLoop());
        assertEquals(2, model(StageParameters.builder().topology("cfp")).thermalSensitivity(0).junctionsInLoop());
        // The quasi stage's rest point moves with the bias (the offset holds Vout at 0): the Jacobian figure must match
        // re-solving the rest point at ±0.1 mV of bias (each re-solve finds its own offset).
        StageModel q = model(StageParameters.builder().topology("quasi"));
        double qUp = StageModel.of(q.parameters().withBias(new Bias.GeneratorVolts(q.biasVolts() + dv)), S).quiescentAmps();
        double qDn = StageModel.of(q.parameters().withBias(new Bias.GeneratorVolts(q.biasVolts() - dv)), S).quiescentAmps();
        assertEquals((qUp - qDn) / (2 * dv), q.thermalSensitivity(0).ampsPerBiasVolt(), 1e-4 * q.thermalSensitivity(0).ampsPerBiasVolt());
    }

    @Test
    void quasiRestPoint_outputHeldAtZero_vqHolds_halvesObeyKcl() {
        // Physical invariants. Global feedback holds the output at 0 V at rest: the model moves the input offset until
        // Vout = 0 (a real amplifier's loop does the same), then sets the bias so the stated Vq (mean of the two
        // emitter-resistor drops) holds. With no load current, KCL at the output node: the upper emitter resistor's
        // current plus the Darlington driver's Rd current equals the lower emitter resistor's current.
        StageModel m = model(StageParameters.builder().topology("quasi").bias(new Bias.EmitterDropVolts(0.005)));
        OperatingPoint q = m.quiescent();
        assertEquals(0, q.outputVolts(), 1e-9);
        assertEquals(0.005, m.vqVolts(), 1e-9);
        double rd = (q.nodeVolts().get("b3") - q.nodeVolts().get("out")) / StageParameters.DEFAULT_DRIVER_EMITTER_OHMS;
        assertEquals(m.quiescentLowerAmps(), m.quiescentUpperAmps() + rd, 1e-9);
        // Both halves conduct at the same order of current (before: 2.9 mA against 41.8 mA at −0.29 V output).
        assertTrue(m.quiescentUpperAmps() > 0.5 * m.quiescentLowerAmps(), "upper " + m.quiescentUpperAmps() + " lower " + m.quiescentLowerAmps());
        // A symmetric stage rests at 0 V without any offset (symmetry).
        assertEquals(0, model(StageParameters.builder().topology("darlington")).inputOffsetVolts(), 1e-12);
    }

    @Test
    void cfpDefault_hasBaseEmitterResistor_andLowOptimum() {
        // Common practice (value from memory, StageParameters.DEFAULT_CFP_RBE_OHMS): a CFP's output device has a
        // resistor across its base-emitter junction (the driver's collector load), of the order of 100 ohm.
        StageParameters p = StageParameters.builder().topology("cfp").build();
        assertEquals(100, ((Topology.Cfp) p.topology()).outputBaseEmitterOhms(), 0);
        assertTrue(p.isDefaulted("rbe"));
        assertEquals(100, ((Topology.Quasi) StageParameters.builder().topology("quasi").build().topology()).outputBaseEmitterOhms(), 0);
        assertTrue(Double.isInfinite(((Topology.Cfp) StageParameters.builder().topology("cfp").outputBaseEmitterOhms(Double.POSITIVE_INFINITY)
                .build().topology()).outputBaseEmitterOhms()));
    }

    @Test
    void clipLevels_pairLosesOneJunctionAndReDrop() {
        // The pair's upper device follows its drive, limited at rail − 0.2 V: Vout = 34.8 − Vbe − I·Re, I = Vout/8.
        StageModel m = model(StageParameters.builder());
        ClipLevels c = m.clipLevels();
        OperatingPoint op = m.operatingPoint(40);
        double vbe = op.nodeVolts().get("dtop") - op.nodeVolts().get("e1");
        assertEquals(34.8 - vbe - c.positiveVolts() / 8 * 0.22, c.positiveVolts(), 1e-3);
        assertEquals(-c.positiveVolts(), c.negativeVolts(), 1e-9);
        // Common practice: a silicon power device's Vbe at a few amps is 0.7–0.9 V (value from memory); here Is 1e-12 A at
        // about 4 A gives VT·ln(4/1e-12) = 0.74 V by the device law itself.
        assertTrue(vbe > 0.7 && vbe < 0.9);
    }
}
