package org.outstage.plot;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.util.Locale;

/**
 * Writes a chart's data as CSV (RFC 4180 quoting, "." decimal point): one row per point, in long form
 * {@code series,role,x,y} with the axis titles and units in the header. A gap (NaN) is an empty cell.
 * Markers, bands and lines follow as rows whose series column says what they are.
 */
public final class CsvExport {
    private CsvExport() {}

    public static String toCsv(ChartSpec spec) {
        StringBuilder sb = new StringBuilder();
        write(spec, sb);
        return sb.toString();
    }

    public static void write(ChartSpec spec, Appendable out) {
        try {
            out.append("series,role,").append(quote(spec.xAxis().title())).append(',')
                    .append(quote(spec.yAxis().title())).append("\r\n");
            for (Series s : spec.series()) {
                String head = quote(s.name()) + "," + s.role().name().toLowerCase(Locale.ROOT) + ",";
                for (int i = 0; i < s.size(); i++)
                    out.append(head).append(num(s.xAt(i))).append(',').append(num(s.yAt(i))).append("\r\n");
            }
            for (Marker m : spec.markers())
                out.append(quote("marker " + m.label())).append(",marker,").append(num(m.x())).append(',').append(num(m.y())).append("\r\n");
            for (Band b : spec.bands()) {
                out.append(quote("band " + b.label() + " from")).append(",band,").append(num(b.fromX())).append(",\r\n");
                out.append(quote("band " + b.label() + " to")).append(",band,").append(num(b.toX())).append(",\r\n");
            }
            for (HorizontalLine l : spec.lines())
                out.append(quote("line " + l.label())).append(',').append(l.role().name().toLowerCase(Locale.ROOT))
                        .append(",,").append(num(l.y())).append("\r\n");
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    static String num(double v) {
        if (Double.isNaN(v)) return "";
        return Double.toString(v);
    }

    static String quote(String s) {
        if (s.indexOf(',') < 0 && s.indexOf('"') < 0 && s.indexOf('\n') < 0 && s.indexOf('\r') < 0) return s;
        return '"' + s.replace("\"", "\"\"") + '"';
    }
}
