/**
 * Renderer-neutral chart descriptions (no JavaFX here): {@link org.outstage.plot.ChartSpec} with its
 * {@link org.outstage.plot.Axis axes}, {@link org.outstage.plot.Series series}, markers, bands and lines; the
 * builders of the standard charts ({@link org.outstage.plot.Charts} from arrays and value types,
 * {@link org.outstage.plot.MeasurementCharts} from a Measurement); the shared layout, ticks and palette; the
 * min/max {@link org.outstage.plot.Decimator}; and {@link org.outstage.plot.CsvExport}. The SVG renderer
 * ({@code report.SvgRenderer}) and the workbench canvas ({@code ui.ChartCanvas}) draw the same descriptions.
 */
package org.outstage.plot;
