package org.outstage.capture;

import java.io.IOException;
import java.io.StringReader;
import java.nio.ByteBuffer;
import java.nio.charset.CharacterCodingException;
import java.nio.charset.CodingErrorAction;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.HashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.apache.commons.csv.CSVFormat;
import org.apache.commons.csv.CSVParser;
import org.apache.commons.csv.CSVRecord;

/**
 * Reads an oscilloscope CSV export into an in-memory {@link Capture} in volts.
 *
 * <p>What is recognised (layouts described generically in docs/references.md §9):
 * <ul>
 *   <li>Text: UTF-8 with or without BOM (Latin-1 if it is not valid UTF-8); CRLF, LF or CR line ends;
 *       comma, semicolon or tab delimiter, detected from the data rows; decimal comma in semicolon and tab
 *       files (a dot is then a thousands separator); scientific notation; trailing empty cells; blank lines.
 *       A comma-separated file with decimal commas is read when unambiguous (a header naming half as many columns as
 *       the rows have fields: each pair is one number, with a warning; or quoted {@code "0,5"} cells) and otherwise
 *       refused with a message naming the decimal comma (issue 11 item 9).</li>
 *   <li>Anything before the first all-numeric row is preamble. Key/value lines are used when recognised
 *       (sample interval, x increment, sample rate, horizontal and vertical units, record length, raw-code
 *       scaling y increment/origin/reference and x origin/reference) and otherwise skipped. A probe
 *       attenuation line is recognised but not applied: exports normally include it; use the probe factor.</li>
 *   <li>A header row of names right before the data (optionally followed by a units row such as
 *       {@code s,V,V} or {@code Second,Volt,Volt}); units may also sit in the names, {@code CH1 (mV)}.
 *       Prefixed units (ms, µs, mV, …) are scaled to seconds and volts.</li>
 *   <li>The two-line {@code X,CH1,…,Start,Increment} / {@code Sequence,Volt,…,t0,dt} header: the first column
 *       is then a sample index and t = t0 + index·dt.</li>
 *   <li>A time column (named time/t/second, or with a time unit; without names: a first column that rises
 *       strictly and is not just 0, 1, 2, …), or an index column (nr, no, index, sample, sequence, point, #),
 *       or neither. Without time, the interval comes from the preamble, else from the caller's sample rate.</li>
 * </ul>
 * Time stamps may carry rounding jitter: each interval must lie within 20 % of the median interval, and the
 * rate is (number of intervals)/(last − first time). A larger deviation is an error naming the line.
 * Every value must be a finite number; a bad cell is an error naming its line and column. Files over
 * {@value #MAX_FILE_BYTES} bytes or {@value #MAX_VALUES} values are refused (convert long records to WAV).
 */
public final class ScopeCsvReader {
    static final long MAX_FILE_BYTES = 256L * 1024 * 1024;
    static final long MAX_VALUES = 32_000_000L;
    static final int MAX_PREAMBLE_ROWS = 2000;
    /** Largest accepted deviation of one interval from the median interval, as a fraction (rounding jitter). */
    static final double INTERVAL_TOLERANCE = 0.2;

    private ScopeCsvReader() {}

    /**
     * Reads {@code file}. Values come out in volts, multiplied by {@code options.probeFactor()} if given.
     *
     * @throws CaptureFormatException for a missing, unreadable, oversized or malformed file, or a file whose
     *                                stated sample rate disagrees with {@code options.sampleRateHz()}
     */
    public static Capture read(Path file, CaptureOptions options) throws CaptureFormatException {
        if (options == null) throw new IllegalArgumentException("options must not be null");
        byte[] bytes;
        try {
            long size = Files.size(file);
            if (size > MAX_FILE_BYTES)
                throw new CaptureFormatException(file, "file", "is " + size + " bytes; scope CSV files over " + MAX_FILE_BYTES
                        + " bytes are refused (convert long records to WAV)");
            bytes = Files.readAllBytes(file);
        } catch (IOException e) {
            throw CaptureFormatException.unreadable(file, e);
        }
        return new Parse(file, decode(bytes), options).run();
    }

    static String decode(byte[] bytes) {
        String text;
        try {
            text = StandardCharsets.UTF_8.newDecoder().onMalformedInput(CodingErrorAction.REPORT)
                    .onUnmappableCharacter(CodingErrorAction.REPORT).decode(ByteBuffer.wrap(bytes)).toString();
        } catch (CharacterCodingException e) {
            text = new String(bytes, StandardCharsets.ISO_8859_1);
        }
        if (!text.isEmpty() && text.charAt(0) == '\uFEFF') text = text.substring(1);
        return text;
    }

