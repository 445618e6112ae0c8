package org.outstage.report;

import java.time.Instant;
import java.util.List;
import java.util.Objects;
import java.util.Optional;
import org.outstage.logbook.Session;
import org.outstage.logbook.UnitUnderTest;
import org.outstage.verify.MeasuredChannel;
import org.outstage.verify.VerificationResult;

/**
 * The content of a verification report, rendered by {@link HtmlReport} and {@link ReportJson} (the same
 * content in both).
 *
 * @param unit        the unit under test
 * @param session     the logbook session the verification was recorded in, when it was
 * @param result      the spec and every limit's verdict
 * @param channels    the figures of every measured channel
 * @param charts      SVG fragments drawn from the plot descriptions (empty until an SVG renderer is wired)
 * @param generatedAt when the report was made
 * @param programVersion e.g. "outstage 0.1.0"
 */
public record ReportDocument(UnitUnderTest unit, Optional<Session> session, VerificationResult result, List<MeasuredChannel> channels,
                             List<String> charts, Instant generatedAt, String programVersion) {
    public ReportDocument {
        Objects.requireNonNull(unit, "unit");
        Objects.requireNonNull(session, "session");
        Objects.requireNonNull(result, "result");
        channels = List.copyOf(channels);
        charts = List.copyOf(charts);
        Objects.requireNonNull(generatedAt, "generatedAt");
        Objects.requireNonNull(programVersion, "programVersion");
    }

    /** The safety notes every report carries (our wording of the bench cautions). */
    public static final List<String> CAUTIONS = List.of(
            "Amplifiers hold mains voltage inside and rail voltages that can exceed ±60 V; filter capacitors stay charged after"
                    + " the power is off. Discharge them and keep one hand away from the chassis.",
            "Heatsinks run hot, and output devices can fail short and take the load or the speaker with them.",
            "An amplifier output can destroy a soundcard input: put an attenuator in between and check the level before you connect.",
            "A bridged (BTL) output has no side at ground: a grounded instrument on it short-circuits the amplifier.",
            "Setting the bias can start thermal runaway: begin low, power the amplifier through a current-limited or bulb-limited"
                    + " supply, and watch the temperature.",
            "These figures describe the captures that were measured; they do not certify that the amplifier is safe."
                    + " Follow local electrical codes and qualified service practice.");

    /** Overall outcome: "pass" (every limit passed), "fail" (any failed), or "incomplete" (none failed, some not measured). */
    public String outcome() {
        if (result.anyFailed()) return "fail";
        return result.allPassed() ? "pass" : "incomplete";
    }
}
