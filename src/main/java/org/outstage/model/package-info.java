/** Output-stage physics: device law, topologies, solver, predicted transfer curve and distortion, bias fit. Knows nothing of files. */
package org.outstage.model;
