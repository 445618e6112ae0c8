package org.outstage.logbook;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Optional;
import java.util.Random;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class SessionExportTest {
    @TempDir Path dir;

    private long fill(Logbook lb) throws Exception {
        Random rnd = new Random(2026);
        Path wav = dir.resolve("take.wav");
        byte[] b = new byte[777];
        rnd.nextBytes(b);
        Files.write(wav, b);
        CaptureRef ref = lb.storeCapture(wav);
        long id = lb.startSession(Fixtures.unit(), SessionKind.BIAS_ADJUSTMENT, Fixtures.T0, "notes with, comma\nand a second line");
        for (int i = 0; i < 8; i++) lb.addBiasStep(id, Fixtures.step(rnd, i, i % 2 == 0 ? Optional.of(ref) : Optional.empty()));
        lb.addMeasurement(id, Fixtures.measurement(rnd, Optional.of(ref), Fixtures.T0.plusSeconds(999)));
        lb.endSession(id, Fixtures.T0.plusSeconds(3600));
        return id;
    }

    @Test
    void jsonExport_importIntoFreshLogbook_exportsIdentically() throws Exception {
        String first;
        SessionData original;
        try (Logbook a = Logbook.open(dir.resolve("a.db"))) {
            long id = fill(a);
            original = a.sessionData(id);
            first = SessionExport.toJson(original);
        }
        try (Logbook b = Logbook.open(dir.resolve("b.db"))) {
            long other = b.startSession(UnitUnderTest.named("another unit"), SessionKind.EVALUATION, Fixtures.T0, "");
            long id = b.importSession(SessionExport.fromJson(first, "export.json"));
            assertNotEquals(other, id);
            String second = SessionExport.toJson(b.sessionData(id));
            assertEquals(first, second);
            assertEquals(original.steps().size(), b.biasSteps(id).size());
        }
    }

    @Test
    void csvExport_importIntoFreshLogbook_exportsIdentically_andRecordsEqual() throws Exception {
        String first;
        SessionData original;
        try (Logbook a = Logbook.open(dir.resolve("a.db"))) {
            long id = fill(a);
            original = a.sessionData(id);
            first = SessionExport.toCsv(original);
        }
        try (Logbook b = Logbook.open(dir.resolve("b.db"))) {
            long id = b.importSession(SessionExport.fromCsv(first, "export.csv"));
            SessionData back = b.sessionData(id);
            assertEquals(first, SessionExport.toCsv(back));
            // the CSV keeps the measurement JSON text verbatim, so the records are equal too
            assertEquals(original.steps(), back.steps());
            assertEquals(original.measurements(), back.measurements());
            assertEquals(original.unit(), back.unit());
            assertEquals(original.session().endedAt(), back.session().endedAt());
            assertEquals(original.session().notes(), back.session().notes());
        }
    }

    @Test
    void brokenCsv_namesFileAndRecord() throws Exception {
        String csv;
        try (Logbook a = Logbook.open(dir.resolve("a.db"))) {
            csv = SessionExport.toCsv(a.sessionData(fill(a)));
        }
        String broken = csv.replaceFirst("\nstep,2,", "\nstep,two,");
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> SessionExport.fromCsv(broken, "s.csv"));
        assertTrue(e.getMessage().startsWith("s.csv, record 2"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class, () -> SessionExport.fromJson("{\"format\": \"other\"}", "s.json"));
        assertTrue(e.getMessage().startsWith("s.json: "), e.getMessage());
    }
}
