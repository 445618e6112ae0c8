package org.outstage.logbook;

import java.io.IOException;
import java.io.StringReader;
import java.io.UncheckedIOException;
import java.time.Instant;
import java.time.format.DateTimeParseException;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.OptionalDouble;
import java.util.Set;
import org.apache.commons.csv.CSVFormat;
import org.apache.commons.csv.CSVParser;
import org.apache.commons.csv.CSVPrinter;
import org.apache.commons.csv.CSVRecord;
import org.outstage.json.JsonText;
import org.outstage.verify.KeyFigures;

/**
 * Session exports in two formats that import back to the same session (export → import into another
 * logbook → export again gives identical text). Database ids are not exported; sequence numbers, times,
 * hashes and every figure are. Numbers are written with {@link Double#toString} digits, so they
 * read back bit for bit.
 *
 * <p>JSON: one object {@code {"format": "outstage-session", "version": 1, "unit", "session", "steps",
 * "measurements"}}; each measurement carries its full measurement JSON as a nested object.
 *
 * <p>CSV (RFC 4180): two comment lines (the format line, and {@code # session: } with the unit and session
 * as one-line JSON), a header row, then one row per step ({@code row=step}) and per measurement outside
 * a step ({@code row=measurement}); the full measurement JSON is a quoted cell.
 */
public final class SessionExport {
    private SessionExport() {}

    static final String FORMAT = "outstage-session";
    static final int VERSION = 1;
    private static final String CSV_FIRST = "# outstage session export, format " + VERSION;
    private static final String CSV_SESSION = "# session: ";
    static final String[] CSV_HEADER = {"row", "seq", "taken_at", "reading", "reading_unit", "heatsink_c", "ambient_c", "step_channel",
            "channel", "capture_sha256", "capture_name", "capture_size_bytes", "measured_at", "program_version", "fundamental_hz",
            "fundamental_rms", "unit", "thd_ratio", "thdn_ratio", "residual_rms", "power_watts", "load_ohms", "gain_at_zero",
            "crossover_verdict", "clip_asymmetry_ratio", "crossover_ratio", "settings_json", "defaulted_json", "measurement_json"};

    // ------------------------------------------------------------------ JSON

    public static String toJson(SessionData d) {
        List<Object> steps = new ArrayList<>();
        for (BiasStep s : d.steps()) {
            steps.add(JsonText.obj("seq", s.seq(), "taken_at", s.takenAt().toString(), "reading", s.reading().value(),
                    "reading_unit", s.reading().unit().symbol(), "heatsink_c", s.heatsinkCelsius(), "ambient_c", s.ambientCelsius(),
                    "channel", s.channel(), "measurement", s.measurement().map(SessionExport::measurementJson)));
        }
        List<Object> ms = new ArrayList<>();
        for (MeasurementRecord m : d.measurements()) ms.add(measurementJson(m));
        return JsonText.pretty(JsonText.obj("format", FORMAT, "version", VERSION, "unit", unitJson(d.unit()), "session", sessionJson(d.session()),
                "steps", steps, "measurements", ms)) + "\n";
    }

    private static Map<String, Object> unitJson(UnitUnderTest u) {
        return JsonText.obj("name", u.name(), "serial", u.serial(), "topology", u.topology(), "notes", u.notes(),
                "rated_power_watts", u.ratedPowerWatts(), "rated_load_ohms", u.ratedLoadOhms());
    }

    private static Map<String, Object> sessionJson(Session s) {
        return JsonText.obj("kind", s.kind().label(), "started_at", s.startedAt().toString(), "ended_at", s.endedAt().map(Instant::toString),
                "notes", s.notes());
    }

    static Map<String, Object> figuresJson(KeyFigures f) {
        return JsonText.obj("fundamental_hz", f.fundamentalHz(), "fundamental_rms", f.fundamentalRms(), "unit", f.unit(),
                "thd_ratio", f.thdRatio(), "thdn_ratio", f.thdNRatio(), "residual_rms", f.residualRms(), "power_watts", f.powerWatts(),
                "load_ohms", f.loadOhms(), "gain_at_zero", f.gainAtZero(), "crossover_verdict", f.crossoverVerdict(),
                "clip_asymmetry_ratio", f.clipAsymmetryRatio(), "crossover_ratio", f.crossoverRatio());
    }

    private static Map<String, Object> measurementJson(MeasurementRecord m) {
        Object full;
        try {
            full = JsonText.parse(m.measurementJson());
        } catch (IllegalArgumentException e) {
            full = m.measurementJson(); // not JSON after all: keep the text as a string
        }
        return JsonText.obj("channel", m.channel(),
                "capture", m.capture().map(c -> JsonText.obj("sha256", c.sha256(), "file_name", c.fileName(), "size_bytes", c.sizeBytes())),
                "measured_at", m.measuredAt().toString(), "program_version", m.programVersion(), "settings", m.settings(),
                "defaulted", new ArrayList<>(m.defaulted()), "figures", figuresJson(m.figures()), "measurement", full);
    }

