package org.outstage.cli;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Locale;
import java.util.Optional;
import java.util.OptionalDouble;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.outstage.logbook.BiasReading;

/**
 * Where {@code watch} finds the bias reading of a capture (our own convention, documented in docs/logbook.md):
 * <ol>
 * <li>a sidecar file with the capture's base name and the extension {@code .bias}, lines {@code key=value}
 *     with keys {@code bias_mv} or {@code bias_ma}, and optionally {@code heatsink_c}, {@code ambient_c}
 *     ({@code #} starts a comment);</li>
 * <li>else the file name: {@code _bias-23.5mV} or {@code _bias-120mA}, and optionally {@code _hs-41C} for the
 *     heatsink temperature, each followed by {@code _} or the extension (e.g. {@code ch1_bias-23.5mV_hs-41C.wav});</li>
 * <li>else the {@code --bias-mv}/{@code --bias-ma} given to watch (a constant setting, for drift logging).</li>
 * </ol>
 */
final class WatchNames {
    private WatchNames() {}

    private static final Pattern BIAS = Pattern.compile("(?i)_bias-(\\d+(?:\\.\\d+)?)(mv|ma)(?=[_.]|$)");
    private static final Pattern HEATSINK = Pattern.compile("(?i)_hs-(-?\\d+(?:\\.\\d+)?)c(?=[_.]|$)");

    record Tags(Optional<BiasReading> reading, OptionalDouble heatsinkC, OptionalDouble ambientC) {}

    static Tags fromName(String fileName) {
        Optional<BiasReading> r = Optional.empty();
        Matcher m = BIAS.matcher(fileName);
        if (m.find()) {
            double v = Double.parseDouble(m.group(1));
            r = Optional.of(m.group(2).equalsIgnoreCase("mv") ? BiasReading.millivolts(v) : BiasReading.milliamps(v));
        }
        OptionalDouble hs = OptionalDouble.empty();
        Matcher h = HEATSINK.matcher(fileName);
        if (h.find()) hs = OptionalDouble.of(Double.parseDouble(h.group(1)));
        return new Tags(r, hs, OptionalDouble.empty());
    }

    static Path sidecarOf(Path capture) {
        String name = capture.getFileName().toString();
        int dot = name.lastIndexOf('.');
        return capture.resolveSibling((dot > 0 ? name.substring(0, dot) : name) + ".bias");
    }

    /** The sidecar's tags, or empty when there is none; a malformed sidecar is bad input naming file and line. */
    static Optional<Tags> fromSidecar(Path capture) {
        Path side = sidecarOf(capture);
        if (!Files.isRegularFile(side)) return Optional.empty();
        Optional<BiasReading> r = Optional.empty();
        OptionalDouble hs = OptionalDouble.empty();
        OptionalDouble amb = OptionalDouble.empty();
        try {
            int no = 0;
            for (String raw : Files.readAllLines(side, StandardCharsets.UTF_8)) {
                no++;
                String line = raw.replaceFirst("#.*", "").trim();
                if (line.isEmpty()) continue;
                int eq = line.indexOf('=');
                if (eq < 0) throw new BadInputException(side + ", line " + no + ": expected key=value");
                String key = line.substring(0, eq).trim().toLowerCase(Locale.ROOT);
                double v;
                try {
                    v = Double.parseDouble(line.substring(eq + 1).trim());
                } catch (NumberFormatException e) {
                    throw new BadInputException(side + ", line " + no + ": '" + line.substring(eq + 1).trim() + "' is not a number");
                }
                switch (key) {
                    case "bias_mv" -> r = Optional.of(BiasReading.millivolts(v));
                    case "bias_ma" -> r = Optional.of(BiasReading.milliamps(v));
                    case "heatsink_c" -> hs = OptionalDouble.of(v);
                    case "ambient_c" -> amb = OptionalDouble.of(v);
                    default -> throw new BadInputException(side + ", line " + no + ": unknown key '" + key
                            + "' (bias_mv, bias_ma, heatsink_c, ambient_c)");
                }
            }
        } catch (IOException e) {
            throw new BadInputException(side + ": cannot read (" + e.getMessage() + ")");
        }
        return Optional.of(new Tags(r, hs, amb));
    }
}
