package org.outstage.cli;

import java.util.LinkedHashSet;
import java.util.Locale;
import java.util.Map;
import java.util.Set;
import java.util.TreeMap;
import picocli.CommandLine.Option;

/**
 * The analyze options, shared by {@code session add}, {@code watch} and {@code verify} (a picocli mixin).
 * Each option remembers whether it was given, so the logbook can store which settings were defaulted.
 */
public final class LogbookAnalyzeOptions {
    static final int DEFAULT_CHANNEL = 1;
    static final String DEFAULT_BANDWIDTH = "20-20000";
    static final String DEFAULT_WEIGHTING = "none";
    static final int DEFAULT_HARMONICS = 10;

    @Option(names = "--channel", paramLabel = "N", description = "Channel to measure, from 1 (default 1).")
    Integer channel;

    @Option(names = "--bandwidth", paramLabel = "LOW-HIGH", description = "Measurement band in Hz (default 20-20000).")
    String bandwidth;

    @Option(names = "--weighting", paramLabel = "A|none", description = "Weighting of the noise in THD+N (default none).")
    String weighting;

    @Option(names = "--harmonics", paramLabel = "N", description = "Highest harmonic counted in THD (default 10).")
    Integer harmonics;

    @Option(names = "--fs-volts", paramLabel = "V", description = "Peak volts at digital full scale (soundcard calibration, divider included).")
    Double fsVolts;

    @Option(names = "--probe", paramLabel = "X", description = "Probe ratio for scope captures that did not apply it (e.g. 10).")
    Double probe;

    @Option(names = "--sample-rate", paramLabel = "HZ", description = "Sample rate when the file does not state it.")
    Double sampleRateHz;

    @Option(names = "--load", paramLabel = "OHMS", description = "Load resistance, for output power.")
    Double loadOhms;

    @Option(names = "--fundamental", paramLabel = "HZ", description = "Test frequency, when the fit should not search for it.")
    Double fundamentalHz;

    public int channel() { return channel == null ? DEFAULT_CHANNEL : channel; }

    /** The band as {low, high} in Hz. */
    public double[] bandHz() {
        String b = bandwidth == null ? DEFAULT_BANDWIDTH : bandwidth;
        String[] parts = b.split("-");
        try {
            if (parts.length != 2) throw new NumberFormatException();
            double lo = Double.parseDouble(parts[0].trim());
            double hi = Double.parseDouble(parts[1].trim());
            if (!(lo >= 0 && hi > lo)) throw new NumberFormatException();
            return new double[] {lo, hi};
        } catch (NumberFormatException e) {
            throw new BadInputException("--bandwidth '" + b + "' must be LOW-HIGH in Hz with LOW < HIGH, e.g. 20-20000");
        }
    }

    public boolean aWeighted() {
        String w = weighting == null ? DEFAULT_WEIGHTING : weighting.toLowerCase(Locale.ROOT);
        if (w.equals("a")) return true;
        if (w.equals("none")) return false;
        throw new BadInputException("--weighting '" + weighting + "' must be A or none");
    }

    public int harmonics() { return harmonics == null ? DEFAULT_HARMONICS : harmonics; }

    /** Checks the values once, before anything is read or written. */
    public void validate() {
        if (channel != null && channel < 1) throw new BadInputException("--channel " + channel + " must be >= 1");
        if (harmonics != null && harmonics < 2) throw new BadInputException("--harmonics " + harmonics + " must be >= 2");
        positive("--fs-volts", fsVolts);
        positive("--probe", probe);
        positive("--sample-rate", sampleRateHz);
        positive("--load", loadOhms);
        positive("--fundamental", fundamentalHz);
        bandHz();
        aWeighted();
    }

    private static void positive(String name, Double v) {
        if (v != null && !(v > 0 && Double.isFinite(v))) throw new BadInputException(name + " " + v + " must be > 0");
    }

    /** Every setting with its effective value (given or default); optional ones absent when not given. */
    public Map<String, String> settings() {
        Map<String, String> m = new TreeMap<>();
        m.put("channel", Integer.toString(channel()));
        m.put("bandwidth", bandwidth == null ? DEFAULT_BANDWIDTH : bandwidth);
        m.put("weighting", weighting == null ? DEFAULT_WEIGHTING : weighting);
        m.put("harmonics", Integer.toString(harmonics()));
        if (fsVolts != null) m.put("fs-volts", fsVolts.toString());
        if (probe != null) m.put("probe", probe.toString());
        if (sampleRateHz != null) m.put("sample-rate", sampleRateHz.toString());
        if (loadOhms != null) m.put("load", loadOhms.toString());
        if (fundamentalHz != null) m.put("fundamental", fundamentalHz.toString());
        return m;
    }

    /** Names of the settings that took their default. */
    public Set<String> defaulted() {
        Set<String> d = new LinkedHashSet<>();
        if (channel == null) d.add("channel");
        if (bandwidth == null) d.add("bandwidth");
        if (weighting == null) d.add("weighting");
        if (harmonics == null) d.add("harmonics");
        return d;
    }

    /** A copy measuring another channel (verify measures every channel of a capture). */
    LogbookAnalyzeOptions withChannel(int ch) {
        LogbookAnalyzeOptions o = new LogbookAnalyzeOptions();
        o.channel = ch;
        o.bandwidth = bandwidth;
        o.weighting = weighting;
        o.harmonics = harmonics;
        o.fsVolts = fsVolts;
        o.probe = probe;
        o.sampleRateHz = sampleRateHz;
        o.loadOhms = loadOhms;
        o.fundamentalHz = fundamentalHz;
        return o;
    }
}
