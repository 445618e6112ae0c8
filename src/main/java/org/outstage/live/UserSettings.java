package org.outstage.live;

import java.io.IOException;
import java.io.Reader;
import java.io.Writer;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.util.Locale;
import java.util.Map;
import java.util.OptionalDouble;
import java.util.Properties;

/**
 * The user's settings: a small properties file, {@code settings.properties}, in
 * {@code $OUTSTAGE_CONFIG} (or the system property {@code outstage.config}; tests use these), else
 * {@code $XDG_CONFIG_HOME/outstage}, else {@code ~/.config/outstage}. Holds the full-scale volts found by
 * {@link MeterCalibration} per input device and channel, and whether the live cautions were dismissed.
 * Written to a temporary sibling and moved into place, so a crash leaves the old file or the new one.
 */
public final class UserSettings {
    /** Environment variable naming the settings folder (shared with the workbench's dismissal file). */
    public static final String ENV = "OUTSTAGE_CONFIG";
    private static final String CAUTIONS_KEY = "live.cautions.dismissed";
    private final Path file;

    public UserSettings(Path file) { this.file = file; }

    /** The settings file where the environment says. */
    public static UserSettings standard() { return new UserSettings(folder(System.getenv())); }

    /** The settings folder for an environment (see the class comment). */
    static Path folder(Map<String, String> env) {
        String p = System.getProperty("outstage.config", env.get(ENV));
        if (p != null && !p.isBlank()) return Path.of(p).resolve("settings.properties");
        String xdg = env.get("XDG_CONFIG_HOME");
        Path base = xdg != null && !xdg.isBlank() ? Path.of(xdg) : Path.of(System.getProperty("user.home"), ".config");
        return base.resolve("outstage").resolve("settings.properties");
    }

    public Path file() { return file; }

    /** Remembered full-scale volts for an input device and channel (from 1). */
    public OptionalDouble fullScaleVolts(String device, int channel) {
        String v = load().getProperty(fsKey(device, channel));
        if (v == null) return OptionalDouble.empty();
        try {
            double d = Double.parseDouble(v.trim());
            return d > 0 && Double.isFinite(d) ? OptionalDouble.of(d) : OptionalDouble.empty();
        } catch (NumberFormatException e) {
            return OptionalDouble.empty();
        }
    }

    /** Remembers full-scale volts for an input device and channel (from 1). */
    public void setFullScaleVolts(String device, int channel, double volts) throws IOException {
        if (!(volts > 0 && Double.isFinite(volts))) throw new IllegalArgumentException("full-scale volts " + volts + " must be a positive number");
        Properties p = load();
        p.setProperty(fsKey(device, channel), Double.toString(volts));
        save(p);
    }

    public boolean cautionsDismissed() { return Boolean.parseBoolean(load().getProperty(CAUTIONS_KEY, "false")); }

    public void dismissCautions() throws IOException {
        Properties p = load();
        p.setProperty(CAUTIONS_KEY, "true");
        save(p);
    }

    static String fsKey(String device, int channel) {
        String d = device.trim().toLowerCase(Locale.ROOT).replaceAll("[^a-z0-9._@-]+", "_");
        return "fs-volts." + d + ".channel" + channel;
    }

    private Properties load() {
        Properties p = new Properties();
        if (Files.isRegularFile(file)) {
            try (Reader r = Files.newBufferedReader(file, StandardCharsets.UTF_8)) {
                p.load(r);
            } catch (IOException | IllegalArgumentException e) {
                // an unreadable settings file counts as empty; it is rewritten on the next save
            }
        }
        return p;
    }

    private void save(Properties p) throws IOException {
        Path dir = file.toAbsolutePath().getParent();
        Files.createDirectories(dir);
        Path tmp = Files.createTempFile(dir, ".settings", ".part");
        try {
            try (Writer w = Files.newBufferedWriter(tmp, StandardCharsets.UTF_8)) {
                p.store(w, "Outstage user settings");
            }
            Files.move(tmp, file, StandardCopyOption.REPLACE_EXISTING, StandardCopyOption.ATOMIC_MOVE);
        } finally {
            Files.deleteIfExists(tmp);
        }
    }
}