    /** Reads a JSON export; malformed input throws IllegalArgumentException naming {@code source} and the field. */
    @SuppressWarnings("unchecked")
    public static SessionData fromJson(String text, String source) {
        Object root;
        try {
            root = JsonText.parse(text);
        } catch (IllegalArgumentException e) {
            throw new IllegalArgumentException(source + ": " + e.getMessage(), e);
        }
        Fields top = new Fields(source, "", asMap(root, source, "top level"));
        if (!FORMAT.equals(top.str("format"))) throw new IllegalArgumentException(source + ": not an Outstage session export (format field)");
        if (top.num("version") != VERSION) throw new IllegalArgumentException(source + ": export version " + top.num("version") + " is not " + VERSION);
        Fields u = top.obj("unit");
        UnitUnderTest unit = new UnitUnderTest(u.str("name"), u.optStr("serial"), u.optStr("topology"), u.optStr("notes"),
                u.optNum("rated_power_watts"), u.optNum("rated_load_ohms"));
        Fields s = top.obj("session");
        Session session = new Session(0, unit.name(), SessionKind.parse(s.str("kind")), s.instant("started_at"),
                s.optStr("ended_at").map(t -> parseInstant(t, source, "session.ended_at")), s.str("notes"));
        List<BiasStep> steps = new ArrayList<>();
        int i = 0;
        for (Object o : top.list("steps")) {
            Fields st = new Fields(source, "steps[" + i++ + "].", asMap(o, source, "steps"));
            Object mo = st.raw("measurement");
            Optional<MeasurementRecord> m = mo == null ? Optional.empty()
                    : Optional.of(measurement(new Fields(source, st.prefix + "measurement.", asMap(mo, source, st.prefix + "measurement"))));
            steps.add(new BiasStep((int) st.num("seq"), st.instant("taken_at"),
                    new BiasReading(st.num("reading"), BiasReading.Unit.parse(st.str("reading_unit"))),
                    st.optNum("heatsink_c"), st.optNum("ambient_c"), (int) st.num("channel"), m));
        }
        List<MeasurementRecord> ms = new ArrayList<>();
        i = 0;
        for (Object o : top.list("measurements")) {
            ms.add(measurement(new Fields(source, "measurements[" + i++ + "].", asMap(o, source, "measurements"))));
        }
        return new SessionData(unit, session, steps, ms);
    }

    private static MeasurementRecord measurement(Fields m) {
        Object c = m.raw("capture");
        Optional<CaptureRef> cap = Optional.empty();
        if (c != null) {
            Fields cf = new Fields(m.source, m.prefix + "capture.", asMap(c, m.source, m.prefix + "capture"));
            cap = Optional.of(new CaptureRef(cf.str("sha256"), cf.str("file_name"), (long) cf.num("size_bytes")));
        }
        Map<String, String> settings = new LinkedHashMap<>();
        for (Map.Entry<String, Object> e : m.obj("settings").map.entrySet()) settings.put(e.getKey(), String.valueOf(e.getValue()));
        Set<String> defaulted = new LinkedHashSet<>();
        for (Object o : m.list("defaulted")) defaulted.add(String.valueOf(o));
        Fields f = m.obj("figures");
        KeyFigures kf = new KeyFigures(f.num("fundamental_hz"), f.num("fundamental_rms"), f.str("unit"), f.num("thd_ratio"),
                f.num("thdn_ratio"), f.optNum("residual_rms"), f.optNum("power_watts"), f.optNum("load_ohms"), f.optNum("gain_at_zero"),
                f.optStr("crossover_verdict"), f.optNum("clip_asymmetry_ratio"), f.optNum("crossover_ratio"));
        Object full = m.raw("measurement");
        String fullText = full instanceof String str ? str : JsonText.write(full);
        return new MeasurementRecord((int) m.num("channel"), cap, m.instant("measured_at"), m.str("program_version"), settings, defaulted,
                fullText, kf);
    }

    // ------------------------------------------------------------------ CSV

