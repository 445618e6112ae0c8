package org.outstage.report;

import java.util.Locale;
import org.outstage.analysis.Measurement;
import org.outstage.analysis.Plausibility;
import org.outstage.analysis.stage.ClipSide;
import org.outstage.analysis.stage.ClippingMetrics;
import org.outstage.analysis.stage.CrossoverMetrics;
import org.outstage.analysis.stage.StageDiagnosis;

/** The readable text table and the CSV rows of {@code analyze}. Renders a {@link Measurement}; computes nothing. */
public final class FigureTable {
    private FigureTable() {}

    /** The line that shows a capture's generator channel as the reference (no power, no verdict: it is not an output). */
    public static String generatorLine(String file, int channel) {
        return String.format(Locale.ROOT, "%s  channel %d  generator (reference): the X-Y input of the other channels; no power, no verdict%n",
                file, channel);
    }

    /** The spec-sheet lines (issue 12): IMD, noise and hum, crosstalk, when the measurement carries them. */
    static void specSheet(StringBuilder sb, Measurement m) {
        String u = m.unit();
        m.imd().ifPresent(i -> sb.append(String.format(Locale.ROOT, "  IMD           %s %%   (%.1f dB)   %s, %s Hz + %s Hz at %.2f:1, d2 %s %%, d3 %s %%%n",
                sig(i.percent()), i.db(), i.method().label(), num(i.f1Hz()), num(i.f2Hz()), i.ratio(), sig(100 * i.order(2)), sig(100 * i.order(3)))));
        m.noise().ifPresent(n -> {
            // dBV in volts; in full-scale units dBFS (AES17: re the rms of a full-scale sine)
            String dbUnit = org.outstage.analysis.Levels.levelDbUnit(u);
            sb.append(String.format(Locale.ROOT, "  noise         %s %s rms (%.1f %s), A-weighted %s %s rms (%.1f %s), band %s-%s Hz%n", sig(n.rms()), u,
                    org.outstage.analysis.Levels.levelDb(n.rms(), u), dbUnit, sig(n.rmsA()), u,
                    org.outstage.analysis.Levels.levelDb(n.rmsA(), u), dbUnit, num(n.lowHz()), num(n.highHz())));
            if (!n.hum().isEmpty()) {
                sb.append("  hum          ");
                for (var h : n.hum()) sb.append(String.format(Locale.ROOT, "  %s Hz %s %s", num(h.frequencyHz()), sig(h.rms()), u));
                sb.append(System.lineSeparator());
            }
            if (n.snrRe1WDb().isPresent())
                sb.append(String.format(Locale.ROOT, "  S/N           %.1f dB re 1 W (%.1f dB A)%s%n", n.snrRe1WDb().getAsDouble(), n.snrRe1WADb().getAsDouble(),
                        n.snrReRatedDb().isPresent() ? String.format(Locale.ROOT, ", %.1f dB re rated (%.1f dB A)", n.snrReRatedDb().getAsDouble(),
                                n.snrReRatedADb().getAsDouble()) : ""));
        });
        m.crosstalk().ifPresent(x -> sb.append(String.format(Locale.ROOT, "  crosstalk     %s%.1f dB from channel %d at %s Hz%n", x.resolved() ? "" : "<",
                x.db(), x.fromChannel(), num(x.frequencyHz()))));
    }

    /** " ± σ unit" when the standard error is a positive number, else nothing. */
    static String plusMinus(double stdError, String unit) {
        return stdError > 0 && Double.isFinite(stdError) ? String.format(Locale.ROOT, " ± %.1e %s", stdError, unit) : "";
    }