    // ---------------------------------------------------------------- numbers and units

    /** Parses a plain decimal number (sign, digits, point, exponent); NaN when the cell is not one. */
    static double number(String cell, boolean decimalComma) {
        String s = cell;
        if (decimalComma && s.indexOf(',') >= 0) s = s.replace(".", "").replace(',', '.');
        int i = 0, n = s.length();
        if (n == 0) return Double.NaN;
        if (s.charAt(i) == '+' || s.charAt(i) == '-') i++;
        int digits = 0;
        while (i < n && Character.isDigit(s.charAt(i)) && s.charAt(i) < 128) { i++; digits++; }
        if (i < n && s.charAt(i) == '.') {
            i++;
            while (i < n && s.charAt(i) >= '0' && s.charAt(i) <= '9') { i++; digits++; }
        }
        if (digits == 0) return Double.NaN;
        if (i < n && (s.charAt(i) == 'e' || s.charAt(i) == 'E')) {
            i++;
            if (i < n && (s.charAt(i) == '+' || s.charAt(i) == '-')) i++;
            int ed = 0;
            while (i < n && s.charAt(i) >= '0' && s.charAt(i) <= '9') { i++; ed++; }
            if (ed == 0) return Double.NaN;
        }
        if (i != n) return Double.NaN;
        double v = Double.parseDouble(s);
        return Double.isFinite(v) ? v : Double.NaN;
    }

    enum Dimension { TIME, VOLTAGE, OTHER }

    /** A unit token with its factor to SI: {@code "mV"} → VOLTAGE 1e-3. */
    record Unit(Dimension dimension, double factor, String text) {}

    private static final Pattern UNIT = Pattern.compile("(p|n|u|µ|μ|m|k|M)?(s|sec|second|seconds|v|volt|volts)", Pattern.CASE_INSENSITIVE);

    /** Parses a unit token such as s, ms, µs, Second, V, mV, Volt; empty when it is not a time or voltage unit. */
    static java.util.Optional<Unit> unit(String token) {
        String t = token.trim();
        if (t.startsWith("(") && t.endsWith(")") || t.startsWith("[") && t.endsWith("]")) t = t.substring(1, t.length() - 1).trim();
        if (t.isEmpty()) return java.util.Optional.empty();
        // whole words first, so "Second" is not read as a prefix "S" plus "econd"
        String lower = t.toLowerCase(Locale.ROOT);
        switch (lower) {
            case "s": case "sec": case "second": case "seconds": return java.util.Optional.of(new Unit(Dimension.TIME, 1, t));
            case "v": case "volt": case "volts": return java.util.Optional.of(new Unit(Dimension.VOLTAGE, 1, t));
            default: break;
        }
        Matcher m = UNIT.matcher(t);
        if (!m.matches() || m.group(1) == null) return java.util.Optional.empty();
        double f;
        switch (m.group(1)) {
            case "p": f = 1e-12; break;
            case "n": f = 1e-9; break;
            case "u": case "µ": case "μ": f = 1e-6; break;
            case "m": f = 1e-3; break;
            case "k": f = 1e3; break;
            case "M": f = 1e6; break;
            default: return java.util.Optional.empty();
        }
        Dimension d = m.group(2).toLowerCase(Locale.ROOT).startsWith("s") ? Dimension.TIME : Dimension.VOLTAGE;
        return java.util.Optional.of(new Unit(d, f, t));
    }

    /** Shortest round-trip text of {@code x} after rounding to 6 significant digits (for messages). */
    static String show(double x) {
        if (x == 0 || !Double.isFinite(x)) return Double.toString(x);
        return Double.toString(new java.math.BigDecimal(x).round(new java.math.MathContext(6)).doubleValue());
    }

    static String key(String cell) {
        return cell.toLowerCase(Locale.ROOT).replaceAll("[^a-z0-9]", "");
    }

    // ---------------------------------------------------------------- the parse

    private record Row(long line, List<String> cells) {}

    private enum Role { TIME, INDEX, CHANNEL }

