package org.outstage.plot;

import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import org.outstage.analysis.FrequencyResponse;
import org.outstage.analysis.Intermodulation;
import org.outstage.analysis.Levels;
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
        r.minus3dbLowHz().ifPresent(x -> marks.add(new Marker(x, -3.0103, "−3 dB " + Levels.formatHz(x))));
        r.minus3dbHighHz().ifPresent(x -> marks.add(new Marker(x, -3.0103, "−3 dB " + Levels.formatHz(x))));
        return new ChartSpec(name + " — frequency response", Axis.log("Frequency", "Hz"), Axis.linear("Gain re 1 kHz", "dB"),
                List.of(new Series("gain", f, g, Series.Style.LINE, Series.Role.MEASURED)), marks, List.of(),
                // the line is labelled only when no point is marked: a marker's label already says "−3 dB", and the
                // low point usually sits at the left end of the plot, where the line's label is drawn
                List.of(new HorizontalLine(-3.0103, marks.isEmpty() ? "−3 dB" : "", Series.Role.LIMIT)));
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
        // the products of the modulation method are sidebands f2 ± n·f1 of the high tone: the x axis spans them (a
        // log axis down to f1 would squeeze them into a few pixels beside f2), with the low tone's level in the title
        Axis x = Axis.linear("Frequency", "Hz");
        String tonesName = "tones";
        if (imd.method() == Intermodulation.Method.MODULATION) {
            double reach = imd.f1Hz();
            for (double f : pf) reach = Math.max(reach, Math.abs(f - imd.f2Hz()));
            x = x.withRange(Math.max(0, imd.f2Hz() - 1.25 * reach), imd.f2Hz() + 1.25 * reach);
            if (imd.f1Hz() < imd.f2Hz() - 1.25 * reach)
                tonesName = String.format(java.util.Locale.ROOT, "tones (f1 %s, %+.1f dB, off the axis)", Levels.formatHz(imd.f1Hz()), tl[0]);
        } else {
            // difference frequency: from the lowest product (f2 − f1) to the highest, with a margin so the bars at
            // either end stand clear of the axes
            double fMin = Math.min(imd.f1Hz(), imd.f2Hz()), fMax = Math.max(imd.f1Hz(), imd.f2Hz());
            for (double f : pf) { fMin = Math.min(fMin, f); fMax = Math.max(fMax, f); }
            double pad = 0.06 * (fMax - fMin);
            x = x.withRange(Math.max(0, fMin - pad), fMax + pad);
        }
        // bars rise from the floor of a dB axis, 10 dB below the lowest product
        double lo = Double.POSITIVE_INFINITY, hi = Double.NEGATIVE_INFINITY;
        for (double v : pl) { lo = Math.min(lo, v); hi = Math.max(hi, v); }
        for (double v : tl) { lo = Math.min(lo, v); hi = Math.max(hi, v); }
        Axis y = Axis.db("Level", unit);
        if (hi > lo) y = y.withRange(Math.floor((lo - 10) / 10) * 10, Math.ceil((hi + 15) / 10) * 10);   // room for the legend above the tones
        return new ChartSpec(name + " — intermodulation (" + imd.method().label() + ", " + String.format(java.util.Locale.ROOT, "%.4g %%", imd.percent()) + ")",
                x, y,
                List.of(new Series(tonesName, tf, tl, Series.Style.BARS, Series.Role.MEASURED),
                        new Series("products", pf, pl, Series.Style.BARS, Series.Role.MEASURED_ALT)), marks, List.of(), List.of());
    }

    /**
     * The hum lines in the capture unit's decibels ({@link Levels#levelDb}: dBV in volts, dBFS in full-scale units, as
     * the table prints them), with the band's noise rms and its A-weighted value as lines.
     */
    public static ChartSpec hum(String name, NoiseFigures n, String unit) {
        int k = n.hum().size();
        double[] f = new double[k], l = new double[k];
        for (int i = 0; i < k; i++) { f[i] = n.hum().get(i).frequencyHz(); l[i] = Levels.levelDb(Math.max(n.hum().get(i).rms(), 1e-12), unit); }
        return new ChartSpec(name + " — noise and hum", Axis.log("Frequency", "Hz"), Axis.linear("Level", Levels.levelDbUnit(unit)),
                List.of(new Series("hum lines", f, l, Series.Style.BARS, Series.Role.MEASURED)), List.of(), List.of(),
                List.of(new HorizontalLine(Levels.levelDb(n.rms(), unit), "noise in the band", Series.Role.MEASURED_ALT),
                        new HorizontalLine(Levels.levelDb(n.rmsA(), unit), "noise A-weighted", Series.Role.LIMIT)));
    }

    /**
     * The noise spectrum of a noise capture with its hum lines marked: the measurement's spectrum on the absolute
     * scale ({@link MeasurementCharts#spectrum}: dBV or dBFS), each hum line as a marker at its own rms, and the
     * band's noise rms and its A-weighted value as lines. Without a spectrum (a record with no fitted tone) it is
     * {@link #hum}'s chart of the lines alone.
     */
    public static ChartSpec noiseSpectrum(String name, org.outstage.analysis.Measurement m, NoiseFigures n) {
        Optional<ChartSpec> sp = MeasurementCharts.spectrum(name, m);
        if (sp.isEmpty()) return hum(name, n, m.unit());
        ChartSpec s = sp.get();
        // hum lines in the spectrum's unit: dBV is 20·lg(V); dBFS is 20·lg(peak re full scale) = 20·lg(rms·√2)
        double shift = "V".equals(m.unit()) ? 0 : 20 * Math.log10(Math.sqrt(2));
        List<Marker> marks = new ArrayList<>();
        for (NoiseFigures.HumLine h : n.hum())
            marks.add(new Marker(h.frequencyHz(), 20 * Math.log10(Math.max(h.rms(), 1e-12)) + shift,
                    h.harmonic() == 1 ? "mains" : h.harmonic() + "×"));
        return new ChartSpec(name + " — noise and hum", s.xAxis(), s.yAxis(), s.series(), marks, s.bands(),
                List.of(new HorizontalLine(n.db() + shift, "noise", Series.Role.MEASURED_ALT),
                        new HorizontalLine(n.dbA() + shift, "noise A-wtd", Series.Role.LIMIT)));
    }
}