    /** A block of lines for one analysed channel. */
    public static String text(String file, Measurement m) {
        StringBuilder sb = new StringBuilder();
        String u = m.unit();
        sb.append(String.format(Locale.ROOT, "%s  channel %d  %s Hz  %.3f s  unit %s%n", file, m.channel(), num(m.sampleRateHz()),
                m.durationSeconds(), u));
        if (!m.measured()) {
            sb.append("  not measured: ").append(m.notMeasuredReason().get()).append(System.lineSeparator());
            specSheet(sb, m);
            sb.append(System.lineSeparator());
            return sb.toString();
        }
        specSheet(sb, m);
        if (m.noise().isPresent()) {
            // a noise capture (input shorted, or no tone above 10 mV): its strongest line is hum or noise, not a test
            // tone, so distortion, power and stage figures of that line would describe nothing about the amplifier
            sb.append(String.format(Locale.ROOT, "  strongest line %s Hz  %s %s rms: not a test tone (noise capture); no distortion, power or stage figures%n",
                    num(m.fundamental().frequencyHz()), sig(m.fundamental().rms()), u));
            sb.append(System.lineSeparator());
            return sb.toString();
        }
        sb.append(String.format(Locale.ROOT, "  fundamental   %.4f Hz   %s %s rms (%s %s peak)%n", m.fundamental().frequencyHz(),
                sig(m.fundamental().rms()), u, sig(m.fundamental().amplitudePeak()), u));
        sb.append(String.format(Locale.ROOT, "  THD           %s %%   (%.1f dB)   THD_R %s %%%n", sig(m.thd().percent()), m.thd().db(),
                sig(m.thdR().percent())));
        sb.append(String.format(Locale.ROOT, "  THD+N         %s %%   (%.1f dB)   band %s-%s Hz, %s   floor %.1f dB (%s)%s%n",
                sig(m.thdN().percent()), m.thdN().db(), num(m.thdN().lowHz()), num(m.thdN().highHz()),
                m.thdN().weighting() == org.outstage.analysis.Weighting.A ? "A-weighted" : "unweighted",
                m.floor().db(), m.floor().kind().name().toLowerCase(Locale.ROOT).replace('_', ' '),
                m.thdN().atFloor() ? "  [at the floor]" : ""));
        sb.append(String.format(Locale.ROOT, "  SINAD         %.1f dB   ENOB %.1f   DC offset %s %s%n", m.sinadDb(), m.enob(), sig(m.dcOffset()), u));
        m.powerWatts().ifPresent(p -> sb.append(String.format(Locale.ROOT, "  power         %s W into %s ohm (fundamental), %s W total%n",
                sig(p.fundamentalWatts()), num(p.loadOhms()), sig(p.totalWatts()))));
        if (!m.harmonics().isEmpty()) {
            sb.append("  harmonics dBc");
            for (Measurement.Harmonic h : m.harmonics())
                sb.append(String.format(Locale.ROOT, "  H%d %s%.1f", h.order(), h.resolved() ? "" : "<", h.dbc()));
            sb.append(System.lineSeparator());
            if (m.harmonics().stream().anyMatch(h -> !h.resolved()))
                sb.append("                (<: not above the noise in its bins; the figure is an upper bound)").append(System.lineSeparator());
        }
        StageDiagnosis d = m.stage();
        if (d instanceof StageDiagnosis.Measured s) {
            ClippingMetrics c = s.clipping();
            if (c.detected()) { // clipping first: it is what the listener hears and what the crossover reading has to allow for
                sb.append(String.format(Locale.ROOT, "  clipping      positive %s, negative %s, asymmetry %s, first: %s%n",
                        c.positive().map(p -> sig(p.levelVolts()) + " " + u + " (" + knee(p) + ")").orElse("none"),
                        c.negative().map(p -> sig(p.levelVolts()) + " " + u + " (" + knee(p) + ")").orElse("none"),
                        c.asymmetryPercent().isPresent() ? String.format(Locale.ROOT, "%.2f %%", c.asymmetryPercent().getAsDouble()) : "n/a",
                        c.clipsFirst().label()));
            }
            CrossoverMetrics x = s.crossover();
            if (!Plausibility.crossoverGiven(m)) {
                sb.append("  crossover     not given: ").append(Plausibility.crossoverNotGiven(m).orElseThrow()).append(System.lineSeparator());
            } else {
                sb.append(String.format(Locale.ROOT, "  crossover     gain at zero %.4f (standard error %s): %s (confidence %.2f)%n", x.gainAtZero(),
                        String.format(Locale.ROOT, "%.1e", x.gainAtZeroStdError()), x.verdict().label(), x.confidence()));
                sb.append(String.format(Locale.ROOT, "                notch width %s %s%s, depth %s %s%s (%.3f %% of peak)%n", sig(x.notchWidthVolts()), u,
                        plusMinus(x.resolution().notchWidthStdErrorVolts(), u), sig(x.notchDepthVolts()), u,
                        plusMinus(x.resolution().notchDepthStdErrorVolts(), u), 100 * x.notchDepthFraction()));
                sb.append("                ").append(x.explanation()).append(System.lineSeparator());
            }
            if (!c.detected()) sb.append("  clipping      none detected").append(System.lineSeparator());
            s.reference().ifPresent(a -> sb.append(String.format(Locale.ROOT, "  reference     delay %.3f samples (%s s), gain %.4f%n",
                    a.delaySamples(), sig(a.delaySeconds()), a.gain())));
        } else if (d instanceof StageDiagnosis.NotMeasured n) {
            sb.append("  output stage  not diagnosed: ").append(n.reason()).append(System.lineSeparator());
        }
        sb.append(System.lineSeparator());
        return sb.toString();
    }