    private static final class Parse {
        private final Path file;
        private final String text;
        private final CaptureOptions options;
        private final List<String> warnings = new ArrayList<>();
        private int[] lineStarts;
        private char delimiter;
        private boolean decimalComma;
        /** Line number of each data row. */
        private int[] rowLines = new int[1024];
        /** 3 when the preamble sits in the first three columns beside the data, else 0. */
        private int columnOffset;
        /** Comma-separated file with decimal commas: each pair of fields is one number (the header names half as many columns). */
        private boolean commaPairs;
        /** First cell seen that is a number only with a decimal comma ({@code 0,5} quoted in a comma-separated file), for messages. */
        private String commaNumberSeen;

        Parse(Path file, String text, CaptureOptions options) {
            this.file = file;
            this.text = text;
            this.options = options;
        }

        private CaptureFormatException at(long line, int column, String problem) {
            return CaptureFormatException.atLine(file, line, column, problem);
        }

        private void indexLines() {
            int[] starts = new int[1024];
            int count = 0;
            starts[count++] = 0;
            for (int i = 0; i < text.length(); i++) {
                char c = text.charAt(i);
                if (c == '\n' || c == '\r') {
                    if (c == '\r' && i + 1 < text.length() && text.charAt(i + 1) == '\n') i++;
                    if (count == starts.length) starts = Arrays.copyOf(starts, count * 2);
                    starts[count++] = i + 1;
                }
            }
            lineStarts = Arrays.copyOf(starts, count);
        }

        private long lineOf(long charPosition) {
            int k = Arrays.binarySearch(lineStarts, (int) charPosition);
            return (k >= 0 ? k : -k - 2) + 1;
        }

        /** Chooses the delimiter from lines that start like numbers: tab, then semicolon, then comma, whichever splits them evenly. */
        private void sniff() {
            List<String> sample = new ArrayList<>();
            for (int i = 0; i < lineStarts.length && sample.size() < 200; i++) {
                int end = i + 1 < lineStarts.length ? lineStarts[i + 1] : text.length();
                String line = text.substring(lineStarts[i], end).strip();
                if (line.isEmpty()) continue;
                char c = line.charAt(0);
                if (c >= '0' && c <= '9' || c == '-' || c == '+' || c == '.') sample.add(line);
            }
            delimiter = ',';
            int best = -1;
            for (char d : new char[] {'\t', ';', ','}) {
                int first = -1;
                boolean even = !sample.isEmpty();
                for (String line : sample) {
                    int k = count(line, d);
                    if (first < 0) first = k;
                    if (k == 0 || k != first) { even = false; break; }
                }
                if (even) { delimiter = d; best = d; break; }
            }
            if (best < 0) { // uneven rows: take the most frequent candidate
                int most = 0;
                for (char d : new char[] {'\t', ';', ','}) {
                    int total = 0;
                    for (String line : sample) total += count(line, d);
                    if (total > most) { most = total; delimiter = d; }
                }
            }
            if (delimiter != ',') {
                Pattern comma = Pattern.compile("[+-]?\\d*,\\d+([eE][+-]?\\d+)?");
                outer:
                for (String line : sample)
                    for (String cell : line.split(Pattern.quote(String.valueOf(delimiter))))
                        if (comma.matcher(cell.trim()).matches()) { decimalComma = true; break outer; }
            }
        }

        private static int count(String s, char c) {
            int k = 0;
            for (int i = 0; i < s.length(); i++) if (s.charAt(i) == c) k++;
            return k;
        }

        private static List<String> cells(CSVRecord r) {
            List<String> out = new ArrayList<>(r.size());
            for (String s : r) out.add(s.strip());
            int n = out.size();
            while (n > 0 && out.get(n - 1).isEmpty()) n--;
            return new ArrayList<>(out.subList(0, n));
        }

        /** The variant whose key/value preamble sits in columns 1–3 beside the data (docs/references.md §9, layout 2). */
        private boolean besideData(List<String> cells) {
            if (cells.size() < 5 || cells.get(0).isEmpty() || !Double.isNaN(number(cells.get(0), decimalComma))) return false;
            return numericRow(cells.subList(3, cells.size()));
        }

                private boolean numericRow(List<String> cells) {
            if (cells.isEmpty()) return false;
            for (String c : cells) if (Double.isNaN(number(c, decimalComma))) return false;
            return true;
        }

