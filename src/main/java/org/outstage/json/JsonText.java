package org.outstage.json;

import com.fasterxml.jackson.core.JsonFactory;
import com.fasterxml.jackson.core.JsonFactoryBuilder;
import com.fasterxml.jackson.core.JsonGenerator;
import com.fasterxml.jackson.core.JsonParser;
import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.core.JsonToken;
import com.fasterxml.jackson.core.PrettyPrinter;
import com.fasterxml.jackson.core.SerializableString;
import com.fasterxml.jackson.core.io.CharacterEscapes;
import com.fasterxml.jackson.core.io.SerializedString;
import java.io.IOException;
import java.io.StringWriter;
import java.io.UncheckedIOException;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.Collection;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Optional;
import java.util.OptionalDouble;
import java.util.OptionalInt;

/**
 * JSON text (RFC 8259) through Jackson's streaming generator and parser (jackson-core); the one place the project
 * reads and writes JSON.
 *
 * <p>Writing: {@link #write(Object)} turns maps (keys in insertion order), lists, arrays of double or int, strings,
 * numbers, booleans, enums (lower case, {@code _} as {@code -}), {@code null}, {@link Optional},
 * {@link OptionalDouble} and {@link OptionalInt} into compact text; {@link #pretty(Object)} indents by two spaces,
 * one entry a line, except arrays of double ({@code [1.0, 2.5]}) and of int ({@code [1,2]}), which stay on one
 * line. Non-finite doubles (NaN, ±infinity) are written as {@code null}: RFC 8259 §6 has no text for them.
 * Doubles are written by {@link #numberText(double)}, whose text reads back to the same bits.
 *
 * <p>Reading: {@link #parse(String)} gives {@code LinkedHashMap}, {@code ArrayList}, {@code String}, {@code Double}
 * (every number), {@code Boolean} or {@code null}; malformed text throws {@link IllegalArgumentException} that
 * names the character offset ({@code JSON at character 8: ...}). The parser is strict RFC 8259: no comments,
 * no leading zeros or {@code +}, no trailing commas, no NaN.
 *
 * <p>The text is the same, byte for byte, as the hand-written writer this class replaces (issue 13), except that
 * a negative zero is now written {@code -0.0} (it was {@code 0.0}) so that every finite double round-trips.
 */
public final class JsonText {
    private JsonText() {}

    /** Thread-safe once built; Jackson's default read limits (nesting 1000, number 1000 chars, string 20M chars). */
    private static final JsonFactory FACTORY = new JsonFactoryBuilder().characterEscapes(new Escapes()).build();

    /** An ordered map builder: {@code JsonText.obj("a", 1, "b", "x")}. */
    public static Map<String, Object> obj(Object... keyValues) {
        if (keyValues.length % 2 != 0) throw new IllegalArgumentException("obj needs key/value pairs, got " + keyValues.length + " items");
        Map<String, Object> m = new LinkedHashMap<>();
        for (int i = 0; i < keyValues.length; i += 2) m.put((String) keyValues[i], keyValues[i + 1]);
        return m;
    }

    /** Compact JSON text of a value (see the class comment for the types written). */
    public static String write(Object value) {
        return render(value, null);
    }

    /** Indented JSON text of a value: two spaces a level, {@code "key": value}, number arrays on one line. */
    public static String pretty(Object value) {
        return render(value, new Indent());
    }

    private static String render(Object value, Indent indent) {
        StringWriter w = new StringWriter();
        try (JsonGenerator g = FACTORY.createGenerator(w)) {
            if (indent != null) g.setPrettyPrinter(indent);
            value(g, value, indent);
        } catch (IOException e) {
            throw new UncheckedIOException(e); // a StringWriter does not fail; Jackson's signatures declare it
        }
        return w.toString();
    }

