package org.outstage.ui;

import java.util.List;
import java.util.Map;
import org.outstage.analysis.TransferCurve;

/**
 * The workbench's view of a stage model: named topologies, their editable parameters, and a prediction.
 * An implementation wraps the {@code model} package; the transfer view only displays what it returns.
 */
interface StageModelAdapter {
    /** One editable parameter of a topology. */
    record Parameter(String key, String label, String unit, double defaultValue, String description) {}

    List<String> topologies();

    List<Parameter> parameters(String topology);

    /**
     * Predicted transfer curve of {@code topology} with the given values.
     *
     * @throws IllegalArgumentException when a value is impossible or the solver did not converge; the
     *         message is shown in place of the overlay
     */
    TransferCurve predict(String topology, Map<String, Double> values);

    /**
     * The prediction as a capture through {@code band} records it (a soundcard's anti-alias filter keeps only the
     * harmonics of the tone below its edge). A model that cannot do that gives its own curve.
     */
    default TransferCurve predict(String topology, Map<String, Double> values, java.util.Optional<org.outstage.model.CaptureBand> band) {
        return predict(topology, values);
    }
}