        Capture run() throws CaptureFormatException {
            indexLines();
            sniff();
            CSVFormat format = CSVFormat.DEFAULT.builder().setDelimiter(delimiter).setIgnoreEmptyLines(true)
                    .setIgnoreSurroundingSpaces(true).setTrim(true).get();
            List<Row> preamble = new ArrayList<>();
            List<double[]> columns = new ArrayList<>();
            boolean inData = false;
            long firstDataLine = 0;
            int width = 0;
            int rows = 0;
            long lastLine = 1;
            try (CSVParser parser = CSVParser.parse(new StringReader(text), format)) {
                for (CSVRecord r : parser) {
                    long line = lineOf(r.getCharacterPosition());
                    lastLine = line;
                    List<String> cells = cells(r);
                    if (cells.isEmpty()) continue;
                    if (!inData && preamble.isEmpty() && besideData(cells)) columnOffset = 3;
                    if (columnOffset > 0) { // key/value pairs in the first three columns, data beside them
                        if (!cells.get(0).isEmpty()) preamble.add(new Row(line, new ArrayList<>(cells.subList(0, Math.min(3, cells.size())))));
                        cells = cells.size() > 3 ? new ArrayList<>(cells.subList(3, cells.size())) : List.of();
                        if (cells.isEmpty()) continue;
                    }
                    if (!inData) {
                        if (!numericRow(cells)) {
                            if (commaNumberSeen == null && !decimalComma)
                                for (String c : cells) if (COMMA_NUMBER.matcher(c).matches()) { commaNumberSeen = c; break; }
                            if (commaNumberSeen != null && delimiter == ',' && !decimalComma && numericWithDecimalComma(cells))
                                return again();   // quoted "0,5" cells in a comma-separated file: unambiguous, read with decimal commas
                            preamble.add(new Row(line, cells));
                            if (preamble.size() > MAX_PREAMBLE_ROWS)
                                throw at(line, 0, "no numeric data in the first " + MAX_PREAMBLE_ROWS + " rows; is this a scope CSV export?"
                                        + decimalCommaHint());
                            continue;
                        }
                        inData = true;
                        firstDataLine = line;
                        width = cells.size();
                        if (delimiter == ',' && !decimalComma && columnOffset == 0) decimalCommaPairs(preamble, cells, line);
                        if (commaPairs) width /= 2;
                        for (int c = 0; c < width; c++) columns.add(new double[1024]);
                    }
                    if (commaPairs) {
                        if (cells.size() != 2 * width)
                            throw at(line, 0, "row has " + cells.size() + " fields, expected " + 2 * width + " (" + width
                                    + " numbers written with a decimal comma, as on line " + firstDataLine + ")");
                        List<String> joined = new ArrayList<>(width);
                        for (int c = 0; c < width; c++) joined.add(cells.get(2 * c) + "." + cells.get(2 * c + 1));
                        cells = joined;
                    }
                    if (cells.size() != width)
                        throw at(line, 0, "row has " + cells.size() + " values, the first data row (line " + firstDataLine + ") has " + width);
                    if ((long) (rows + 1) * width > MAX_VALUES)
                        throw at(line, 0, "more than " + MAX_VALUES + " values; scope CSV this large is refused (convert long records to WAV)");
                    if (rows == columns.get(0).length) {
                        for (int c = 0; c < width; c++) columns.set(c, Arrays.copyOf(columns.get(c), rows * 2));
                        rowLines = Arrays.copyOf(rowLines, rows * 2);
                    }
                    rowLines[rows] = (int) line;
                    for (int c = 0; c < width; c++) {
                        String cell = cells.get(c);
                        double v = number(cell, decimalComma);
                        if (Double.isNaN(v))
                            throw at(line, c + 1 + columnOffset, cell.isEmpty() ? "empty cell in the data" : "'" + cell + "' is not a number");
                        columns.get(c)[rows] = v;
                    }
                    rows++;
                }
            } catch (IOException | java.io.UncheckedIOException e) {
                throw new CaptureFormatException(file, "line " + lastLine, "CSV syntax: " + e.getMessage(), e);
            }
            if (!inData)
                throw at(lastLine, 0, "no numeric data rows found (expected rows of numbers after any header lines)" + decimalCommaHint());
            for (int c = 0; c < width; c++) columns.set(c, Arrays.copyOf(columns.get(c), rows));
            return interpret(preamble, columns, rows, width, firstDataLine);
        }

        private static final Pattern COMMA_NUMBER = Pattern.compile("[+-]?\\d*,\\d+([eE][+-]?\\d+)?");
        private static final Pattern INTEGER = Pattern.compile("[+-]?\\d+");
        private static final Pattern FRACTION = Pattern.compile("\\d+([eE][+-]?\\d+)?");
        /** Digits after a decimal comma that no one writes as a number of their own: a leading zero ({@code 0000}, {@code 000000E+00}). */
        private static final Pattern FRACTION_ONLY = Pattern.compile("0\\d+([eE][+-]?\\d+)?");

