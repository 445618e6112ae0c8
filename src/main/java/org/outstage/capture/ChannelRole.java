package org.outstage.capture;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Optional;
import java.util.OptionalInt;

/**
 * What a capture's channel carries: an amplifier output ({@link #OUTPUT}, or {@link #LEFT}/{@link #RIGHT} of a
 * stereo amplifier) or the {@link #GENERATOR} signal that drives it (the reference of an X-Y transfer curve). Roles
 * come from the calibration notes ({@code bench.txt}: {@code reference=N} or {@code roles=generator,output}) or the
 * command-line options ({@code --reference N}, {@code --roles ...}); nothing guesses them from the samples. A
 * generator channel has no output power, no distortion verdict and no place in a level series or a channel
 * balance: it is shown as the reference.
 */
public enum ChannelRole {
    OUTPUT, GENERATOR, LEFT, RIGHT;

    /** Whether the channel is an amplifier output (everything but the generator). */
    public boolean isOutput() { return this != GENERATOR; }

    /** The word used in bench.txt, options and reports: "output", "generator", "left", "right". */
    public String word() { return name().toLowerCase(Locale.ROOT); }

    /**
     * Parses a comma-separated list of roles, one per channel from channel 1 ("generator,output"); at most one
     * generator.
     *
     * @throws IllegalArgumentException naming the bad word
     */
    public static List<ChannelRole> parseList(String text) {
        List<ChannelRole> out = new ArrayList<>();
        for (String w : text.split(",")) {
            String t = w.trim().toLowerCase(Locale.ROOT);
            ChannelRole r = switch (t) {
                case "output", "out", "amp" -> OUTPUT;
                case "generator", "gen", "reference", "ref" -> GENERATOR;
                case "left", "l" -> LEFT;
                case "right", "r" -> RIGHT;
                default -> throw new IllegalArgumentException("\"" + w.trim() + "\" is not a channel role (output, generator, left, right)");
            };
            out.add(r);
        }
        if (out.stream().filter(r -> r == GENERATOR).count() > 1)
            throw new IllegalArgumentException("\"" + text + "\" names more than one generator channel");
        return List.copyOf(out);
    }

    /**
     * The role of each of {@code channelCount} channels (index 0 = channel 1): the explicit list when given (channels
     * beyond it are outputs), else channel {@code referenceChannel} (from 1) is the generator and the rest are
     * outputs, else every channel is an output.
     *
     * @throws IllegalArgumentException when the two sources disagree or name a channel the capture lacks
     */
    public static List<ChannelRole> assign(int channelCount, OptionalInt referenceChannel, Optional<List<ChannelRole>> explicit) {
        List<ChannelRole> roles = new ArrayList<>();
        for (int c = 1; c <= channelCount; c++) roles.add(OUTPUT);
        if (explicit.isPresent()) {
            List<ChannelRole> e = explicit.get();
            if (e.size() > channelCount)
                throw new IllegalArgumentException("roles name " + e.size() + " channels; the capture has " + channelCount);
            for (int i = 0; i < e.size(); i++) roles.set(i, e.get(i));
            OptionalInt gen = generatorChannel(roles);
            if (referenceChannel.isPresent() && (gen.isEmpty() || gen.getAsInt() != referenceChannel.getAsInt()))
                throw new IllegalArgumentException("the reference channel " + referenceChannel.getAsInt() + " is not the generator in the roles");
        } else if (referenceChannel.isPresent()) {
            int r = referenceChannel.getAsInt();
            if (r < 1 || r > channelCount)
                throw new IllegalArgumentException("reference channel " + r + " does not exist (the capture has " + channelCount + ")");
            roles.set(r - 1, GENERATOR);
        }
        return List.copyOf(roles);
    }

    /** The generator channel (from 1) in a role list, if any. */
    public static OptionalInt generatorChannel(List<ChannelRole> roles) {
        for (int i = 0; i < roles.size(); i++) if (roles.get(i) == GENERATOR) return OptionalInt.of(i + 1);
        return OptionalInt.empty();
    }
}
