/**
 * JSON text for the CLI, reports and the logbook: {@link org.outstage.json.JsonText}, a small writer and reader on
 * jackson-core's streaming API. The only package that imports Jackson (ArchitectureTest).
 */
package org.outstage.json;