        private boolean numericWithDecimalComma(List<String> cells) {
            for (String c : cells) if (Double.isNaN(number(c, true))) return false;
            return true;
        }

        /** Parses the file again with decimal commas (the first pass found quoted "0,5" cells and no other numbers). */
        private Capture again() throws CaptureFormatException {
            decimalComma = true;
            warnings.clear();
            rowLines = new int[1024];
            columnOffset = 0;
            return run();
        }

        private String decimalCommaHint() {
            return commaNumberSeen == null ? "" : " (cells such as '" + commaNumberSeen + "' are numbers with a decimal comma,"
                    + " which this file's comma separator makes ambiguous: export with a semicolon separator or a decimal point)";
        }

        /**
         * A comma-separated file whose numbers also use decimal commas: {@code 0,000000E+00,10,0000}. When the header just
         * above names half as many columns and every pair of fields reads as integer part and fraction, the pairs are the
         * numbers (unambiguous, with a warning). When fields look like the fraction of a decimal-comma number (a leading
         * zero: {@code 0000}) and the header does not settle it, the file is refused, naming the decimal comma.
         */
        private void decimalCommaPairs(List<Row> preamble, List<String> cells, long line) throws CaptureFormatException {
            List<String> header = preamble.isEmpty() ? List.of() : preamble.get(preamble.size() - 1).cells();
            boolean headerNames = !header.isEmpty();
            for (String h : header) if (!Double.isNaN(number(h, false))) headerNames = false;
            if (headerNames && cells.size() == 2 * header.size()) {
                boolean pairs = true;
                for (int c = 0; c + 1 < cells.size() && pairs; c += 2)
                    pairs = INTEGER.matcher(cells.get(c)).matches() && FRACTION.matcher(cells.get(c + 1)).matches();
                if (pairs) {
                    commaPairs = true;
                    warnings.add("line " + line + ": the comma separates the columns and is also the decimal mark; each pair of fields is read as one"
                            + " number with a decimal comma, as the header (line " + preamble.get(preamble.size() - 1).line() + ") names "
                            + header.size() + " columns");
                    return;
                }
            }
            for (int c = 1; c < cells.size(); c++)
                if (INTEGER.matcher(cells.get(c - 1)).matches() && FRACTION_ONLY.matcher(cells.get(c)).matches())
                    throw at(line, c + 1, "'" + cells.get(c - 1) + "," + cells.get(c) + "' looks like one number with a decimal comma, but the comma"
                            + " also separates the columns" + (headerNames ? " and the header (" + header.size() + " names) does not settle it" : "")
                            + "; export with a semicolon separator or a decimal point");
        }

        // ------------------------------------------------------------ meaning of the columns

