package org.outstage.json;

import java.util.ArrayList;
import java.util.Collection;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.OptionalDouble;
import java.util.OptionalInt;

/**
 * The hand-written JSON writer and reader that {@link JsonText} replaced (issue 13), kept unchanged from
 * {@code src/main/java/org/outstage/json/Json.java} at commit 8c0a202 as the naive reference for the tests:
 * JsonText must write the same bytes (except {@code -0.0}, which this one wrote as {@code 0.0}) and read the same
 * values. Not for production use.
 */
final class EarlierJson {
    private EarlierJson() {}

    /** An ordered map builder: {@code EarlierJson.obj("a", 1, "b", "x")}. */
    public static Map<String, Object> obj(Object... keyValues) {
        if (keyValues.length % 2 != 0) throw new IllegalArgumentException("obj needs key/value pairs, got " + keyValues.length + " items");
        Map<String, Object> m = new LinkedHashMap<>();
        for (int i = 0; i < keyValues.length; i += 2) m.put((String) keyValues[i], keyValues[i + 1]);
        return m;
    }

    public static String write(Object value) {
        StringBuilder sb = new StringBuilder();
        write(sb, value, -1, 0);
        return sb.toString();
    }

    public static String pretty(Object value) {
        StringBuilder sb = new StringBuilder();
        write(sb, value, 2, 0);
        return sb.toString();
    }

    private static void write(StringBuilder sb, Object v, int indent, int depth) {
        if (v instanceof Optional<?> o) v = o.orElse(null);
        if (v instanceof OptionalDouble od) v = od.isPresent() ? od.getAsDouble() : null;
        if (v instanceof OptionalInt oi) v = oi.isPresent() ? oi.getAsInt() : null;
        if (v == null) sb.append("null");
        else if (v instanceof String s) string(sb, s);
        else if (v instanceof Double d) number(sb, d);
        else if (v instanceof Float f) number(sb, f.doubleValue());
        else if (v instanceof Number n) sb.append(n.toString());
        else if (v instanceof Boolean b) sb.append(b);
        else if (v instanceof Enum<?> e) string(sb, e.name().toLowerCase(java.util.Locale.ROOT).replace('_', '-'));
        else if (v instanceof Map<?, ?> m) {
            sb.append('{');
            boolean first = true;
            for (Map.Entry<?, ?> e : m.entrySet()) {
                if (!first) sb.append(',');
                first = false;
                newline(sb, indent, depth + 1);
                string(sb, String.valueOf(e.getKey()));
                sb.append(indent >= 0 ? ": " : ":");
                write(sb, e.getValue(), indent, depth + 1);
            }
            if (!m.isEmpty()) newline(sb, indent, depth);
            sb.append('}');
        } else if (v instanceof double[] arr) {
            sb.append('[');
            for (int i = 0; i < arr.length; i++) {
                if (i > 0) sb.append(indent >= 0 ? ", " : ",");
                number(sb, arr[i]);
            }
            sb.append(']');
        } else if (v instanceof int[] arr) {
            sb.append('[');
            for (int i = 0; i < arr.length; i++) {
                if (i > 0) sb.append(',');
                sb.append(arr[i]);
            }
            sb.append(']');
        } else if (v instanceof Collection<?> c) {
            sb.append('[');
            boolean first = true;
            for (Object o : c) {
                if (!first) sb.append(',');
                first = false;
                newline(sb, indent, depth + 1);
                write(sb, o, indent, depth + 1);
            }
            if (!c.isEmpty()) newline(sb, indent, depth);
            sb.append(']');
        } else if (v instanceof Object[] arr) {
            write(sb, List.of(arr), indent, depth);
        } else {
            throw new IllegalArgumentException("cannot write " + v.getClass().getName() + " as JSON");
        }
    }

    private static void newline(StringBuilder sb, int indent, int depth) {
        if (indent < 0) return;
        sb.append('\n');
        for (int i = 0; i < indent * depth; i++) sb.append(' ');
    }

    private static void number(StringBuilder sb, double d) {
        if (!Double.isFinite(d)) { sb.append("null"); return; }
        if (d == Math.rint(d) && Math.abs(d) < 1e15) {
            sb.append((long) d).append(".0");
        } else {
            sb.append(Double.toString(d));
        }
    }

