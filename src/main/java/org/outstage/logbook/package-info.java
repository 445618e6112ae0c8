/**
 * The logbook, one interface over two engines (an SQLite file on a bench, a PostgreSQL database for a shop): units
 * under test, sessions, stored captures (content-addressed by SHA-256, beside the file or in the database),
 * measurements with their provenance, bias steps; Flyway migrations; {@code push} from a bench into a shared logbook. Entry point
 * {@link org.outstage.logbook.Logbook}; exports in {@link org.outstage.logbook.SessionExport}; the bias advice
 * ({@link org.outstage.logbook.BiasAdvisor}) and drift ({@link org.outstage.logbook.DriftAnalysis}) read a
 * session's steps. Knows nothing of the analysis internals: the caller hands in the measurement as JSON text
 * and the indexed {@link org.outstage.verify.KeyFigures}.
 */
package org.outstage.logbook;
