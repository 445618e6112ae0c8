package org.outstage.model;

import java.util.List;
import java.util.Map;

/**
 * One solved operating point of a stage.
 *
 * @param inputVolts              the drive Vin
 * @param outputVolts             the output Vout
 * @param devices                 every transistor's currents, in its own polarity (positive when conducting)
 * @param emitterDropUpperVolts   drop across the upper emitter resistor (positive when the upper half conducts)
 * @param emitterDropLowerVolts   drop across the lower emitter resistor (positive when the lower half conducts)
 * @param nodeVolts               all node voltages by node name (for diagnosis)
 */
public record OperatingPoint(double inputVolts, double outputVolts, List<DeviceCurrent> devices,
                             double emitterDropUpperVolts, double emitterDropLowerVolts, Map<String, Double> nodeVolts) {
    public OperatingPoint {
        devices = List.copyOf(devices);
        nodeVolts = Map.copyOf(nodeVolts);
    }

    /** Currents of one transistor ({@code role} e.g. "upper output"). */
    public record DeviceCurrent(String name, String role, double collectorAmps, double baseAmps) {}

    /** The device with this role; throws IllegalArgumentException if the topology has none. */
    public DeviceCurrent device(String role) {
        return devices.stream().filter(d -> d.role().equals(role)).findFirst()
                .orElseThrow(() -> new IllegalArgumentException("role=" + role + " must be one of " + devices.stream().map(DeviceCurrent::role).toList()));
    }
}
