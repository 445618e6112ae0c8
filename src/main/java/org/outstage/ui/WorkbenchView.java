package org.outstage.ui;

import java.util.List;
import javafx.scene.control.Tab;

/**
 * One view of the workbench (one tab in the middle): it shows what the analysis returned for the selected
 * capture ({@link ViewData}) or what a shared analysis function returns, and never computes a figure itself.
 */
interface WorkbenchView {
    /** The tab that holds the view; its id names the view ({@code waveformTab}, {@code spectrumTab}, …). */
    Tab tab();

    /** The charts of the view; the first is the one exported when the tab is chosen. */
    List<ChartCanvas> charts();

    /** Shows the result of the selected capture. */
    default void show(ViewData d) {}

    /** Shows a message in place of the view's charts (nothing selected, file unreadable…). */
    default void clear(String message) { for (ChartCanvas c : charts()) c.setMessage(message); }

    static ChartCanvas chart(String id) {
        ChartCanvas c = new ChartCanvas();
        c.setId(id);
        return c;
    }

    static Tab tab(String id, String title, javafx.scene.Node content) {
        Tab t = new Tab(title, content);
        t.setId(id);
        return t;
    }
}
