package org.outstage.cli;

import java.util.Objects;
import java.util.function.Supplier;

/**
 * Which {@link LogbookMeasurer} the logbook commands use. The analysis pipeline's measurer is the default;
 * tests may install another for the duration of a test.
 */
public final class LogbookMeasurers {
    private static volatile Supplier<LogbookMeasurer> current = LogbookMeasurers::pipeline;

    private LogbookMeasurers() {}

    static LogbookMeasurer current() { return current.get(); }

    /** Installs {@code m} until the returned handle is closed. */
    public static AutoCloseable install(LogbookMeasurer m) {
        Objects.requireNonNull(m, "m");
        Supplier<LogbookMeasurer> before = current;
        current = () -> m;
        return () -> current = before;
    }

    private static LogbookMeasurer pipeline() {
        return new LogbookPipelineMeasurer();
    }
}
