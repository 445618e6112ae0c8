package org.outstage.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;

/** The batch's thread bound and the terminal progress bar (issue 13, item 2). */
class BatchBoundsTest {
    private static final long MB = 1024 * 1024;

    @Test
    void threads_oneProcessorEach_atMostOnePerFile() {
        assertEquals(8, AnalyzeCommand.threadsFor(120, 8, 4096 * MB, 2 * MB));
        assertEquals(3, AnalyzeCommand.threadsFor(3, 8, 4096 * MB, 2 * MB));
        assertEquals(1, AnalyzeCommand.threadsFor(1, 8, 4096 * MB, 2 * MB));
    }

    @Test
    void threads_boundedByTheHeap() {
        // 100 MB files need about 1.6 GB each in flight; half of a 2 GB heap holds none fully: one at a time
        assertEquals(1, AnalyzeCommand.threadsFor(10, 8, 2048 * MB, 100 * MB));
        // 10 MB files: 160 MB each, half of 1 GB holds 3
        assertEquals(3, AnalyzeCommand.threadsFor(10, 8, 1024 * MB, 10 * MB));
    }

    @Test
    void bar_fillsInProportion() {
        String half = Progress.barLine(60, 120, 3.4);
        assertEquals("outstage: [###############---------------] 60 of 120 files (3 s)", half);
        assertTrue(Progress.barLine(0, 120, 0).contains("[------------------------------]"));
        assertTrue(Progress.barLine(120, 120, 0).contains("[##############################]"));
    }
}