    private static void value(JsonGenerator g, Object v, Indent indent) throws IOException {
        if (v instanceof Optional<?> o) v = o.orElse(null);
        if (v instanceof OptionalDouble od) v = od.isPresent() ? od.getAsDouble() : null;
        if (v instanceof OptionalInt oi) v = oi.isPresent() ? oi.getAsInt() : null;
        if (v == null) g.writeNull();
        else if (v instanceof String s) g.writeString(s);
        else if (v instanceof Double d) number(g, d);
        else if (v instanceof Float f) number(g, f.doubleValue());
        else if (v instanceof Integer i) g.writeNumber(i.intValue());
        else if (v instanceof Long l) g.writeNumber(l.longValue());
        else if (v instanceof Number n) g.writeNumber(n.toString()); // Short, BigDecimal...: their own text, as before
        else if (v instanceof Boolean b) g.writeBoolean(b);
        else if (v instanceof Enum<?> e) g.writeString(e.name().toLowerCase(Locale.ROOT).replace('_', '-'));
        else if (v instanceof Map<?, ?> m) {
            g.writeStartObject();
            for (Map.Entry<?, ?> e : m.entrySet()) {
                g.writeFieldName(String.valueOf(e.getKey()));
                value(g, e.getValue(), indent);
            }
            g.writeEndObject();
        } else if (v instanceof double[] arr) {
            if (indent != null) indent.next = Indent.INLINE_SPACED;
            g.writeStartArray();
            for (double d : arr) number(g, d);
            g.writeEndArray();
        } else if (v instanceof int[] arr) {
            if (indent != null) indent.next = Indent.INLINE_TIGHT;
            g.writeStartArray();
            for (int i : arr) g.writeNumber(i);
            g.writeEndArray();
        } else if (v instanceof Collection<?> c) {
            g.writeStartArray();
            for (Object o : c) value(g, o, indent);
            g.writeEndArray();
        } else if (v instanceof Object[] arr) {
            value(g, Arrays.asList(arr), indent);
        } else {
            throw new IllegalArgumentException("cannot write " + v.getClass().getName() + " as JSON");
        }
    }

    private static void number(JsonGenerator g, double d) throws IOException {
        if (!Double.isFinite(d)) g.writeNull();
        else g.writeNumber(numberText(d));
    }

    /**
     * The JSON text of a finite double; it reads back ({@link Double#parseDouble}) to the same bits.
     * <ul>
     * <li>Integral values below 10^15 in magnitude: the integer and {@code .0} ({@code 10000000.0}, where
     * {@link Double#toString} would give {@code 1.0E7}); the integer is exact, as every such double is an integer
     * below 2^53. Negative zero is {@code -0.0}.</li>
     * <li>All others: {@link Double#toString}. Its Javadoc (Java SE 17) requires "as many, but only as many, more
     * digits as are needed to uniquely distinguish the argument value from adjacent values of type double", and
     * {@link Double#valueOf(String)} rounds to nearest (IEEE 754), so the text reads back to the same double. On
     * JDK 17 the text is not always the shortest such (bug JDK-4511638, e.g. {@code 2.0E23} prints as
     * {@code 1.9999999999999998E23}); JDK 19 replaced the algorithm with Raffaello Giulietti's Schubfach
     * ("The Schubfach way to render doubles", 2020; JDK-4511638 fixed in 19), which gives the shortest. Both
     * round-trip, so the choice of JDK changes at most the length of a few numbers, never their value.</li>
     * </ul>
     * Either form fits RFC 8259 §6's grammar {@code number = [ minus ] int [ frac ] [ exp ]}; §6 leaves range and
     * precision to the implementation and names IEEE 754 binary64 as the interoperable choice, which is what
     * {@link #parse} gives.
     */
    static String numberText(double d) {
        if (d == Math.rint(d) && Math.abs(d) < 1e15) {
            if (d == 0 && Double.doubleToRawLongBits(d) != 0) return "-0.0";
            return (long) d + ".0";
        }
        return Double.toString(d);
    }

    /** Parses one JSON value (see the class comment for the types returned). */
    public static Object parse(String text) {
        try (JsonParser p = FACTORY.createParser(text)) {
            JsonToken t = p.nextToken();
            if (t == null) throw new IllegalArgumentException("JSON at character " + text.length() + ": unexpected end");
            Object v = read(p, t);
            if (p.nextToken() != null) {
                throw new IllegalArgumentException("JSON at character " + p.currentTokenLocation().getCharOffset() + ": unexpected text after the value");
            }
            return v;
        } catch (JsonProcessingException e) {
            long at = e.getLocation() == null ? -1 : e.getLocation().getCharOffset();
            String what = e.getOriginalMessage() == null ? "malformed" : e.getOriginalMessage().lines().findFirst().orElse("malformed");
            throw new IllegalArgumentException("JSON at character " + at + ": " + what, e);
        } catch (IOException e) {
            throw new UncheckedIOException(e); // reading a String does not fail otherwise
        }
    }

    private static Object read(JsonParser p, JsonToken t) throws IOException {
        switch (t) {
            case START_OBJECT -> {
                Map<String, Object> m = new LinkedHashMap<>();
                for (JsonToken k = p.nextToken(); k != JsonToken.END_OBJECT; k = p.nextToken()) {
                    String key = p.currentName();
                    m.put(key, read(p, p.nextToken()));
                }
                return m;
            }
            case START_ARRAY -> {
                List<Object> l = new ArrayList<>();
                for (JsonToken e = p.nextToken(); e != JsonToken.END_ARRAY; e = p.nextToken()) l.add(read(p, e));
                return l;
            }
            case VALUE_STRING -> { return p.getText(); }
            // Double.parseDouble on the token's text: correctly rounded (Double.valueOf Javadoc), and "-0" keeps its sign
            case VALUE_NUMBER_INT, VALUE_NUMBER_FLOAT -> { return Double.parseDouble(p.getText()); }
            case VALUE_TRUE -> { return Boolean.TRUE; }
            case VALUE_FALSE -> { return Boolean.FALSE; }
            case VALUE_NULL -> { return null; }
            default -> throw new IllegalArgumentException("JSON at character " + p.currentTokenLocation().getCharOffset() + ": unexpected " + t);
        }
    }

