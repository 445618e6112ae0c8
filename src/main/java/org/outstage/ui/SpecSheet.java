package org.outstage.ui;

import java.util.List;
import java.util.Optional;

/**
 * The spec-sheet figures of one capture as the spec-sheet view shows them: which kind of capture it is (two-tone,
 * noise, sweep), the figure rows (the same rows the figures table lists) and one or two charts. Built by the
 * backend from the analysis' results; nothing is computed here.
 *
 * @param kind   what was measured, shown as the view's heading ("Intermodulation (smpte)", "Noise and hum", …)
 * @param rows   the figures, formatted
 * @param first  the main chart (the IMD products, the noise spectrum, the response gain)
 * @param second a second chart (the response phase), if the kind has one
 */
record SpecSheet(String kind, List<FigureRow> rows, Panel first, Optional<Panel> second) {
    SpecSheet {
        rows = List.copyOf(rows);
    }

    /** The same figures without the charts (see {@link ViewData#light}). */
    SpecSheet light(Panel placeholder) {
        return new SpecSheet(kind, rows, placeholder, second.map(p -> placeholder));
    }
}
