package org.outstage.verify;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.OptionalDouble;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

/**
 * Reads a spec profile (docs/spec-format.md). One statement per line, {@code #} starts a comment:
 * <pre>
 * name DA-60
 * rated-power 60 W
 * rated-load 8 ohm
 * thd   &lt;= 0.05 %  at 1 kHz, 1 W, 8 ohm
 * power &gt;= 55 W    at 1 kHz, 1 % thd, 8 ohm
 * </pre>
 * Every error names the file and the line.
 */
public final class SpecParser {
    private SpecParser() {}

    private static final Pattern NUMBER_UNIT = Pattern.compile("^([-+]?\\d+(?:\\.\\d+)?(?:[eE][-+]?\\d+)?)\\s*(.*)$");

    public static SpecProfile read(Path file) {
        byte[] bytes;
        try {
            bytes = Files.readAllBytes(file);
        } catch (IOException e) {
            throw new IllegalArgumentException(file + ": cannot read the spec (" + e.getMessage() + ")");
        }
        String head = new String(bytes, 0, Math.min(4, bytes.length), StandardCharsets.ISO_8859_1);
        String notText = file + ": not a text spec file (WHY); give the spec, lines like 'thd <= 0.05 % at 1 kHz, 1 W, 8 ohm' (docs/spec-format.md)";
        if (head.equals("RIFF") || head.equals("RF64") || head.equals("BW64"))
            throw new IllegalArgumentException(notText.replace("WHY", "it is a WAV capture; the captures come after the spec"));
        for (int i = 0; i < Math.min(bytes.length, 4096); i++)
            if (bytes[i] == 0) throw new IllegalArgumentException(notText.replace("WHY", "it holds binary data: byte " + i + " is 0"));
        String text;
        try {
            text = StandardCharsets.UTF_8.newDecoder().onMalformedInput(java.nio.charset.CodingErrorAction.REPORT)
                    .onUnmappableCharacter(java.nio.charset.CodingErrorAction.REPORT).decode(java.nio.ByteBuffer.wrap(bytes)).toString();
        } catch (java.nio.charset.CharacterCodingException e) {
            throw new IllegalArgumentException(notText.replace("WHY", "it is not UTF-8 text"));
        }
        if (!text.isEmpty() && text.charAt(0) == '\uFEFF') text = text.substring(1);
        return parse(text, file.toString());
    }

    public static SpecProfile parse(String text, String source) {
        String name = null;
        OptionalDouble ratedPower = OptionalDouble.empty();
        OptionalDouble ratedLoad = OptionalDouble.empty();
        double freqTol = 0.05;
        double powerTol = 0.10;
        List<String[]> limitLines = new ArrayList<>();
        String[] lines = text.split("\r?\n", -1);
        for (int i = 0; i < lines.length; i++) {
            int no = i + 1;
            String line = lines[i].replaceFirst("#.*", "").strip();
            if (line.isEmpty()) continue;
            String[] kw = line.split("\\s+", 2);
            String key = kw[0].toLowerCase(Locale.ROOT);
            String rest = kw.length > 1 ? kw[1].strip() : "";
            switch (key) {
                case "name" -> {
                    if (rest.isEmpty()) throw error(source, no, "name needs a value");
                    name = rest;
                }
                case "rated-power" -> ratedPower = OptionalDouble.of(quantity(source, no, rest, "W"));
                case "rated-load" -> ratedLoad = OptionalDouble.of(quantity(source, no, rest, "ohm"));
                case "match-frequency" -> freqTol = quantity(source, no, rest, "%") / 100;
                case "match-power" -> powerTol = quantity(source, no, rest, "%") / 100;
                default -> {
                    if (Quantity.byKeyword(key) == null) {
                        throw error(source, no, "unknown statement '" + kw[0] + "' (expected name, rated-power, rated-load, match-frequency,"
                                + " match-power, or a limit: thd, thd+n, power, clip-asymmetry, noise, balance, imd, snr, crosstalk, response-deviation,"
                                + " bandwidth-low, bandwidth-high, damping-factor)");
                    }
                    limitLines.add(new String[] {Integer.toString(no), line});
                }
            }
        }
        List<Limit> limits = new ArrayList<>();
        for (String[] l : limitLines) limits.add(limit(source, Integer.parseInt(l[0]), l[1], ratedPower, ratedLoad));
        if (limits.isEmpty()) throw new IllegalArgumentException(source + ": the spec has no limits");
        return new SpecProfile(source, name == null ? Path.of(source).getFileName().toString() : name, ratedPower, ratedLoad, freqTol,
                powerTol, limits);
    }

