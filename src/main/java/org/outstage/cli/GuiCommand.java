package org.outstage.cli;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.Callable;
import org.outstage.ui.WorkbenchLauncher;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code outstage gui [FILE...]}: opens the workbench; with no files, the bundled sample session. */
@Command(name = "gui", mixinStandardHelpOptions = true, description = "Open the workbench window (with no files: the sample session).")
public final class GuiCommand implements Callable<Integer> {
    @Spec CommandSpec spec;

    @Parameters(paramLabel = "FILE", arity = "0..*", description = "capture files or folders to open")
    List<Path> files = new ArrayList<>();

    @picocli.CommandLine.Option(names = "--exit-after-first-render",
            description = "Close the workbench once the first capture is drawn, printing the time since the JVM started (smoke tests, start-up timing).")
    boolean exitAfterFirstRender;

    @Override
    public Integer call() {
        for (Path f : files)
            if (!Files.exists(f)) throw new BadInputException(f + ": not found");
        try {
            WorkbenchLauncher.launch(files.stream().map(Path::toString).toArray(String[]::new), exitAfterFirstRender);
        } catch (RuntimeException | Error e) {
            String m = e.getMessage() == null ? e.getClass().getSimpleName() : e.getMessage().lines().findFirst().orElse("");
            spec.commandLine().getErr().println("outstage: the workbench could not start (" + m + "); it needs a display");
            spec.commandLine().getErr().flush();
            return OutstageCommand.EXIT_FAULT;
        }
        return OutstageCommand.EXIT_OK;
    }
}
