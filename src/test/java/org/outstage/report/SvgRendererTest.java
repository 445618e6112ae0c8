package org.outstage.report;

import static org.junit.jupiter.api.Assertions.*;

import java.io.ByteArrayInputStream;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;
import javax.xml.parsers.DocumentBuilderFactory;
import org.junit.jupiter.api.Test;
import org.outstage.plot.Axis;
import org.outstage.plot.Band;
import org.outstage.plot.ChartSpec;
import org.outstage.plot.HorizontalLine;
import org.outstage.plot.Marker;
import org.outstage.plot.Series;
import org.w3c.dom.Document;
import org.w3c.dom.Element;
import org.w3c.dom.NodeList;

/** The SVG is checked with the JDK's XML parser (well-formedness) and by reading back what was drawn. */
class SvgRendererTest {

    private static Document parse(String svg) throws Exception {
        return DocumentBuilderFactory.newInstance().newDocumentBuilder()
                .parse(new ByteArrayInputStream(svg.getBytes(StandardCharsets.UTF_8)));
    }

    private static List<String> texts(Document d) {
        NodeList n = d.getElementsByTagName("text");
        List<String> out = new ArrayList<>();
        for (int i = 0; i < n.getLength(); i++) out.add(n.item(i).getTextContent());
        return out;
    }

    @Test
    void spectrum_hasUnitsDecadeGridMarkersBandAndLegend() throws Exception {
        int n = 2000;
        double[] f = new double[n], db = new double[n];
        for (int i = 0; i < n; i++) { f[i] = 10 + i * 10; db[i] = -120 + (i % 100 == 99 ? 100 : 0); }
        ChartSpec spec = new ChartSpec("Spectrum <test>", Axis.log("Frequency", "Hz"), Axis.db("Level", "dBV"),
                List.of(new Series("output & more", f, db, Series.Style.LINE, Series.Role.MEASURED)),
                List.of(new Marker(2000, -20, "H2")), List.of(new Band(20, 20_000, "band")),
                List.of(new HorizontalLine(-110, "noise floor", Series.Role.LIMIT)));
        String svg = SvgRenderer.render(spec, 800, 400);
        Document d = parse(svg);
        List<String> t = texts(d);
        assertTrue(t.contains("Frequency (Hz)"), t.toString());
        assertTrue(t.contains("Level (dBV)"));
        assertTrue(t.contains("Spectrum <test>"));
        assertTrue(t.contains("output & more"));
        assertTrue(t.contains("H2"));
        assertTrue(t.contains("noise floor"));
        assertTrue(t.containsAll(List.of("100", "1k", "10k")), t.toString());
        // decade grid on 10 Hz .. 20 kHz: majors at 10,100,1k,10k plus minors 2..9 per decade, 20k
        NodeList lines = d.getElementsByTagName("line");
        int vertical = 0;
        for (int i = 0; i < lines.getLength(); i++) {
            Element e = (Element) lines.item(i);
            if (e.getAttribute("x1").equals(e.getAttribute("x2")) && !e.getAttribute("y1").equals(e.getAttribute("y2"))) vertical++;
        }
        assertEquals(4 + 3 * 8 + 1, vertical);
        assertEquals("svg", d.getDocumentElement().getTagName());
    }

    @Test
    void millionPointWaveform_isDecimatedButKeepsItsSpike() throws Exception {
        int n = 1_000_000;
        double[] t = new double[n], y = new double[n];
        for (int i = 0; i < n; i++) { t[i] = i / 96_000.0; y[i] = Math.sin(2 * Math.PI * 1000 * t[i]) * 0.5; }
        y[500_000] = 0.9;   // a single-sample spike above the sine's 0.5 peak
        ChartSpec spec = ChartSpec.of("Waveform", Axis.linear("Time", "s"), Axis.linear("Output", "V").withRange(-1, 1),
                List.of(new Series("output", t, y, Series.Style.LINE, Series.Role.MEASURED)));
        int width = 640, height = 360;
        String svg = SvgRenderer.render(spec, width, height);
        Element path = (Element) parse(svg).getElementsByTagName("path").item(0);
        String dAttr = path.getAttribute("d");
        int points = dAttr.split("[ML]").length - 1;
        assertTrue(points <= 2 * width + 4, "points " + points);
        // the spike's pixel y: top 34, plot height 360-34-50 = 276, y=0.9 on [-1,1] -> 34 + 276*(1-0.9)/2 = 47.8
        assertTrue(dAttr.contains(" 47.8"), "spike drawn at y=47.8");
    }

    @Test
    void nanGap_breaksThePath() throws Exception {
        ChartSpec spec = ChartSpec.of("g", Axis.linear("x", ""), Axis.linear("y", ""),
                List.of(new Series("s", new double[] {0, 1, 2, 3, 4}, new double[] {0, 1, Double.NaN, 1, 0}, Series.Style.LINE, Series.Role.MEASURED)));
        String d = ((Element) parse(SvgRenderer.render(spec, 300, 200)).getElementsByTagName("path").item(0)).getAttribute("d");
        assertEquals(2, d.chars().filter(c -> c == 'M').count());
    }
}
