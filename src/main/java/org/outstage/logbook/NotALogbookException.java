package org.outstage.logbook;

/** The file given as a logbook is something else; it was not modified. */
public final class NotALogbookException extends LogbookException {
    public NotALogbookException(String message) { super(message); }
}
