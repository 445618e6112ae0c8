/** JavaFX workbench; the only package that imports javafx. */
package org.outstage.ui;
