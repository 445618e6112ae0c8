package org.outstage.cli;

/** Child process for {@link WatchCommandTest}: the real command line with the stand-in measurer. */
public final class WatchChildMain {
    private WatchChildMain() {}

    public static void main(String[] args) throws Exception {
        LogbookMeasurers.install(new FakeMeasurer());
        System.exit(OutstageCommand.run(args));
    }
}
