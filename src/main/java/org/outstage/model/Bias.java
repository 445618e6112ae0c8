package org.outstage.model;

import org.outstage.Require;

/**
 * How the bias is given. All three are convertible: the model solves the quiescent point (Vin = 0) to
 * turn an emitter-resistor drop or a quiescent current into the bias-generator voltage.
 */
public sealed interface Bias permits Bias.GeneratorVolts, Bias.EmitterDropVolts, Bias.QuiescentAmps {

    /** The bias generator's voltage (spanning the whole bias loop), volts. May be small or zero (class B). */
    record GeneratorVolts(double volts) implements Bias {
        public GeneratorVolts { Require.finite("biasVolts", volts); }
    }

    /** The quiescent drop across each emitter resistor (Vq = Iq·Re, mean of upper and lower), volts. */
    record EmitterDropVolts(double volts) implements Bias {
        public EmitterDropVolts { Require.positive("vqVolts", volts); }
    }

    /** The quiescent current through each emitter resistor (mean of upper and lower), amps. */
    record QuiescentAmps(double amps) implements Bias {
        public QuiescentAmps { Require.positive("quiescentAmps", amps); }
    }
}
