package org.outstage.capture;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.FileSystems;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.PathMatcher;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Optional;
import java.util.OptionalDouble;
import java.util.OptionalInt;

/**
 * A folder's calibration notes: which settings each capture in it needs. A plain text file of our own,
 * {@code bench.txt}, one rule a line: a file-name pattern (glob: {@code *}, {@code ?}, {@code [..]}) then
 * {@code key=value} settings. Keys: {@code fs-volts}, {@code probe}, {@code sample-rate}, {@code load},
 * {@code reference} (channel from 1: the generator), {@code roles} (one {@link ChannelRole} per channel from
 * channel 1, comma-separated: {@code roles=generator,output} or {@code roles=left,right}), {@code channel} (from
 * 1), {@code series} (a word: captures with the same series name form one level series at rising drive). When several rules match a file, later rules
 * override the keys they set. {@code #} starts a comment.
 *
 * <pre>
 * # pattern           settings
 * da60-*.wav          fs-volts=40 load=8
 * da60-xy-*.wav       reference=1
 * da60-scope-*.csv    load=8
 * </pre>
 */
public final class BenchManifest {
    /** The file name looked for in a capture folder. */
    public static final String FILE_NAME = "bench.txt";

    /** Settings of one capture, as the manifest gives them. */
    public record Entry(CaptureOptions captureOptions, OptionalDouble loadOhms, OptionalInt referenceChannel, OptionalInt channel,
                        Optional<String> series, Optional<List<ChannelRole>> roles) {
        /** An entry without explicit roles (the generator, if any, named by {@code referenceChannel}). */
        public Entry(CaptureOptions captureOptions, OptionalDouble loadOhms, OptionalInt referenceChannel, OptionalInt channel,
                     Optional<String> series) {
            this(captureOptions, loadOhms, referenceChannel, channel, series, Optional.empty());
        }

        /** The generator channel (from 1): {@code reference=N}, or the generator in {@code roles}. */
        public OptionalInt generatorChannel() {
            return referenceChannel.isPresent() ? referenceChannel : roles.map(ChannelRole::generatorChannel).orElse(OptionalInt.empty());
        }

        /** The role of each channel of a capture with {@code channelCount} channels ({@link ChannelRole#assign}). */
        public List<ChannelRole> roles(int channelCount) {
            return ChannelRole.assign(channelCount, referenceChannel, roles);
        }
    }

    private record Rule(PathMatcher matcher, String pattern, List<String[]> settings) {}

    private final List<Rule> rules;

    private BenchManifest(List<Rule> rules) { this.rules = List.copyOf(rules); }

    /** An empty manifest (every capture uncalibrated). */
    public static BenchManifest empty() { return new BenchManifest(List.of()); }

    /** Reads {@code folder/bench.txt} if it exists, otherwise an empty manifest. */
    public static BenchManifest forFolder(Path folder) throws CaptureFormatException {
        Path f = folder.resolve(FILE_NAME);
        return Files.isRegularFile(f) ? read(f) : empty();
    }

    /** Parses a manifest; a malformed line is a {@link CaptureFormatException} naming the line. */
    public static BenchManifest read(Path file) throws CaptureFormatException {
        List<String> lines;
        try {
            lines = Files.readAllLines(file, StandardCharsets.UTF_8);
        } catch (IOException e) {
            throw new CaptureFormatException(file, "file", "cannot be read: " + e.getMessage(), e);
        }
        List<Rule> rules = new ArrayList<>();
        for (int i = 0; i < lines.size(); i++) {
            String line = lines.get(i);
            int hash = line.indexOf('#');
            if (hash >= 0) line = line.substring(0, hash);
            line = line.trim();
            if (line.isEmpty()) continue;
            String[] parts = line.split("\\s+");
            List<String[]> settings = new ArrayList<>();
            for (int k = 1; k < parts.length; k++) {
                String[] kv = parts[k].split("=", 2);
                if (kv.length != 2 || kv[1].isEmpty())
                    throw CaptureFormatException.atLine(file, i + 1, 0, "\"" + parts[k] + "\" is not key=value");
                String key = kv[0].toLowerCase(Locale.ROOT);
                if (!List.of("fs-volts", "probe", "sample-rate", "load", "reference", "roles", "channel", "series").contains(key))
                    throw CaptureFormatException.atLine(file, i + 1, 0, "unknown key \"" + kv[0]
                            + "\" (known: fs-volts, probe, sample-rate, load, reference, roles, channel, series)");
                if (key.equals("roles")) try {
                    ChannelRole.parseList(kv[1]);
                } catch (IllegalArgumentException e) {
                    throw CaptureFormatException.atLine(file, i + 1, 0, "roles=" + kv[1] + ": " + e.getMessage());
                }
                else if (!key.equals("series")) try {
                    double v = Double.parseDouble(kv[1]);
                    if (!(v > 0) || !Double.isFinite(v)) throw new NumberFormatException();
                    if ((key.equals("reference") || key.equals("channel")) && v != Math.rint(v)) throw new NumberFormatException();
                } catch (NumberFormatException e) {
                    throw CaptureFormatException.atLine(file, i + 1, 0, key + "=" + kv[1] + " must be a positive number"
                            + (key.equals("reference") || key.equals("channel") ? " (a channel from 1)" : ""));
                }
                settings.add(new String[] {key, kv[1]});
            }
            PathMatcher m;
            try {
                m = FileSystems.getDefault().getPathMatcher("glob:" + parts[0]);
            } catch (IllegalArgumentException e) {
                throw CaptureFormatException.atLine(file, i + 1, 1, "\"" + parts[0] + "\" is not a file-name pattern");
            }
            rules.add(new Rule(m, parts[0], settings));
        }
        return new BenchManifest(rules);
    }

    /** The settings for a capture file (by its file name); all empty when no rule matches. */
    public Entry entryFor(Path capture) {
        Path name = capture.getFileName();
        OptionalDouble fsVolts = OptionalDouble.empty(), probe = OptionalDouble.empty(), rate = OptionalDouble.empty(), load = OptionalDouble.empty();
        OptionalInt ref = OptionalInt.empty(), ch = OptionalInt.empty();
        Optional<String> series = Optional.empty();
        Optional<List<ChannelRole>> roles = Optional.empty();
        for (Rule r : rules) {
            if (!r.matcher.matches(name)) continue;
            for (String[] kv : r.settings) {
                if (kv[0].equals("series")) { series = Optional.of(kv[1]); continue; }
                if (kv[0].equals("roles")) { roles = Optional.of(ChannelRole.parseList(kv[1])); continue; }
                double v = Double.parseDouble(kv[1]);
                switch (kv[0]) {
                    case "fs-volts" -> fsVolts = OptionalDouble.of(v);
                    case "probe" -> probe = OptionalDouble.of(v);
                    case "sample-rate" -> rate = OptionalDouble.of(v);
                    case "load" -> load = OptionalDouble.of(v);
                    case "reference" -> ref = OptionalInt.of((int) v);
                    case "channel" -> ch = OptionalInt.of((int) v);
                    default -> throw new AssertionError(kv[0]);
                }
            }
        }
        return new Entry(new CaptureOptions(fsVolts, probe, rate), load, ref, ch, series, roles);
    }

    /** Whether any rule matches the file. */
    public Optional<String> firstPatternFor(Path capture) {
        return rules.stream().filter(r -> r.matcher.matches(capture.getFileName())).map(Rule::pattern).findFirst();
    }
}
