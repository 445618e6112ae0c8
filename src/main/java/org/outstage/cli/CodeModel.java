package org.outstage.cli;

import java.util.function.Consumer;
import java.util.function.Supplier;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Model.IGetter;
import picocli.CommandLine.Model.ISetter;
import picocli.CommandLine.Model.OptionSpec;

/**
 * Pieces for the commands whose picocli model is built in code instead of read from annotations: the root command,
 * {@code analyze} and the measurement options every capture-reading command shares ({@link AnalyzeOptions}).
 *
 * <p>Why: the first annotation the JVM reads makes it generate a proxy class per annotation type, in a module it
 * defines for them, with a bytecode writer that runs interpreted that early. On the analyze path that cost 25–30 ms
 * of a 0.3 s run (docs/performance.md, "Fourth round"). The other commands keep their annotations: their runs are
 * longer (a logbook, a device, a report) or rarer, and the same milliseconds are a small part of them.
 */
final class CodeModel {
    private CodeModel() {}

    /** A command's model around {@code userObject}, its name and description, with no option read from annotations. */
    static CommandSpec command(Object userObject, String name, String description) {
        CommandSpec spec = CommandSpec.wrapWithoutInspection(userObject).name(name);
        spec.usageMessage().description(description);
        return spec;
    }

    /**
     * Adds {@code -h, --help} and {@code -V, --version}, worded as picocli's standard help options (which would read
     * their annotations). Added last, so they come last in a help that keeps the declared order.
     */
    static void standardHelp(CommandSpec spec) {
        spec.addOption(OptionSpec.builder("-h", "--help").usageHelp(true).description("Show this help message and exit.").build());
        spec.addOption(OptionSpec.builder("-V", "--version").versionHelp(true).description("Print version information and exit.").build());
    }

    /** Binds an option or parameter to a field: picocli reads it through {@code get} and writes it through {@code set}. */
    static Binding bind(Supplier<Object> get, Consumer<Object> set) {
        return new Binding(get, set);
    }

    /** A getter and setter pair over one field. */
    static final class Binding implements IGetter, ISetter {
        private final Supplier<Object> get;
        private final Consumer<Object> set;

        private Binding(Supplier<Object> get, Consumer<Object> set) {
            this.get = get;
            this.set = set;
        }

        @Override
        @SuppressWarnings("unchecked")
        public <T> T get() {
            return (T) get.get();
        }

        @Override
        @SuppressWarnings("unchecked")
        public <T> T set(T value) {
            T old = (T) get.get();
            set.accept(value);
            return old;
        }
    }

    /** An option bound to a field: its name, type, parameter label (none for a flag) and description. */
    static OptionSpec.Builder option(String name, Class<?> type, String paramLabel, String description, Binding field) {
        // the field's value now is the initial value picocli restores before a parse (as it does for an annotated field)
        OptionSpec.Builder b = OptionSpec.builder(name).type(type).description(description).getter(field).setter(field)
                .initialValue(field.get());
        if (paramLabel != null) b.paramLabel(paramLabel);
        return b;
    }
}
