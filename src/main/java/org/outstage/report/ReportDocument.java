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
            "Amplifiers carry mains voltage inside, and their supply rails can exceed ±60 V. Filter capacitors stay charged after "
                    + "the plug is pulled: discharge them and measure before you touch.",
            "Heatsinks and output devices get hot enough to burn. Output transistors can fail short and take the load, the "
                    + "emitter resistors or the speaker with them.",
            "A soundcard input is destroyed by a power amplifier's output. Always connect through an attenuator (divider) and "
                    + "check the level before it reaches the card.",
            "A bridged output has no side at ground. A grounded instrument (scope, soundcard) across it short-circuits the "
                    + "amplifier.",
            "Setting the bias can start thermal runaway. Start from the lowest setting, use a current-limited or bulb-limited "
                    + "supply, raise the current slowly and watch the temperature.",
            "Follow local electrical codes and qualified service practice. Outstage reports measured figures; they do not "
                    + "certify that an amplifier is safe.");

    /** Overall outcome: "pass" (every limit passed), "fail" (any failed), or "incomplete" (none failed, some not measured). */
    public String outcome() {
        if (result.anyFailed()) return "fail";
        return result.allPassed() ? "pass" : "incomplete";
    }
}