        private Capture interpret(List<Row> preamble, List<double[]> columns, int rows, int width, long firstDataLine)
                throws CaptureFormatException {
            Map<String, Double> meta = new HashMap<>();
            Map<String, String> metaText = new HashMap<>();
            Map<String, Long> metaLine = new HashMap<>();
            String[] names = null;
            String[] units = null;
            long unitsLine = 0;
            Double startIncT0 = null, startIncDt = null;
            long startIncLine = 0;

            for (int i = 0; i < preamble.size(); i++) {
                Row row = preamble.get(i);
                List<String> c = row.cells();
                int p = indexOfPair(c, "start", "increment");
                if (p >= 0 && i + 1 < preamble.size()) {
                    List<String> next = preamble.get(i + 1).cells();
                    if (next.size() > p + 1) {
                        double t0 = number(next.get(p), decimalComma), dt = number(next.get(p + 1), decimalComma);
                        if (Double.isNaN(t0) || Double.isNaN(dt))
                            throw at(preamble.get(i + 1).line(), p + 1, "Start/Increment values '" + next.get(p) + "', '" + next.get(p + 1) + "' are not numbers");
                        startIncT0 = t0;
                        startIncDt = dt;
                        startIncLine = preamble.get(i + 1).line();
                        names = c.subList(0, p).toArray(new String[0]);
                        units = next.subList(0, Math.min(p, next.size())).toArray(new String[0]);
                        unitsLine = startIncLine;
                        i++;
                        continue;
                    }
                }
                if (c.size() >= 2 && Double.isNaN(number(c.get(0), decimalComma))) {
                    String k = key(c.get(0));
                    double v = number(c.get(1), decimalComma);
                    if (!Double.isNaN(v)) {
                        if (c.size() >= 3) {
                            var u = unit(c.get(2));
                            if (u.isPresent()) v *= u.get().factor();
                        }
                        meta.put(k, v);
                    } else {
                        metaText.put(k, c.get(1));
                    }
                    metaLine.put(k, row.line());
                }
            }

            // header row(s) right before the data, when not the Start/Increment layout
            if (startIncDt == null) {
                int last = preamble.size() - 1;
                if (last >= 0 && isHeader(preamble.get(last), width)) {
                    Row candidate = preamble.get(last);
                    if (allUnits(candidate.cells()) && last >= 1 && isHeader(preamble.get(last - 1), width)) {
                        names = preamble.get(last - 1).cells().toArray(new String[0]);
                        units = candidate.cells().toArray(new String[0]);
                        unitsLine = candidate.line();
                    } else {
                        names = candidate.cells().toArray(new String[0]);
                        unitsLine = candidate.line();
                    }
                }
            }

            String[] colUnits = new String[width];
            String[] colNames = new String[width];
            for (int c = 0; c < width; c++) {
                String name = names != null && c < names.length ? names[c] : "";
                String u = units != null && c < units.length ? units[c] : "";
                Matcher m = UNIT_IN_NAME.matcher(name);
                if (m.matches()) {
                    name = m.group(1);
                    if (u.isEmpty()) u = m.group(2);
                }
                colNames[c] = name;
                colUnits[c] = u;
            }

            Role[] roles = new Role[width];
            for (int c = 0; c < width; c++) roles[c] = role(colNames[c], colUnits[c]);
            if (startIncDt != null) roles[0] = Role.INDEX;
            if (names == null && width >= 2 && roles[0] == Role.CHANNEL && strictlyRising(columns.get(0), rows))
                roles[0] = consecutiveIntegers(columns.get(0), rows) ? Role.INDEX : Role.TIME;

            int timeCol = -1;
            List<Integer> channelCols = new ArrayList<>();
            for (int c = 0; c < width; c++) {
                if (roles[c] == Role.TIME) {
                    if (timeCol >= 0) throw at(unitsLine, c + 1 + columnOffset, "two time columns (" + (timeCol + 1 + columnOffset) + " and " + (c + 1 + columnOffset) + ")");
                    timeCol = c;
                } else if (roles[c] == Role.CHANNEL) {
                    channelCols.add(c);
                }
            }
            if (channelCols.isEmpty()) throw at(firstDataLine, 0, "no channel columns (only time or index)");

            String horizontal = metaText.getOrDefault("horizontalunits", metaText.getOrDefault("horizontalunit", ""));
            String vertical = metaText.getOrDefault("verticalunits", metaText.getOrDefault("verticalunit", ""));

            // sample interval
            Double dtFile = null;
            long dtLine = firstDataLine;
            String dtSource;
            if (timeCol >= 0) {
                double f = timeFactor(colUnits[timeCol].isEmpty() ? horizontal : colUnits[timeCol], unitsLine, timeCol);
                dtFile = checkUniform(columns.get(timeCol), rows, f, firstDataLine);
                dtSource = "time column";
            } else if (startIncDt != null) {
                if (!(startIncDt > 0)) throw at(startIncLine, 0, "Increment " + startIncDt + " must be > 0");
                checkUniform(columns.get(0), rows, startIncDt, firstDataLine);
                dtFile = startIncDt;
                dtLine = startIncLine;
                dtSource = "Increment";
            } else {
                dtSource = "preamble";
                for (String k : new String[] {"sampleinterval", "samplinginterval", "xincrement", "timeinterval", "interval", "dt"}) {
                    if (meta.containsKey(k)) {
                        dtFile = meta.get(k) * (horizontal.isEmpty() ? 1 : timeFactor(horizontal, metaLine.get(k), 0));
                        dtLine = metaLine.get(k);
                        break;
                    }
                }
                if (dtFile == null) {
                    for (String k : new String[] {"samplerate", "samplingrate", "samplingfrequency"}) {
                        if (meta.containsKey(k)) {
                            if (!(meta.get(k) > 0)) throw at(metaLine.get(k), 2, "sample rate " + meta.get(k) + " must be > 0");
                            dtFile = 1 / meta.get(k);
                            dtLine = metaLine.get(k);
                            break;
                        }
                    }
                }
                if (dtFile != null && !(dtFile > 0)) throw at(dtLine, 2, "sample interval " + dtFile + " s must be > 0");
            }

            double rateHz;
            if (dtFile != null) {
                rateHz = 1 / dtFile;
                if (!Double.isFinite(rateHz) || !Double.isFinite(dtFile))
                    throw at(dtLine, 0, "the file's " + dtSource + " gives a sample interval of " + show(dtFile) + " s, which no sample rate can match");
                if (options.sampleRateHz().isPresent()) {
                    double given = options.sampleRateHz().getAsDouble();
                    if (Math.abs(given - rateHz) > CaptureOptions.RATE_TOLERANCE * rateHz)
                        throw at(dtLine, 0, "the file's " + dtSource + " gives " + show(rateHz) + " Hz (interval " + show(dtFile)
                                + " s), the given sample rate is " + show(given) + " Hz");
                }
            } else if (options.sampleRateHz().isPresent()) {
                rateHz = options.sampleRateHz().getAsDouble();
            } else {
                throw at(firstDataLine, 0, "no time column and no sample interval in the file, and no sample rate given (give the sample rate)");
            }

            if (meta.containsKey("recordlength") && meta.get("recordlength") != rows)
                warnings.add("line " + metaLine.get("recordlength") + ": record length says "
                        + CaptureReader.fmt(meta.get("recordlength")) + " points, the file has " + rows + " data rows");
            if (options.fullScaleVolts().isPresent())
                warnings.add("the full-scale voltage applies to WAV files only; ignored for this scope CSV (already in volts)");

            // raw ADC codes with a scaling preamble: v = (code − y_ref)·y_inc + y_org
            Double yInc = first(meta, "yincrement", "yinc");
            double yRef = orZero(first(meta, "yreference", "yref"));
            double yOrg = orZero(first(meta, "yorigin", "yorg"));

            double[][] channels = new double[channelCols.size()][];
            for (int k = 0; k < channelCols.size(); k++) {
                int c = channelCols.get(k);
                double[] v = columns.get(c);
                double f;
                if (yInc != null) {
                    for (int i = 0; i < rows; i++) v[i] = (v[i] - yRef) * yInc + yOrg;
                    f = 1;
                } else {
                    f = voltFactor(colUnits[c].isEmpty() ? vertical : colUnits[c], colNames[c], unitsLine, c);
                }
                if (f != 1) for (int i = 0; i < rows; i++) v[i] *= f;
                for (int i = 0; i < rows; i++)
                    if (!Double.isFinite(v[i]))
                        throw at(rowLines[i], c + 1 + columnOffset, "the value scaled to volts is out of range (" + (yInc != null ? "y increment " + show(yInc) : "unit factor " + show(f)) + ")");
                channels[k] = v;
            }
            final double[][] data = channels;
            Capture capture = new Capture(String.valueOf(file.getFileName()), rateHz, data.length, rows, SampleUnit.VOLTS, 1.0,
                    warnings, index -> Capture.arrayReader(data[index]));
            if (options.probeFactor().isPresent()) capture = capture.calibrated(options.probeFactor().getAsDouble(), SampleUnit.VOLTS);
            return capture;
        }