    private static IllegalArgumentException error(String source, int line, String msg) {
        return new IllegalArgumentException(source + ", line " + line + ": " + msg);
    }

    private static final Pattern DECIMAL_COMMA = Pattern.compile("^[-+]?\\d+,\\d+.*");

    /** Refuses a number written with a decimal comma ("0,05 %"), naming it, instead of reading "0" and a unit ",05 %". */
    private static void noDecimalComma(String source, int no, String text) {
        String t = text.strip();
        if (DECIMAL_COMMA.matcher(t).matches()) {
            String number = t.split("[^-+\\d,]", 2)[0];
            throw error(source, no, "'" + number + "' has a decimal comma; write it with a point (" + number.replace(',', '.') + ")");
        }
    }

    /** "60 W" → 60 with the unit checked (ohm also accepts Ω). */
    private static double quantity(String source, int no, String text, String unit) {
        noDecimalComma(source, no, text);
        Matcher m = NUMBER_UNIT.matcher(text.strip());
        if (!m.matches()) throw error(source, no, "expected a number and " + unit + ", got '" + text + "'");
        String u = m.group(2).strip();
        boolean ok = u.equalsIgnoreCase(unit) || (unit.equals("ohm") && (u.equals("Ω") || u.equalsIgnoreCase("ohms")));
        if (!ok) throw error(source, no, "expected the unit " + unit + ", got '" + u + "'");
        double v = Double.parseDouble(m.group(1));
        if (!(v > 0)) throw error(source, no, text + " must be > 0");
        return v;
    }

