/** picocli commands, exit codes (0 ok, 1 fault or failed limit, 2 bad input), progress on stderr. */
package org.outstage.cli;