    /**
     * String escapes as the earlier writer wrote them: {@code \"}, {@code \\}, {@code \n}, {@code \r}, {@code \t},
     * and {@code \}{@code u00xx} in lower-case hex for the other control characters (Jackson's default would write
     * {@code \b}, {@code \f} and upper-case hex). Everything else, non-ASCII included, is written as is (RFC 8259 §7).
     */
    private static final class Escapes extends CharacterEscapes {
        private static final long serialVersionUID = 1L;
        private final int[] codes = CharacterEscapes.standardAsciiEscapesForJSON();
        private final SerializableString[] controls = new SerializableString[0x20];

        Escapes() {
            for (int c = 0; c < 0x20; c++) {
                if (c == '\n' || c == '\r' || c == '\t') continue;
                codes[c] = ESCAPE_CUSTOM;
                controls[c] = new SerializedString("\\u00" + Character.forDigit(c >> 4, 16) + Character.forDigit(c & 15, 16));
            }
        }

        @Override public int[] getEscapeCodesForAscii() { return codes; }

        @Override public SerializableString getEscapeSequence(int ch) { return ch < 0x20 ? controls[ch] : null; }
    }

    /**
     * The earlier writer's layout: {@code {}, {@code [} and each entry on a new line indented by two spaces a level,
     * {@code "key": value}, empty containers as {@code {}} and {@code []}; arrays of double inline with {@code ", "},
     * arrays of int inline with {@code ","}.
     */
    private static final class Indent implements PrettyPrinter {
        static final byte BLOCK = 0, INLINE_SPACED = 1, INLINE_TIGHT = 2;
        /** The style of the array about to start; set just before {@code writeStartArray}. */
        byte next = BLOCK;
        private byte[] arrays = new byte[16];
        private int openArrays;
        private int depth;

        /** A newline and 32 levels of indentation, written in one piece. */
        private static final char[] NEWLINE = ("\n" + " ".repeat(64)).toCharArray();

        private void newline(JsonGenerator g) throws IOException {
            if (2 * depth < NEWLINE.length) {
                g.writeRaw(NEWLINE, 0, 1 + 2 * depth);
                return;
            }
            g.writeRaw('\n');
            for (int i = 0; i < depth; i++) g.writeRaw("  ");
        }

        private byte current() { return arrays[openArrays - 1]; }

        @Override public void writeRootValueSeparator(JsonGenerator g) throws IOException { g.writeRaw('\n'); }

        @Override public void writeStartObject(JsonGenerator g) throws IOException {
            g.writeRaw('{');
            depth++;
        }

        @Override public void beforeObjectEntries(JsonGenerator g) throws IOException { newline(g); }

        @Override public void writeObjectFieldValueSeparator(JsonGenerator g) throws IOException { g.writeRaw(": "); }

        @Override public void writeObjectEntrySeparator(JsonGenerator g) throws IOException {
            g.writeRaw(',');
            newline(g);
        }

        @Override public void writeEndObject(JsonGenerator g, int entries) throws IOException {
            depth--;
            if (entries > 0) newline(g);
            g.writeRaw('}');
        }

        @Override public void writeStartArray(JsonGenerator g) throws IOException {
            if (openArrays == arrays.length) arrays = Arrays.copyOf(arrays, 2 * openArrays);
            arrays[openArrays++] = next;
            next = BLOCK;
            g.writeRaw('[');
            depth++;
        }

        @Override public void beforeArrayValues(JsonGenerator g) throws IOException {
            if (current() == BLOCK) newline(g);
        }

        @Override public void writeArrayValueSeparator(JsonGenerator g) throws IOException {
            switch (current()) {
                case INLINE_SPACED -> g.writeRaw(", ");
                case INLINE_TIGHT -> g.writeRaw(',');
                default -> {
                    g.writeRaw(',');
                    newline(g);
                }
            }
        }

        @Override public void writeEndArray(JsonGenerator g, int values) throws IOException {
            depth--;
            if (arrays[--openArrays] == BLOCK && values > 0) newline(g);
            g.writeRaw(']');
        }
    }
}
