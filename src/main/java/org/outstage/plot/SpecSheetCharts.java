package org.outstage.plot;

import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import org.outstage.analysis.FrequencyResponse;
import org.outstage.analysis.Intermodulation;
import org.outstage.analysis.NoiseFigures;

/**
 * Renderer-neutral charts of the spec-sheet figures (issue 12), for the HTML report now and the workbench later:
 * the swept response (gain re 1 kHz and phase, −3 dB points marked), THD against frequency, the intermodulation
 * products beside their tones, and the hum lines beside the noise level.
 */
public final class SpecSheetCharts {
    private SpecSheetCharts() {}

    /** Gain relative to 1 kHz against frequency, with the −3 dB points as markers and the −3 dB level as a line. */
    public static ChartSpec responseGain(String name, FrequencyResponse r) {
        int n = r.points().size();
        double[] f = new double[n], g = new double[n];
        for (int i = 0; i < n; i++) { f[i] = r.points().get(i).frequencyHz(); g[i] = r.points().get(i).gainRe1kHzDb(); }
        List<Marker> marks = new ArrayList<>();
        r.minus3dbLowHz().ifPresent(x -> marks.add(new Marker(x, -3.0103, String.format(java.util.Locale.ROOT, "−3 dB %.3g Hz", x))));
        r.minus3dbHighHz().ifPresent(x -> marks.add(new Marker(x, -3.0103, String.format(java.util.Locale.ROOT, "−3 dB %.3g Hz", x))));
        return new ChartSpec(name + " — frequency response", Axis.log("Frequency", "Hz"), Axis.linear("Gain re 1 kHz", "dB"),
                List.of(new Series("gain", f, g, Series.Style.LINE, Series.Role.MEASURED)), marks, List.of(),
                List.of(new HorizontalLine(-3.0103, "−3 dB", Series.Role.LIMIT)));
    }

    /** Phase against frequency. */
    public static ChartSpec responsePhase(String name, FrequencyResponse r) {
        int n = r.points().size();
        double[] f = new double[n], p = new double[n];
        for (int i = 0; i < n; i++) { f[i] = r.points().get(i).frequencyHz(); p[i] = r.points().get(i).phaseDeg(); }
        return ChartSpec.of(name + " — phase", Axis.log("Frequency", "Hz"), Axis.linear("Phase", "°"),
                List.of(new Series("phase", f, p, Series.Style.LINE, Series.Role.MEASURED)));
    }

    /** THD (H2…H5) against the fundamental's frequency, or empty when the sweep gave none. */
    public static Optional<ChartSpec> thdVsFrequency(String name, FrequencyResponse r) {
        if (r.thdVsFrequency().isEmpty()) return Optional.empty();
        int n = r.thdVsFrequency().size();
        double[] f = new double[n], t = new double[n];
        for (int i = 0; i < n; i++) { f[i] = r.thdVsFrequency().get(i).frequencyHz(); t[i] = Math.max(1e-6, r.thdVsFrequency().get(i).percent()); }
        return Optional.of(ChartSpec.of(name + " — THD against frequency", Axis.log("Frequency", "Hz"), Axis.log("THD", "%"),
                List.of(new Series("THD (H2–H5)", f, t, Series.Style.LINE, Series.Role.MEASURED))));
    }

    /** The two tones and the products, each in dB relative to the method's reference, products marked with their order. */
    public static ChartSpec intermodulation(String name, Intermodulation imd) {
        double ref = imd.method() == Intermodulation.Method.MODULATION ? imd.f2Rms() : imd.f1Rms() + imd.f2Rms();
        double[] tf = {imd.f1Hz(), imd.f2Hz()};
        double[] tl = {20 * Math.log10(imd.f1Rms() / ref), 20 * Math.log10(imd.f2Rms() / ref)};
        int n = imd.products().size();
        double[] pf = new double[n], pl = new double[n];
        List<Marker> marks = new ArrayList<>();
        for (int i = 0; i < n; i++) {
            Intermodulation.Product p = imd.products().get(i);
            pf[i] = p.frequencyHz();
            pl[i] = Math.max(-200, p.dbc());
            marks.add(new Marker(pf[i], pl[i], "d" + p.order()));
        }
        String unit = imd.method() == Intermodulation.Method.MODULATION ? "dB re f2" : "dB re f1+f2";
        boolean wide = imd.f2Hz() / imd.f1Hz() > 4;
        return new ChartSpec(name + " — intermodulation (" + imd.method().label() + ", " + String.format(java.util.Locale.ROOT, "%.4g %%", imd.percent()) + ")",
                wide ? Axis.log("Frequency", "Hz") : Axis.linear("Frequency", "Hz"), Axis.linear("Level", unit),
                List.of(new Series("tones", tf, tl, Series.Style.BARS, Series.Role.MEASURED),
                        new Series("products", pf, pl, Series.Style.BARS, Series.Role.MEASURED_ALT)), marks, List.of(), List.of());
    }

    /** The hum lines in dB re 1 unit (dBV in volts), with the band's noise rms and its A-weighted value as lines. */
    public static ChartSpec hum(String name, NoiseFigures n, String unit) {
        int k = n.hum().size();
        double[] f = new double[k], l = new double[k];
        for (int i = 0; i < k; i++) { f[i] = n.hum().get(i).frequencyHz(); l[i] = 20 * Math.log10(Math.max(n.hum().get(i).rms(), 1e-12)); }
        String u = "V".equals(unit) ? "dBV" : "dB re 1 " + unit;
        return new ChartSpec(name + " — noise and hum", Axis.log("Frequency", "Hz"), Axis.linear("Level", u),
                List.of(new Series("hum lines", f, l, Series.Style.BARS, Series.Role.MEASURED)), List.of(), List.of(),
                List.of(new HorizontalLine(n.db(), "noise in the band", Series.Role.MEASURED_ALT),
                        new HorizontalLine(n.dbA(), "noise A-weighted", Series.Role.LIMIT)));
    }
}
