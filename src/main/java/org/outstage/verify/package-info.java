/** Specification profiles, limits and pass/fail verdicts against a measured amplifier. */
package org.outstage.verify;
