package org.outstage.model;

import org.outstage.Require;

/**
 * The output-stage topologies the model knows (a closed family). Schematics are in docs/model.md.
 * Every topology is driven by one input voltage Vin through an ideal split bias source: the upper half's
 * input sits at Vin + Vbias/2, the lower half's at Vin − Vbias/2.
 */
public sealed interface Topology permits Topology.Pair, Topology.Darlington, Topology.Cfp, Topology.Quasi {

    /** Short name used on the command line and in files: pair, darlington, cfp, quasi. */
    String name();

    /** Base-emitter junctions in the loop the bias voltage spans (thermal tracking). */
    int junctionsInBiasLoop();

    /** One complementary emitter-follower pair: NPN above, PNP below, each with its emitter resistor. */
    record Pair() implements Topology {
        public String name() { return "pair"; }
        public int junctionsInBiasLoop() { return 2; }
    }

    /**
     * Emitter-follower Darlington each side: driver and output of the same polarity; the driver's emitter
     * feeds the output base and returns to the output node through {@code driverEmitterOhms}.
     */
    record Darlington(double driverEmitterOhms) implements Topology {
        public Darlington { Require.positive("driverEmitterOhms", driverEmitterOhms); }
        public String name() { return "darlington"; }
        public int junctionsInBiasLoop() { return 4; }
    }

    /**
     * Complementary feedback pair each side: an NPN driver controls a PNP output above, a PNP driver an NPN
     * output below. The output device's collector reaches the output through the emitter resistor Re; the
     * driver's emitter joins the output device's collector before Re (Re outside the local loop, the default)
     * or, with {@code emitterResistorInLoop}, the output node after Re (Re inside the loop, where it no longer
     * affects the gain). {@code outputBaseEmitterOhms} is the optional resistor from the output device's base to
     * its emitter (infinite for none).
     */
    record Cfp(double outputBaseEmitterOhms, boolean emitterResistorInLoop) implements Topology {
        public Cfp { positiveOrNone(outputBaseEmitterOhms); }
        public String name() { return "cfp"; }
        static void positiveOrNone(double ohms) {
            if (!(ohms > 0)) throw new IllegalArgumentException("outputBaseEmitterOhms=" + ohms + " must be > 0 (infinite for none)");
        }
        public int junctionsInBiasLoop() { return 2; }
    }

    /**
     * Quasi-complementary: an NPN Darlington above (as {@link Darlington}) and a CFP below (PNP driver, NPN
     * output, as the lower half of {@link Cfp}, with the same choice of where Re sits), so both output devices are NPN.
     */
    record Quasi(double driverEmitterOhms, double outputBaseEmitterOhms, boolean emitterResistorInLoop) implements Topology {
        public Quasi {
            Require.positive("driverEmitterOhms", driverEmitterOhms);
            Cfp.positiveOrNone(outputBaseEmitterOhms);
        }
        public String name() { return "quasi"; }
        public int junctionsInBiasLoop() { return 3; }
    }
}
