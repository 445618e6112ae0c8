package org.outstage.analysis.stage;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.function.Consumer;
import org.outstage.analysis.Measurement;
import org.outstage.capture.BenchManifest;
import org.outstage.capture.ChannelRole;

/**
 * Level sweeps as NAMED SERIES: captures join a series only when the calibration notes name it ({@code series=NAME}
 * in {@code bench.txt}); each series is swept on its own ({@link LevelSweep}); generator channels never join one.
 * Captures without a series name (a bias series, a scope export, a stereo X-Y file) stay out, so unrelated captures
 * never land on one THD-against-power line. The one function the bench job, the verification report and the
 * workbench call, so all of them show the same series and the same power at 1 % THD as {@code sweep}.
 */
public final class LevelSeries {
    private LevelSeries() {}

    /** One measured channel of one capture file, with the file's entry in the calibration notes. */
    public record Member(Path file, BenchManifest.Entry entry, int channelCount, Measurement measurement) {
        public Member {
            Objects.requireNonNull(file, "file");
            Objects.requireNonNull(entry, "entry");
            Objects.requireNonNull(measurement, "measurement");
        }
    }

    /** A named series and its sweep (points sorted by power, power at 1 % and 10 % THD). */
    public record Named(String name, LevelSweepResult sweep) {}

    /**
     * The point {@code sweep} makes of a measurement: total output power (V_rms²/R of the whole record without DC),
     * THD and THD+N; the calibration label and full-scale volts let {@link LevelSweep} refuse a mixed series.
     * Empty when the channel was not measured or has no power.
     */
    public static java.util.Optional<LevelPoint> point(String fileName, Measurement m, String calibrationLabel, double fullScaleVolts) {
        if (!m.measured() || m.powerWatts().isEmpty()) return java.util.Optional.empty();
        return java.util.Optional.of(new LevelPoint(fileName, m.fundamental().frequencyHz(), m.powerWatts().get().loadOhms(), calibrationLabel,
                fullScaleVolts, m.powerWatts().get().totalWatts(), m.thd().ratio(), m.thdN().ratio()));
    }

    /**
     * The named level series of a set of measured channels, in the order their names first appear. A member joins
     * the series its entry names when its channel is an output (by the entry's roles) and it has a power; when a
     * file has several output channels, each channel is its own series ("NAME, channel N"). A series that
     * {@link LevelSweep} refuses (mixed frequency, load or calibration) is left out and the reason handed to
     * {@code problems}.
     */
    public static List<Named> build(List<Member> members, Consumer<String> problems) {
        Map<String, List<LevelPoint>> groups = new LinkedHashMap<>();
        for (Member mb : members) {
            if (mb.entry().series().isEmpty()) continue;
            Measurement m = mb.measurement();
            List<ChannelRole> roles = mb.entry().roles(mb.channelCount());
            int ch = m.channel();
            if (ch < 1 || ch > roles.size() || !roles.get(ch - 1).isOutput()) continue;
            long outputs = roles.stream().filter(ChannelRole::isOutput).count();
            String name = mb.entry().series().get() + (outputs > 1 ? ", channel " + ch : "");
            var cal = mb.entry().captureOptions();
            String label = cal.fullScaleVolts().isPresent() ? "fs-volts" : cal.probeFactor().isPresent() ? "probe" : "volts";
            point(mb.file().getFileName().toString(), m, label, cal.fullScaleVolts().orElse(0))
                    .ifPresent(p -> groups.computeIfAbsent(name, k -> new ArrayList<>()).add(p));
        }
        List<Named> out = new ArrayList<>();
        for (Map.Entry<String, List<LevelPoint>> g : groups.entrySet()) {
            try {
                out.add(new Named(g.getKey(), LevelSweep.analyze(g.getValue())));
            } catch (IllegalArgumentException e) {
                problems.accept("level series \"" + g.getKey() + "\": " + e.getMessage());
            }
        }
        return List.copyOf(out);
    }
}
