/**
 * JavaFX workbench; the only package that imports javafx (and ControlsFX). {@link org.outstage.ui.Workbench}
 * is the Application, {@link org.outstage.ui.WorkbenchLauncher} the plain entry point used by the {@code gui}
 * command, {@link org.outstage.ui.ChartCanvas} our canvas renderer of {@code plot} chart descriptions (min/max
 * reduction per pixel column, zoom, pan, readout). {@code WorkbenchPane} holds the capture list with its calibration
 * (from each folder's {@code bench.txt}), the settings and the figures ({@code FiguresPanel}); each view is its own
 * class behind {@code WorkbenchView}: {@code WaveformView}, {@code SpectrumView}, {@code HarmonicsView},
 * {@code TransferView} (with {@code TransferPanel}, the model sheet), {@code LevelSweepView} and {@code LiveView}
 * (on {@code org.outstage.live} through {@code LiveSource}). Views show what the analysis and the model return;
 * files are opened and analysed in background tasks. See docs/workbench.md.
 */
package org.outstage.ui;