    public static String toCsv(SessionData d) {
        StringBuilder sb = new StringBuilder();
        sb.append(CSV_FIRST).append('\n');
        sb.append(CSV_SESSION).append(JsonText.write(JsonText.obj("unit", unitJson(d.unit()), "session", sessionJson(d.session())))).append('\n');
        try (CSVPrinter p = new CSVPrinter(sb, CSVFormat.RFC4180.builder().setRecordSeparator("\n").setHeader(CSV_HEADER).get())) {
            for (BiasStep s : d.steps()) {
                List<String> row = new ArrayList<>(List.of("step", Integer.toString(s.seq()), s.takenAt().toString(), num(s.reading().value()),
                        s.reading().unit().symbol(), num(s.heatsinkCelsius()), num(s.ambientCelsius()), Integer.toString(s.channel())));
                row.addAll(measurementCells(s.measurement()));
                p.printRecord(row);
            }
            for (MeasurementRecord m : d.measurements()) {
                List<String> row = new ArrayList<>(List.of("measurement", "", "", "", "", "", "", ""));
                row.addAll(measurementCells(Optional.of(m)));
                p.printRecord(row);
            }
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
        return sb.toString();
    }

    private static List<String> measurementCells(Optional<MeasurementRecord> om) {
        List<String> cells = new ArrayList<>();
        if (om.isEmpty()) {
            for (int i = 8; i < CSV_HEADER.length; i++) cells.add("");
            return cells;
        }
        MeasurementRecord m = om.get();
        KeyFigures f = m.figures();
        cells.add(Integer.toString(m.channel()));
        cells.add(m.capture().map(CaptureRef::sha256).orElse(""));
        cells.add(m.capture().map(CaptureRef::fileName).orElse(""));
        cells.add(m.capture().map(c -> Long.toString(c.sizeBytes())).orElse(""));
        cells.add(m.measuredAt().toString());
        cells.add(m.programVersion());
        cells.add(num(f.fundamentalHz()));
        cells.add(num(f.fundamentalRms()));
        cells.add(f.unit());
        cells.add(num(f.thdRatio()));
        cells.add(num(f.thdNRatio()));
        cells.add(num(f.residualRms()));
        cells.add(num(f.powerWatts()));
        cells.add(num(f.loadOhms()));
        cells.add(num(f.gainAtZero()));
        cells.add(f.crossoverVerdict().orElse(""));
        cells.add(num(f.clipAsymmetryRatio()));
        cells.add(num(f.crossoverRatio()));
        cells.add(JsonText.write(m.settings()));
        cells.add(JsonText.write(new ArrayList<>(m.defaulted())));
        cells.add(m.measurementJson());
        return cells;
    }

    private static String num(double v) { return Double.toString(v); }

    private static String num(OptionalDouble v) { return v.isPresent() ? Double.toString(v.getAsDouble()) : ""; }

    /** Reads a CSV export; malformed input throws IllegalArgumentException naming {@code source} and the line. */
    @SuppressWarnings("unchecked")
    public static SessionData fromCsv(String text, String source) {
        String[] lines = text.split("\n", 3);
        if (lines.length < 3 || !lines[0].strip().equals(CSV_FIRST)) {
            throw new IllegalArgumentException(source + ", line 1: not an Outstage session export (expected '" + CSV_FIRST + "')");
        }
        if (!lines[1].startsWith(CSV_SESSION)) throw new IllegalArgumentException(source + ", line 2: expected '" + CSV_SESSION.strip() + "'");
        Map<String, Object> head;
        try {
            head = asMap(JsonText.parse(lines[1].substring(CSV_SESSION.length())), source, "line 2");
        } catch (IllegalArgumentException e) {
            throw new IllegalArgumentException(source + ", line 2: " + e.getMessage(), e);
        }
        Fields top = new Fields(source, "line 2: ", head);
        Fields u = top.obj("unit");
        UnitUnderTest unit = new UnitUnderTest(u.str("name"), u.optStr("serial"), u.optStr("topology"), u.optStr("notes"),
                u.optNum("rated_power_watts"), u.optNum("rated_load_ohms"));
        Fields s = top.obj("session");
        Session session = new Session(0, unit.name(), SessionKind.parse(s.str("kind")), s.instant("started_at"),
                s.optStr("ended_at").map(t -> parseInstant(t, source, "session.ended_at")), s.str("notes"));
        List<BiasStep> steps = new ArrayList<>();
        List<MeasurementRecord> ms = new ArrayList<>();
        try (CSVParser p = CSVParser.parse(new StringReader(lines[2]),
                CSVFormat.RFC4180.builder().setHeader().setSkipHeaderRecord(true).get())) {
            if (!p.getHeaderNames().equals(List.of(CSV_HEADER))) {
                throw new IllegalArgumentException(source + ", line 3: header differs from " + String.join(",", CSV_HEADER));
            }
            for (CSVRecord r : p) {
                String where = source + ", record " + (r.getRecordNumber()) + " (from line " + (r.getCharacterPosition() >= 0 ? lineOf(lines[2], r.getCharacterPosition()) + 2 : 0) + ")";
                try {
                    Cells c = new Cells(r);
                    switch (r.get("row")) {
                        case "step" -> steps.add(new BiasStep(c.integer("seq"), Instant.parse(r.get("taken_at")),
                                new BiasReading(c.dbl("reading"), BiasReading.Unit.parse(r.get("reading_unit"))), c.opt("heatsink_c"),
                                c.opt("ambient_c"), c.integer("step_channel"), r.get("channel").isEmpty() ? Optional.empty()
                                : Optional.of(c.measurement())));
                        case "measurement" -> ms.add(c.measurement());
                        default -> throw new IllegalArgumentException("row kind '" + r.get("row") + "' must be step or measurement");
                    }
                } catch (RuntimeException e) {
                    throw new IllegalArgumentException(where + ": " + e.getMessage(), e);
                }
            }
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        } catch (IllegalStateException e) {
            throw new IllegalArgumentException(source + ": " + e.getMessage(), e);
        }
        return new SessionData(unit, session, steps, ms);
    }

    private static int lineOf(String text, long charPos) {
        int line = 1;
        for (int i = 0; i < Math.min(charPos, text.length()); i++) if (text.charAt(i) == '\n') line++;
        return line;
    }

    private record Cells(CSVRecord r) {
        double dbl(String name) { return Double.parseDouble(r.get(name)); }

        int integer(String name) { return Integer.parseInt(r.get(name)); }

        OptionalDouble opt(String name) {
            String v = r.get(name);
            return v.isEmpty() ? OptionalDouble.empty() : OptionalDouble.of(Double.parseDouble(v));
        }

        Optional<String> optText(String name) {
            String v = r.get(name);
            return v.isEmpty() ? Optional.empty() : Optional.of(v);
        }

        @SuppressWarnings("unchecked")
        MeasurementRecord measurement() {
            Optional<CaptureRef> cap = r.get("capture_sha256").isEmpty() ? Optional.empty()
                    : Optional.of(new CaptureRef(r.get("capture_sha256"), r.get("capture_name"), Long.parseLong(r.get("capture_size_bytes"))));
            Map<String, String> settings = new LinkedHashMap<>();
            for (Map.Entry<String, Object> e : ((Map<String, Object>) JsonText.parse(r.get("settings_json"))).entrySet()) {
                settings.put(e.getKey(), String.valueOf(e.getValue()));
            }
            Set<String> defaulted = new LinkedHashSet<>();
            for (Object o : (List<Object>) JsonText.parse(r.get("defaulted_json"))) defaulted.add(String.valueOf(o));
            KeyFigures f = new KeyFigures(dbl("fundamental_hz"), dbl("fundamental_rms"), r.get("unit"), dbl("thd_ratio"), dbl("thdn_ratio"),
                    opt("residual_rms"), opt("power_watts"), opt("load_ohms"), opt("gain_at_zero"), optText("crossover_verdict"),
                    opt("clip_asymmetry_ratio"), opt("crossover_ratio"));
            return new MeasurementRecord(integer("channel"), cap, Instant.parse(r.get("measured_at")), r.get("program_version"), settings,
                    defaulted, r.get("measurement_json"), f);
        }
    }

    // ------------------------------------------------------------------ field access with messages

    @SuppressWarnings("unchecked")
    private static Map<String, Object> asMap(Object o, String source, String where) {
        if (o instanceof Map<?, ?> m) return (Map<String, Object>) m;
        throw new IllegalArgumentException(source + ": " + where + " must be a JSON object");
    }

    private static Instant parseInstant(String t, String source, String field) {
        try {
            return Instant.parse(t);
        } catch (DateTimeParseException e) {
            throw new IllegalArgumentException(source + ": " + field + "='" + t + "' is not an ISO-8601 instant");
        }
    }

    private record Fields(String source, String prefix, Map<String, Object> map) {
        Object raw(String k) { return map.get(k); }

        private IllegalArgumentException bad(String k, String rule) {
            return new IllegalArgumentException(source + ": " + prefix + k + " " + rule);
        }

        String str(String k) {
            if (map.get(k) instanceof String s) return s;
            throw bad(k, "must be a string");
        }

        Optional<String> optStr(String k) {
            Object v = map.get(k);
            if (v == null) return Optional.empty();
            if (v instanceof String s) return Optional.of(s);
            throw bad(k, "must be a string or null");
        }

        double num(String k) {
            if (map.get(k) instanceof Double d) return d;
            throw bad(k, "must be a number");
        }

        OptionalDouble optNum(String k) {
            Object v = map.get(k);
            if (v == null) return OptionalDouble.empty();
            if (v instanceof Double d) return OptionalDouble.of(d);
            throw bad(k, "must be a number or null");
        }

        Instant instant(String k) { return parseInstant(str(k), source, prefix + k); }

        Fields obj(String k) {
            if (map.get(k) instanceof Map<?, ?>) return new Fields(source, prefix + k + ".", asMap(map.get(k), source, prefix + k));
            throw bad(k, "must be an object");
        }

        List<Object> list(String k) {
            if (map.get(k) instanceof List<?> l) return new ArrayList<>(l);
            throw bad(k, "must be a list");
        }
    }
}
