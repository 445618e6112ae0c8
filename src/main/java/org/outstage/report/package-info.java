/** Writers: JSON, CSV and self-contained HTML with SVG charts drawn from {@code plot}. */
package org.outstage.report;