    private static Limit limit(String source, int no, String line, OptionalDouble ratedPower, OptionalDouble ratedLoad) {
        String head = line;
        String cond = "";
        int at = indexOfWord(line, "at");
        if (at >= 0) {
            head = line.substring(0, at).strip();
            cond = line.substring(at + 2).strip();
            if (cond.isEmpty()) throw error(source, no, "'at' needs conditions, e.g. 'at 1 kHz, 1 W, 8 ohm'");
        }
        String[] parts = head.split("\\s+", 3);
        if (parts.length < 3) throw error(source, no, "expected QUANTITY <= or >= VALUE UNIT, got '" + head + "'");
        Quantity q = Quantity.byKeyword(parts[0]);
        boolean atMost;
        if (parts[1].equals("<=") || parts[1].equals("≤")) atMost = true;
        else if (parts[1].equals(">=") || parts[1].equals("≥")) atMost = false;
        else throw error(source, no, "expected <= or >= after " + parts[0] + ", got '" + parts[1] + "'");
        noDecimalComma(source, no, parts[2]);
        Matcher m = NUMBER_UNIT.matcher(parts[2].strip());
        if (!m.matches()) throw error(source, no, "expected a number and a unit, got '" + parts[2] + "'");
        double v = Double.parseDouble(m.group(1));
        String unit = m.group(2).strip().replace("uV", "µV");
        double bound;
        switch (q) {
            case THD, THD_N, CLIP_ASYMMETRY -> {
                if (unit.equals("%")) bound = v / 100;
                else if (unit.equals("dB") && q != Quantity.CLIP_ASYMMETRY) bound = Math.pow(10, v / 20);
                else throw error(source, no, q.keyword() + " takes % " + (q == Quantity.CLIP_ASYMMETRY ? "" : "or dB ") + "(got '" + unit + "')");
            }
            case POWER -> {
                if (unit.equals("W")) bound = v;
                else if (unit.equals("mW")) bound = v / 1000;
                else throw error(source, no, "power takes W (got '" + unit + "')");
                unit = "W";
            }
            case NOISE -> {
                bound = switch (unit) {
                    case "V" -> v;
                    case "mV" -> v / 1e3;
                    case "µV" -> v / 1e6;
                    default -> throw error(source, no, "noise takes V, mV or µV (got '" + unit + "')");
                };
            }
            case BALANCE -> {
                if (!unit.equals("dB")) throw error(source, no, "balance takes dB (got '" + unit + "')");
                bound = v;
            }
            case IMD -> {
                if (unit.equals("%")) bound = v / 100;
                else if (unit.equals("dB")) bound = Math.pow(10, v / 20);
                else throw error(source, no, "imd takes % or dB (got '" + unit + "')");
            }
            case SNR, RESPONSE_DEVIATION -> {
                if (!unit.equals("dB")) throw error(source, no, q.keyword() + " takes dB (got '" + unit + "')");
                bound = v;
            }
            case CROSSTALK -> {
                if (!unit.equals("dB")) throw error(source, no, "crosstalk takes dB (got '" + unit + "')");
                if (!(v < 0)) throw error(source, no, "crosstalk is a level below the driven channel: write it negative, e.g. -60 dB");
                bound = v;
            }
            case BANDWIDTH_LOW, BANDWIDTH_HIGH -> {
                if (unit.equals("Hz")) bound = v;
                else if (unit.equals("kHz")) bound = v * 1000;
                else throw error(source, no, q.keyword() + " takes Hz or kHz (got '" + unit + "')");
            }
            case DAMPING_FACTOR -> {
                if (!unit.isEmpty()) throw error(source, no, "damping-factor is a plain number (got the unit '" + unit + "')");
                bound = v;
            }
            default -> throw new IllegalStateException(q.toString());
        }
        if (q != Quantity.CROSSTALK && (!(bound > 0) || !Double.isFinite(bound))) throw error(source, no, "the bound must be > 0");
        OptionalDouble f = OptionalDouble.empty();
        OptionalDouble p = OptionalDouble.empty();
        OptionalDouble r = OptionalDouble.empty();
        OptionalDouble thd = OptionalDouble.empty();
        String qualifier = "";
        if (!cond.isEmpty()) {
            Matcher dc = Pattern.compile("[-+]?\\d+,\\d+").matcher(cond);
            if (dc.find())   // "at 1,5 kHz": the comma separates conditions, so a decimal comma would split the number
                throw error(source, no, "'" + dc.group() + "' has a decimal comma; write it with a point (" + dc.group().replace(',', '.')
                        + "): commas separate the conditions");
            for (String c : cond.split(",")) {
                String t = c.strip();
                String word = t.toLowerCase(Locale.ROOT);
                if (q == Quantity.IMD && (word.equals("smpte") || word.equals("difference-frequency") || word.equals("twin"))) {
                    qualifier = word.equals("twin") ? "difference-frequency" : word;
                    continue;
                }
                if (q == Quantity.SNR && (word.equals("a-weighted") || word.equals("unweighted"))) {
                    qualifier = word;
                    continue;
                }
                if (t.equalsIgnoreCase("rated power") || t.equalsIgnoreCase("rated")) {
                    if (ratedPower.isEmpty()) throw error(source, no, "'rated power' needs a rated-power line before the limits");
                    p = ratedPower;
                    continue;
                }
                if (t.equalsIgnoreCase("rated load")) {
                    if (ratedLoad.isEmpty()) throw error(source, no, "'rated load' needs a rated-load line");
                    r = ratedLoad;
                    continue;
                }
                Matcher cm = NUMBER_UNIT.matcher(t);
                if (!cm.matches()) throw error(source, no, "cannot read the condition '" + t + "'");
                double x = Double.parseDouble(cm.group(1));
                if (!(x > 0)) throw error(source, no, "the condition '" + t + "' must be > 0");
                String u = cm.group(2).strip();
                switch (u.toLowerCase(Locale.ROOT)) {
                    case "hz" -> f = OptionalDouble.of(x);
                    case "khz" -> f = OptionalDouble.of(x * 1000);
                    case "w" -> p = OptionalDouble.of(x);
                    case "mw" -> p = OptionalDouble.of(x / 1000);
                    case "ohm", "ohms", "ω" -> r = OptionalDouble.of(x);
                    case "% thd" -> {
                        if (q != Quantity.POWER) throw error(source, no, "'% thd' is a condition of the power limit only");
                        thd = OptionalDouble.of(x / 100);
                    }
                    default -> throw error(source, no, "unknown condition unit in '" + t + "' (Hz, kHz, W, mW, ohm, % thd, rated power)");
                }
            }
        }
        if (q == Quantity.POWER && thd.isEmpty()) throw error(source, no, "power needs the THD it is read at, e.g. 'at 1 kHz, 1 % thd, 8 ohm'");
        if (q == Quantity.POWER && p.isPresent()) throw error(source, no, "power is what is measured; it cannot also be a condition");
        if (q == Quantity.SNR && p.isEmpty()) throw error(source, no, "snr needs the power it is referred to, e.g. 'at rated power, a-weighted' or 'at 1 W'");
        return new Limit(no, q, atMost, bound, unit, f, p, r, thd, line, qualifier);
    }

    private static int indexOfWord(String line, String word) {
        Matcher m = Pattern.compile("(?i)(^|\\s)" + word + "(\\s|$)").matcher(line);
        return m.find() ? m.start() + m.group(1).length() : -1;
    }
}
