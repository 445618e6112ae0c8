package org.outstage.cli;

/** Bad input reported by a command: the CLI prints the message as one line and exits 2. */
public final class BadInputException extends RuntimeException {
    public BadInputException(String message) { super(message); }
    public BadInputException(String message, Throwable cause) { super(message, cause); }
}
