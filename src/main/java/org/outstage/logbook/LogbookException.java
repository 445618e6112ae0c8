package org.outstage.logbook;

/** The logbook could not do what was asked (I/O or database fault). The message names the file or server. */
public class LogbookException extends RuntimeException {
    public LogbookException(String message) { super(message); }
    public LogbookException(String message, Throwable cause) { super(message, cause); }

    /** The first line of a message, stripped (drivers and Flyway write several). */
    static String oneLine(String s) {
        if (s == null) return "";
        String t = s.strip();
        int nl = t.indexOf('\n');
        return nl < 0 ? t : t.substring(0, nl).strip();
    }
}
