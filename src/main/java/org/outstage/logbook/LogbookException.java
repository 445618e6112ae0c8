package org.outstage.logbook;

/** The logbook could not do what was asked (I/O or database fault). The message names the file. */
public class LogbookException extends RuntimeException {
    public LogbookException(String message) { super(message); }
    public LogbookException(String message, Throwable cause) { super(message, cause); }
}
