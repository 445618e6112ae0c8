package org.outstage.ui;

import java.util.List;
import javafx.scene.control.Tab;

/** The harmonic profile: one bar per harmonic in dBc, as the analysis measured it. */
final class HarmonicsView implements WorkbenchView {
    final ChartCanvas harmonicsChart = WorkbenchView.chart("harmonicsChart");
    private final Tab tab = WorkbenchView.tab("harmonicsTab", "Harmonic profile", harmonicsChart);

    @Override public Tab tab() { return tab; }
    @Override public List<ChartCanvas> charts() { return List.of(harmonicsChart); }
    @Override public void show(ViewData d) { d.harmonics().showOn(harmonicsChart); }
}