    private static String knee(ClipSide s) { return s.knee().name().toLowerCase(Locale.ROOT) + " " + (s.knee() == ClipSide.Knee.HARD ? "flat top" : "knee"); }

    /** Header of the CSV face. */
    public static String csvHeader() {
        return "file,channel,unit,sample_rate_hz,frequency_hz,rms,thd_percent,thd_n_percent,thd_n_low_hz,thd_n_high_hz,weighting,"
                + "sinad_db,enob,floor_db,power_w,gain_at_zero,verdict,clipping,positive_level,negative_level,asymmetry_percent,not_measured\n";
    }

    /** One CSV row. */
    public static String csvRow(String file, Measurement m) {
        StringBuilder sb = new StringBuilder();
        StageDiagnosis d = m.stage();
        StageDiagnosis.Measured s = d instanceof StageDiagnosis.Measured x ? x : null;
        cells(sb, quote(file), m.channel(), m.unit(), m.sampleRateHz(), m.fundamental().frequencyHz(), m.fundamental().rms(),
                m.thd().percent(), m.thdN().percent(), m.thdN().lowHz(), m.thdN().highHz(),
                m.thdN().weighting().name().toLowerCase(Locale.ROOT), m.sinadDb(), m.enob(), m.floor().db(),
                m.powerWatts().map(p -> (Object) p.totalWatts()).orElse(""),
                s == null ? "" : s.crossover().gainAtZero(), s == null ? "" : s.crossover().verdict().label(),
                s == null ? "" : s.clipping().detected(),
                s == null ? "" : s.clipping().positive().map(p -> (Object) p.levelVolts()).orElse(""),
                s == null ? "" : s.clipping().negative().map(p -> (Object) p.levelVolts()).orElse(""),
                s == null || s.clipping().asymmetryPercent().isEmpty() ? "" : s.clipping().asymmetryPercent().getAsDouble(),
                quote(m.notMeasuredReason().orElse("")));
        return sb.toString();
    }

    private static void cells(StringBuilder sb, Object... v) {
        for (int i = 0; i < v.length; i++) {
            if (i > 0) sb.append(',');
            Object o = v[i];
            if (o instanceof Double d) sb.append(Double.isFinite(d) ? Double.toString(d) : "");
            else sb.append(o);
        }
        sb.append('\n');
    }

    private static String quote(String s) {
        if (s.indexOf(',') < 0 && s.indexOf('"') < 0 && s.indexOf('\n') < 0) return s;
        return '"' + s.replace("\"", "\"\"") + '"';
    }

    /** Four significant digits, plain for ordinary magnitudes. */
    static String sig(double v) {
        if (!Double.isFinite(v)) return "n/a";
        if (v == 0) return "0";
        double a = Math.abs(v);
        if (a >= 1e-3 && a < 1e6) {
            int decimals = Math.max(0, 3 - (int) Math.floor(Math.log10(a)));
            return String.format(Locale.ROOT, "%." + decimals + "f", v);
        }
        return String.format(Locale.ROOT, "%.3e", v);
    }

    private static String num(double v) {
        if (v == Math.rint(v) && Math.abs(v) < 1e9) return Long.toString((long) v);
        return sig(v);
    }
}
