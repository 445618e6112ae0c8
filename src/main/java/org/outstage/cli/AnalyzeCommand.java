package org.outstage.cli;

import java.util.concurrent.Callable;
import picocli.CommandLine.Command;

/** Placeholder replaced during integration by the real analyze command. */
@Command(name = "analyze", description = "Measure distortion of captures (WAV or scope CSV).")
public final class AnalyzeCommand implements Callable<Integer> {
    @Override
    public Integer call() {
        throw new BadInputException("analyze: not wired yet in this build");
    }
}