        /** A name with its unit in brackets: {@code CH1 (mV)}, {@code Time[s]}. */
        private static final Pattern UNIT_IN_NAME = Pattern.compile("^(.*?)\\s*[\\(\\[]\\s*([^\\)\\]]*?)\\s*[\\)\\]]\\s*$");

        private static Double first(Map<String, Double> meta, String... keys) {
            for (String k : keys) if (meta.containsKey(k)) return meta.get(k);
            return null;
        }

        private static double orZero(Double d) { return d == null ? 0 : d; }

        private static int indexOfPair(List<String> cells, String a, String b) {
            for (int i = 0; i + 1 < cells.size(); i++)
                if (cells.get(i).equalsIgnoreCase(a) && cells.get(i + 1).equalsIgnoreCase(b)) return i;
            return -1;
        }

        private static final java.util.Set<String> META_KEYS = java.util.Set.of("recordlength", "sampleinterval", "samplinginterval",
                "triggerpoint", "source", "verticalunits", "verticalscale", "verticaloffset", "horizontalunits", "horizontalscale",
                "ptfmt", "yzero", "probeatten", "probeattenuation", "model", "firmware", "firmwareversion", "xincrement", "samplerate");

        private boolean isHeader(Row row, int width) {
            List<String> c = row.cells();
            if (c.size() != width) return false;
            if (width >= 2 && META_KEYS.contains(key(c.get(0)))) return false;
            for (String s : c) if (!Double.isNaN(number(s, decimalComma))) return false;
            return true;
        }

