package org.outstage.logbook;

/**
 * The logbook server cannot be reached, refused the login, or went away during a write. Nothing half-written is
 * left behind (each write is one transaction); the message says whether the last write may have been committed.
 */
public final class LogbookUnavailableException extends LogbookException {
    public LogbookUnavailableException(String message, Throwable cause) { super(message, cause); }
}
