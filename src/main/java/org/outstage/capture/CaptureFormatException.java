package org.outstage.capture;

import java.nio.file.Path;

/**
 * A capture file that cannot be read as claimed. The message is one line: file, place, problem,
 * e.g. {@code "amp.wav: byte 20: fmt chunk is 12 bytes, at least 16 needed"}.
 */
public final class CaptureFormatException extends Exception {
    private final String file;
    private final String location;
    private final String problem;

    public CaptureFormatException(Path file, String location, String problem) {
        this(file == null ? "<memory>" : String.valueOf(file.getFileName()), location, problem, null);
    }

    public CaptureFormatException(Path file, String location, String problem, Throwable cause) {
        this(file == null ? "<memory>" : String.valueOf(file.getFileName()), location, problem, cause);
    }

    private CaptureFormatException(String file, String location, String problem, Throwable cause) {
        super(file + ": " + location + ": " + problem, cause);
        this.file = file;
        this.location = location;
        this.problem = problem;
    }

    /** Convenience for a byte offset in a binary file. */
    public static CaptureFormatException atByte(Path file, long offset, String problem) {
        return new CaptureFormatException(file, "byte " + offset, problem);
    }

    /** Convenience for a line (and optional column, 1-based; 0 for none) in a text file. */
    public static CaptureFormatException atLine(Path file, long line, int column, String problem) {
        return new CaptureFormatException(file, column > 0 ? "line " + line + ", column " + column : "line " + line, problem);
    }

    /** The one wording for a file that cannot be opened or read (missing, no permission, other I/O failure). */
    static CaptureFormatException unreadable(Path file, java.io.IOException e) {
        if (e instanceof java.nio.file.NoSuchFileException)
            return new CaptureFormatException(file, "file", "not found (" + file.toAbsolutePath() + ")");
        if (e instanceof java.nio.file.AccessDeniedException)
            return new CaptureFormatException(file, "file", "permission denied (" + file.toAbsolutePath() + ")");
        return new CaptureFormatException(file, "file", "cannot be read: " + e.getMessage(), e);
    }

    public String file() { return file; }
    public String location() { return location; }
    public String problem() { return problem; }
}
