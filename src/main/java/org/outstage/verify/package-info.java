/**
 * Specification profiles ({@link org.outstage.verify.SpecParser}, format in docs/spec-format.md), limits and
 * pass/fail verdicts ({@link org.outstage.verify.Verifier}) against the key figures of measured channels
 * ({@link org.outstage.verify.KeyFigures}, also the logbook's indexed columns).
 */
package org.outstage.verify;
