/** A small JSON writer and reader shared by the CLI, reports and the logbook (no third-party JSON library). */
package org.outstage.json;
