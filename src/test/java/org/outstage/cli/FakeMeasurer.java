package org.outstage.cli;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.OptionalInt;
import org.outstage.json.JsonText;
import org.outstage.verify.KeyFigures;

/**
 * A stand-in measurer for CLI tests of the logbook commands: a "capture" is a small text file of
 * {@code key=value} lines stating the figures (f, rms, thd, thdn, g0, verdict, residual, clip, channels,
 * rms2 for channel 2); a file without {@code f=} is rejected as bad input, like an unreadable capture.
 * It tests the plumbing (store, log, export, verdicts), not the analysis.
 */
final class FakeMeasurer implements LogbookMeasurer {
    @Override
    public List<Measured> measure(Path capture, AnalyzeOptions options, OptionalInt channel) {
        Map<String, String> kv = new HashMap<>();
        try {
            for (String line : Files.readAllLines(capture)) {
                int eq = line.indexOf('=');
                if (eq > 0) kv.put(line.substring(0, eq).trim(), line.substring(eq + 1).trim());
            }
        } catch (IOException | java.io.UncheckedIOException e) {
            throw new BadInputException(capture + ": cannot read");
        }
        if (!kv.containsKey("f")) throw new BadInputException(capture + ", byte 0: not a capture this build can read");
        int channels = Integer.parseInt(kv.getOrDefault("channels", "1"));
        if (channel.isPresent() && channel.getAsInt() > channels) {
            throw new BadInputException(capture + ": --channel " + channel.getAsInt() + " but the file has " + channels);
        }
        List<Measured> out = new ArrayList<>();
        for (int ch = 1; ch <= channels; ch++) {
            if (channel.isPresent() && ch != channel.getAsInt()) continue;
            out.add(one(capture, options, kv, ch, channels));
        }
        return out;
    }

    private static Measured one(Path capture, AnalyzeOptions options, Map<String, String> kv, int ch, int channels) {
        double rms = Double.parseDouble(kv.getOrDefault(ch == 2 ? "rms2" : "rms", kv.getOrDefault("rms", "2.828")));
        KeyFigures f = KeyFigures.basic(Double.parseDouble(kv.get("f")), rms, "V", Double.parseDouble(kv.getOrDefault("thd", "0.001")),
                Double.parseDouble(kv.getOrDefault("thdn", "0.0012")));
        if (kv.containsKey("residual")) f = f.withResidualRms(Double.parseDouble(kv.get("residual")));
        if (options.load != null) f = f.withPower(rms * rms / options.load, options.load);
        if (kv.containsKey("g0")) f = f.withCrossover(Double.parseDouble(kv.get("g0")), kv.getOrDefault("verdict", "near-optimal"));
        if (kv.containsKey("clip")) f = f.withClipAsymmetry(Double.parseDouble(kv.get("clip")));
        String json = JsonText.write(JsonText.obj("file", capture.getFileName().toString(), "channel", ch, "thd", f.thdRatio()));
        return new Measured(ch, channels, f, json, List.of());
    }
}
