/** SQLite logbook: units under test, sessions, stored captures, measurements, bias steps; numbered migrations. */
package org.outstage.logbook;
