/** Renderer-neutral chart descriptions (series, axes with units, markers) built from results; no JavaFX here. */
package org.outstage.plot;
