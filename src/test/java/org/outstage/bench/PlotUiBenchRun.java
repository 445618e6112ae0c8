package org.outstage.bench;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.condition.EnabledIfSystemProperty;
import org.openjdk.jmh.runner.Runner;
import org.openjdk.jmh.runner.options.OptionsBuilder;
import org.openjdk.jmh.runner.options.TimeValue;

/**
 * Runs the plot and workbench benchmarks in the surefire JVM (JMH without a fork), for machines where the
 * bench profile's exec plugin cannot be resolved offline: {@code tools/bench-ui}. Only with
 * {@code -Doutstage.bench=true}; the class name does not match surefire's default includes.
 */
class PlotUiBenchRun {
    @Test
    @EnabledIfSystemProperty(named = "outstage.bench", matches = "true")
    void run() throws Exception {
        new Runner(new OptionsBuilder().include(System.getProperty("outstage.bench.include", "org.outstage.bench.(Plot|Ui).*Bench.*"))
                .forks(0).warmupIterations(3).warmupTime(TimeValue.seconds(1)).measurementIterations(5)
                .measurementTime(TimeValue.seconds(1)).build()).run();
    }
}
