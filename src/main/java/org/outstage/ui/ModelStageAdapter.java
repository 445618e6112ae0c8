package org.outstage.ui;

import java.util.List;
import java.util.Map;
import org.outstage.analysis.TransferCurve;
import org.outstage.model.Bias;
import org.outstage.model.CaptureBand;
import org.outstage.model.SolverFailureException;
import org.outstage.model.SolverSettings;
import org.outstage.model.StageModel;
import org.outstage.model.StageParameters;

/**
 * The transfer view's stage model: the four topologies of {@code org.outstage.model}, the parameters a
 * bench user changes most (bias as the drop across one emitter resistor, emitter resistor, load, rails,
 * current gains, temperature) and the span of the curve. The prediction is {@link StageModel#transferCurve}
 * over ±(span / 0.97) of drive, so the output covers about the measured swing.
 */
final class ModelStageAdapter implements StageModelAdapter {
    static final int POINTS = 201;

    @Override
    public List<String> topologies() { return List.of("pair", "darlington", "cfp", "quasi"); }

    @Override
    public List<Parameter> parameters(String topology) {
        return List.of(
                new Parameter("vq_mv", "Vq per Re", "mV", StageParameters.DEFAULT_VQ_VOLTS * 1e3,
                        "quiescent voltage across one emitter resistor (Vq = Iq·Re)"),
                new Parameter("re", "Re", "Ω", StageParameters.DEFAULT_EMITTER_OHMS, "per output device"),
                new Parameter("load", "Load", "Ω", StageParameters.DEFAULT_LOAD_OHMS, "dummy load"),
                new Parameter("rails", "Rails", "±V", StageParameters.DEFAULT_RAIL_VOLTS, "supply rails"),
                new Parameter("beta_driver", "β driver", "", StageParameters.DEFAULT_BETA_DRIVER, "ignored for a plain pair"),
                new Parameter("beta_output", "β output", "", StageParameters.DEFAULT_BETA_OUTPUT, "output devices"),
                new Parameter("temperature_c", "Temperature", "°C", StageParameters.DEFAULT_TEMPERATURE_CELSIUS, "all devices"),
                new Parameter("span_v", "Output span", "V", 10, "the curve covers about ± this output"));
    }

    @Override
    public TransferCurve predict(String topology, Map<String, Double> v) { return predict(topology, v, java.util.Optional.empty()); }

    /**
     * With a band: the stage driven by a sine to an output peak of the output span, its curve through the band
     * ({@link StageModel#curveThroughBand}, as {@code fit --capture-band} compares it); without one, its own curve over
     * ±(span / 0.97) of drive.
     */
    @Override
    public TransferCurve predict(String topology, Map<String, Double> v, java.util.Optional<CaptureBand> band) {
        StageParameters.Builder b = StageParameters.builder().topology(topology)
                .bias(new Bias.EmitterDropVolts(get(v, "vq_mv") / 1e3))
                .emitterOhms(get(v, "re")).loadOhms(get(v, "load")).railVolts(get(v, "rails"))
                .betaOutput(get(v, "beta_output")).temperatureCelsius(get(v, "temperature_c"));
        if (!topology.equals("pair")) b.betaDriver(get(v, "beta_driver"));
        double span = get(v, "span_v");
        if (!(span > 0)) throw new IllegalArgumentException("output span " + span + " V must be > 0");
        try {
            StageModel m = StageModel.of(b.build(), SolverSettings.defaults());
            if (band.isPresent()) return m.curveThroughBand(span, band.get());
            double drive = span / 0.97;
            return m.transferCurve(-drive, drive, POINTS).curve();
        } catch (SolverFailureException e) {
            throw new IllegalArgumentException("the solver did not converge at " + String.format(java.util.Locale.ROOT, "%.3g", e.inputVolts())
                    + " V of drive (" + e.getMessage() + ")");
        }
    }

    private static double get(Map<String, Double> v, String key) {
        Double d = v.get(key);
        if (d == null) throw new IllegalArgumentException(key + " is not set");
        return d;
    }
}
