package org.outstage.report;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.time.Instant;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import org.junit.jupiter.api.Test;
import org.outstage.json.JsonText;
import org.outstage.logbook.UnitUnderTest;
import org.outstage.verify.KeyFigures;
import org.outstage.verify.MeasuredChannel;
import org.outstage.verify.SpecParser;
import org.outstage.verify.Verifier;

class HtmlReportTest {
    static ReportDocument doc(String unitName) {
        var spec = SpecParser.parse("name Test <amp>\nthd <= 0.05 % at 1 kHz\nnoise <= 1 mV\n", "t.spec");
        var ch = List.of(new MeasuredChannel("a&b.wav", 1, KeyFigures.basic(1000, 2.83, "V", 0.0003, 0.0004)));
        return new ReportDocument(UnitUnderTest.named(unitName), Optional.empty(), Verifier.verify(spec, ch), ch, List.of(),
                Instant.parse("2026-03-14T10:00:00Z"), "outstage 0.1.0");
    }

    @Test
    void html_escapesText_andCarriesVerdictsAndCautions() {
        String h = HtmlReport.render(doc("DA-60 <\"proto\">"));
        assertTrue(h.contains("DA-60 &lt;&quot;proto&quot;&gt;") && !h.contains("<\"proto\">"), "escaped");
        assertTrue(h.contains("a&amp;b.wav"));
        assertTrue(h.contains("class=\"v-pass\">pass<") && h.contains("class=\"v-not-measured\">not measured<"));
        assertTrue(h.contains("0.03 %") && h.contains("+0.02 %"), "measured value and margin in the spec's unit");
        assertTrue(h.contains("INCOMPLETE"));
        for (String c : ReportDocument.CAUTIONS) assertTrue(h.contains(HtmlReport.esc(c)));
    }

    @SuppressWarnings("unchecked")
    @Test
    void json_hasTheSameVerdictsAsHtml() {
        Map<String, Object> j = (Map<String, Object>) JsonText.parse(JsonText.write(ReportJson.of(doc("DA-60"))));
        List<Object> limits = (List<Object>) j.get("limits");
        assertEquals("pass", ((Map<String, Object>) limits.get(0)).get("verdict"));
        assertEquals("not-measured", ((Map<String, Object>) limits.get(1)).get("verdict"));
        assertEquals(0.03, (Double) ((Map<String, Object>) limits.get(0)).get("measured"), 1e-12);
        assertEquals("incomplete", j.get("outcome"));
    }
}
