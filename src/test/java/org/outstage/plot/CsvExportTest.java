package org.outstage.plot;

import static org.junit.jupiter.api.Assertions.*;

import java.io.StringReader;
import java.util.List;
import org.apache.commons.csv.CSVFormat;
import org.apache.commons.csv.CSVRecord;
import org.junit.jupiter.api.Test;

/** Round trip through an independent CSV parser (Commons CSV, RFC 4180). */
class CsvExportTest {
    @Test
    void series_roundTripThroughRfc4180Parser() throws Exception {
        ChartSpec spec = new ChartSpec("T", Axis.linear("Time", "s"), Axis.linear("Output, measured", "V"),
                List.of(new Series("a \"quoted\", name", new double[] {0, 1e-3, 2e-3}, new double[] {0.5, Double.NaN, -1.25},
                        Series.Style.LINE, Series.Role.MEASURED)),
                List.of(new Marker(1, 2, "H2")), List.of(), List.of(new HorizontalLine(1, "1 %", Series.Role.LIMIT)));
        List<CSVRecord> rows = CSVFormat.RFC4180.parse(new StringReader(CsvExport.toCsv(spec))).getRecords();
        assertEquals(List.of("series", "role", "Time (s)", "Output, measured (V)"), rows.get(0).toList());
        assertEquals(List.of("a \"quoted\", name", "measured", "0.0", "0.5"), rows.get(1).toList());
        assertEquals("", rows.get(2).get(3), "gap as empty cell");
        assertEquals(-1.25, Double.parseDouble(rows.get(3).get(3)));
        assertEquals("marker H2", rows.get(4).get(0));
        assertEquals("1.0", rows.get(5).get(3));
        assertEquals(6, rows.size());
    }
}