        private static final Pattern UNITISH = Pattern.compile("[(\\[]?[A-Za-zµμ°%/]{1,4}[)\\]]?");

        /** A units row: at least one recognised time or voltage unit, the other cells empty or short unit-like tokens (A, div, dB). */
        private static boolean allUnits(List<String> cells) {
            boolean any = false;
            for (String s : cells) {
                if (s.isEmpty() || s.equalsIgnoreCase("sequence")) continue;
                if (unit(s).isPresent()) any = true;
                else if (!UNITISH.matcher(s).matches()) return false;
            }
            return any;
        }

        private static final java.util.Set<String> INDEX_NAMES = java.util.Set.of("nr", "no", "index", "idx", "sample", "samples",
                "sequence", "point", "points", "n", "");
        private static final java.util.Set<String> TIME_NAMES = java.util.Set.of("time", "t", "second", "seconds", "sec", "s", "times");

        private static Role role(String name, String unitText) {
            String k = key(name);
            if (name.trim().equals("#") || (!name.isBlank() && INDEX_NAMES.contains(k)) || unitText.equalsIgnoreCase("sequence")) return Role.INDEX;
            if (TIME_NAMES.contains(k)) return Role.TIME;
            var u = unit(unitText);
            if (u.isPresent() && u.get().dimension() == Dimension.TIME) return Role.TIME;
            var un = unit(name);
            if (un.isPresent() && un.get().dimension() == Dimension.TIME) return Role.TIME;
            return Role.CHANNEL;
        }

        private double timeFactor(String unitText, long line, int col) throws CaptureFormatException {
            if (unitText.isBlank()) return 1;
            var u = unit(unitText);
            if (u.isEmpty() || u.get().dimension() != Dimension.TIME)
                throw at(line, col + 1 + columnOffset, "time unit '" + unitText + "' is not understood (s, ms, us, µs, ns expected)");
            return u.get().factor();
        }

        private double voltFactor(String unitText, String name, long line, int col) throws CaptureFormatException {
            if (unitText.isBlank()) {
                var un = unit(name); // a header like "mV" on its own
                return un.isPresent() && un.get().dimension() == Dimension.VOLTAGE ? un.get().factor() : 1;
            }
            var u = unit(unitText);
            if (u.isEmpty() || u.get().dimension() != Dimension.VOLTAGE)
                throw at(line, col + 1 + columnOffset, "column " + (col + 1 + columnOffset) + (name.isBlank() ? "" : " (" + name + ")") + " is in '" + unitText
                        + "'; only volts (V, mV, µV, kV) can be read");
            return u.get().factor();
        }

        private static boolean strictlyRising(double[] x, int n) {
            for (int i = 1; i < n; i++) if (!(x[i] > x[i - 1])) return false;
            return n >= 2;
        }

        private static boolean consecutiveIntegers(double[] x, int n) {
            for (int i = 0; i < n; i++) if (x[i] != x[0] + i || x[i] != Math.rint(x[i])) return false;
            return true;
        }

        /**
         * Checks that {@code x·factor} rises uniformly (each interval within {@link #INTERVAL_TOLERANCE} of the median
         * interval) and returns the mean interval (last − first)/(n − 1) in seconds.
         */
        private double checkUniform(double[] x, int n, double factor, long firstDataLine) throws CaptureFormatException {
            if (n < 2) throw at(firstDataLine, 0, "only one data row; at least two are needed to know the sample interval");
            double[] d = new double[n - 1];
            for (int i = 1; i < n; i++) d[i - 1] = (x[i] - x[i - 1]) * factor;
            double[] sorted = d.clone();
            Arrays.sort(sorted);
            double median = sorted[(n - 1) / 2];
            if (!(median > 0)) throw at(rowLines[1], 0, "time does not increase (median interval " + show(median) + " s)");
            for (int i = 0; i < d.length; i++) {
                if (Math.abs(d[i] - median) > INTERVAL_TOLERANCE * median)
                    throw at(rowLines[i + 1], 0, "sample interval " + show(d[i]) + " s differs from " + show(median) + " s");
            }
            return (x[n - 1] - x[0]) * factor / (n - 1);
        }

    }
}
