package org.outstage.ui;

/**
 * One row of the figures table: a quantity, its value as shown, its unit, and a note (for example the
 * measurement floor beside THD+N). Text only: the numbers come formatted from a result, never computed here.
 */
public record FigureRow(String id, String quantity, String value, String unit, String note) {
    /** Tab-separated line for the clipboard. */
    String tsv() { return quantity + "\t" + value + "\t" + unit + "\t" + note; }
}