    private static void string(StringBuilder sb, String s) {
        sb.append('"');
        for (int i = 0; i < s.length(); i++) {
            char c = s.charAt(i);
            switch (c) {
                case '"' -> sb.append("\\\"");
                case '\\' -> sb.append("\\\\");
                case '\n' -> sb.append("\\n");
                case '\r' -> sb.append("\\r");
                case '\t' -> sb.append("\\t");
                default -> {
                    if (c < 0x20) sb.append(String.format("\\u%04x", (int) c));
                    else sb.append(c);
                }
            }
        }
        sb.append('"');
    }

    /** Parses one JSON value (see class comment for the types returned). */
    public static Object parse(String text) {
        Parser p = new Parser(text);
        p.ws();
        Object v = p.value();
        p.ws();
        if (p.pos != text.length()) throw p.error("unexpected text after the value");
        return v;
    }

    private static final class Parser {
        private final String s;
        private int pos;

        Parser(String s) { this.s = s; }

        IllegalArgumentException error(String what) {
            return new IllegalArgumentException("JSON at character " + pos + ": " + what);
        }

        void ws() {
            while (pos < s.length() && Character.isWhitespace(s.charAt(pos))) pos++;
        }

        Object value() {
            if (pos >= s.length()) throw error("unexpected end");
            char c = s.charAt(pos);
            switch (c) {
                case '{': return object();
                case '[': return array();
                case '"': return str();
                case 't': expect("true"); return Boolean.TRUE;
                case 'f': expect("false"); return Boolean.FALSE;
                case 'n': expect("null"); return null;
                default:
                    if (c == '-' || (c >= '0' && c <= '9')) return num();
                    throw error("unexpected character '" + c + "'");
            }
        }

        void expect(String word) {
            if (!s.startsWith(word, pos)) throw error("expected " + word);
            pos += word.length();
        }

        Map<String, Object> object() {
            Map<String, Object> m = new LinkedHashMap<>();
            pos++;
            ws();
            if (pos < s.length() && s.charAt(pos) == '}') { pos++; return m; }
            while (true) {
                ws();
                if (pos >= s.length() || s.charAt(pos) != '"') throw error("expected a key");
                String k = str();
                ws();
                if (pos >= s.length() || s.charAt(pos) != ':') throw error("expected ':'");
                pos++;
                ws();
                m.put(k, value());
                ws();
                if (pos >= s.length()) throw error("unexpected end in object");
                char c = s.charAt(pos++);
                if (c == '}') return m;
                if (c != ',') throw error("expected ',' or '}'");
            }
        }

        List<Object> array() {
            List<Object> l = new ArrayList<>();
            pos++;
            ws();
            if (pos < s.length() && s.charAt(pos) == ']') { pos++; return l; }
            while (true) {
                ws();
                l.add(value());
                ws();
                if (pos >= s.length()) throw error("unexpected end in array");
                char c = s.charAt(pos++);
                if (c == ']') return l;
                if (c != ',') throw error("expected ',' or ']'");
            }
        }

        String str() {
            StringBuilder sb = new StringBuilder();
            pos++;
            while (true) {
                if (pos >= s.length()) throw error("unterminated string");
                char c = s.charAt(pos++);
                if (c == '"') return sb.toString();
                if (c == '\\') {
                    if (pos >= s.length()) throw error("unterminated escape");
                    char e = s.charAt(pos++);
                    switch (e) {
                        case '"', '\\', '/' -> sb.append(e);
                        case 'n' -> sb.append('\n');
                        case 'r' -> sb.append('\r');
                        case 't' -> sb.append('\t');
                        case 'b' -> sb.append('\b');
                        case 'f' -> sb.append('\f');
                        case 'u' -> {
                            if (pos + 4 > s.length()) throw error("short \\u escape");
                            sb.append((char) Integer.parseInt(s.substring(pos, pos + 4), 16));
                            pos += 4;
                        }
                        default -> throw error("bad escape \\" + e);
                    }
                } else sb.append(c);
            }
        }

        Double num() {
            int start = pos;
            while (pos < s.length() && "+-0123456789.eE".indexOf(s.charAt(pos)) >= 0) pos++;
            try {
                return Double.parseDouble(s.substring(start, pos));
            } catch (NumberFormatException e) {
                pos = start;
                throw error("bad number");
            }
        }
    }
}
