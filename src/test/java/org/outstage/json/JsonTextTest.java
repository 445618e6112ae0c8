package org.outstage.json;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.OptionalDouble;
import java.util.OptionalInt;
import java.util.Random;
import org.junit.jupiter.api.Test;

/**
 * JsonText against three oracles: bit equality of doubles after a round trip (Double.toString's Javadoc requires
 * enough digits to tell a double from its neighbours, Double.valueOf rounds to nearest: Java SE 17 API), the
 * earlier hand-written writer and reader kept in the test tree ({@link EarlierJson}) for byte compatibility, and
 * RFC 8259 for the text forms.
 */
class JsonTextTest {

    private static double single(String text) {
        return (Double) ((List<?>) JsonText.parse(text)).get(0);
    }

    private static void assertSameBits(double expected, double actual, String text) {
        assertEquals(Double.doubleToRawLongBits(expected), Double.doubleToRawLongBits(actual),
                () -> "round trip of " + expected + " through " + text + " gave " + actual);
    }

    /** Random bit patterns cover every exponent, subnormals and both signs; arrays and boxed values both. */
    @Test
    void randomBitPatterns_roundTripBitForBit() {
        Random r = new Random(20261204L);
        for (int batch = 0; batch < 20; batch++) {
            double[] values = new double[10_000];
            for (int i = 0; i < values.length; i++) {
                double d;
                do d = Double.longBitsToDouble(r.nextLong()); while (!Double.isFinite(d));
                values[i] = d;
            }
            String compact = JsonText.write(values);
            String pretty = JsonText.pretty(values);
            List<?> a = (List<?>) JsonText.parse(compact), b = (List<?>) JsonText.parse(pretty);
            assertEquals(values.length, a.size());
            for (int i = 0; i < values.length; i++) {
                assertSameBits(values[i], (Double) a.get(i), compact.length() < 200 ? compact : "a double[] batch");
                assertSameBits(values[i], (Double) b.get(i), "the pretty form");
            }
        }
        for (int i = 0; i < 20_000; i++) {   // boxed, inside a map, over ordinary magnitudes
            double d = r.nextGaussian() * Math.pow(10, r.nextInt(40) - 20);
            String text = JsonText.write(JsonText.obj("x", d));
            assertSameBits(d, (Double) ((Map<?, ?>) JsonText.parse(text)).get("x"), text);
        }
    }

    /** Subnormals (biased exponent 0, IEEE 754-2019 §3.4) and the edges of the normal range. */
    @Test
    void subnormalsAndRangeEdges_roundTripBitForBit() {
        Random r = new Random(4_940_656_458L);
        List<Double> values = new ArrayList<>(List.of(Double.MIN_VALUE, -Double.MIN_VALUE, Double.MIN_NORMAL,
                Math.nextDown(Double.MIN_NORMAL), -Math.nextDown(Double.MIN_NORMAL), Double.MAX_VALUE, -Double.MAX_VALUE,
                Math.nextDown(Double.MAX_VALUE)));
        for (int i = 0; i < 50_000; i++) {
            long mantissa = r.nextLong() & ((1L << 52) - 1);
            if (mantissa == 0) continue;
            values.add(Double.longBitsToDouble(mantissa | (r.nextBoolean() ? Long.MIN_VALUE : 0)));
        }
        for (double d : values) {
            String text = JsonText.write(List.of(d));
            assertSameBits(d, single(text), text);
        }
    }

    /**
     * Named values with their exact text. 2e23, 1e23 and 8.41e21 are cases where JDK 17's Double.toString is not the
     * shortest (JDK-4511638, fixed in JDK 19): only the round trip is asserted for them, as the text depends on the
     * JDK.
     */
    @Test
    void namedValues_haveTheirTextAndRoundTrip() {
        Object[][] cases = {
            {0.1, "0.1"}, {1e-300, "1.0E-300"}, {0.0, "0.0"}, {-0.0, "-0.0"}, {1.0 / 3, "0.3333333333333333"},
            {1.5, "1.5"}, {-2.0, "-2.0"}, {1e7, "10000000.0"}, {-123456789012345.0, "-123456789012345.0"},
            {999999999999999.0, "999999999999999.0"}, {1e15, "1.0E15"}, {0x1p53, "9.007199254740992E15"},
            {Double.MIN_VALUE, "4.9E-324"}, {Double.MAX_VALUE, "1.7976931348623157E308"}, {2.3418730281242678E-4, "2.3418730281242678E-4"},
            {48000.0, "48000.0"}, {1.25e-7, "1.25E-7"},
        };
        for (Object[] c : cases) {
            double d = (Double) c[0];
            assertEquals(c[1], JsonText.numberText(d), () -> "text of " + d);
            assertEquals("[" + c[1] + "]", JsonText.write(new double[] {d}));
            assertSameBits(d, single(JsonText.write(List.of(d))), (String) c[1]);
        }
        for (double d : new double[] {2e23, 1e23, 8.41e21, Math.nextUp(1.0), Math.nextDown(1e15), 9007199254740993.0}) {
            String text = JsonText.write(new double[] {d});
            assertSameBits(d, single(text), text);
        }
    }

    /**
     * Longs are written exactly (Long.toString) and read as the nearest double (every number reads as a Double):
     * exact up to 2^53, and above it the same double as the widening conversion (JLS 5.1.2: round to nearest).
     */
    @Test
    void longs_writtenExactly_readAsNearestDouble() {
        Random r = new Random(9_007_199_254_740_993L);
        List<Long> longs = new ArrayList<>(List.of(Long.MAX_VALUE, Long.MIN_VALUE, (1L << 53) + 1, 1L << 53, -(1L << 53), 0L, -1L));
        for (int i = 0; i < 10_000; i++) longs.add(i % 2 == 0 ? r.nextLong() : r.nextLong() >> r.nextInt(64));
        for (long l : longs) {
            String text = JsonText.write(List.of(l));
            assertEquals("[" + l + "]", text);
            double back = single(text);
            assertSameBits((double) l, back, text);
            if (Math.abs(l) <= 1L << 53) assertEquals(l, (long) back, text);
        }
    }

    @Test
    void nonFiniteAndAbsent_areNull() {
        assertEquals("[null,null,null,null,null,null]", JsonText.write(Arrays.asList(Double.NaN, Double.POSITIVE_INFINITY,
                Double.NEGATIVE_INFINITY, Optional.empty(), OptionalDouble.empty(), OptionalInt.empty())));
        assertEquals("[1.0,null,2.0]", JsonText.write(new double[] {1, Double.NaN, 2}));
    }

    @Test
    void keysKeepInsertionOrder_andStringsEscapeAsBefore() {
        Map<String, Object> m = JsonText.obj("z", 1, "a", "q\"\\\n\r\t\u0001\b\f\u001bé/\u2028", "m", true);
        String text = JsonText.write(m);
        // RFC 8259 §7: '"', '\' and U+0000..U+001F must be escaped; lower-case hex and no \b, \f as the earlier writer
        assertEquals("{\"z\":1,\"a\":\"q\\\"\\\\\\n\\r\\t\\u0001\\u0008\\u000c\\u001bé/\u2028\",\"m\":true}", text);
        assertEquals(List.of("z", "a", "m"), List.copyOf(((Map<?, ?>) JsonText.parse(text)).keySet()));
        assertEquals("q\"\\\n\r\t\u0001\b\f\u001bé/\u2028", ((Map<?, ?>) JsonText.parse(text)).get("a"));
        // the short escapes of RFC 8259 §7 still read
        assertEquals("\b\f/", JsonText.parse("\"\\b\\f\\/\""));
    }

    @Test
    void pretty_indentsContainers_andKeepsNumberArraysOnOneLine() {
        Map<String, Object> m = JsonText.obj("a", 1.5, "b", new double[] {1.0, 2.5}, "c", List.of(JsonText.obj("x", "y")),
                "d", List.of(), "e", JsonText.obj(), "f", new int[] {1, 2}, "g", List.of(new double[] {3}, new double[0]));
        assertEquals("""
                {
                  "a": 1.5,
                  "b": [1.0, 2.5],
                  "c": [
                    {
                      "x": "y"
                    }
                  ],
                  "d": [],
                  "e": {},
                  "f": [1,2],
                  "g": [
                    [3.0],
                    []
                  ]
                }""", JsonText.pretty(m));
        assertEquals(JsonText.parse(JsonText.write(m)), JsonText.parse(JsonText.pretty(m)));
    }

    @Test
    void enums_areLowerCaseWithDashes() {
        assertEquals("\"near-optimal\"", JsonText.write(Sample.NEAR_OPTIMAL));
    }

    enum Sample { NEAR_OPTIMAL, LOW, HIGH_SIDE }

    @Test
    void unwritableValue_isRejectedByType() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> JsonText.write(List.of(new Object())));
        assertEquals("cannot write java.lang.Object as JSON", e.getMessage());
    }

    @Test
    void roundTrip_preservesStructureAndValues() {
        Map<String, Object> m = JsonText.obj("a", 1.5, "s", "q\"uote\n", "l", List.of(1.0, 2.0), "n", null, "b", true,
                "arr", new double[] {0.1, 1e-300, Double.NaN});
        Object back = JsonText.parse(JsonText.write(m));
        assertEquals(JsonText.parse(JsonText.pretty(m)), back);
        @SuppressWarnings("unchecked") Map<String, Object> r = (Map<String, Object>) back;
        assertEquals(1.5, r.get("a"));
        assertEquals("q\"uote\n", r.get("s"));
        assertEquals(Arrays.asList(0.1, 1e-300, null), r.get("arr"));
        assertTrue(r.containsKey("n"));
        assertEquals(LinkedHashMap.class, r.getClass());
        assertEquals(ArrayList.class, r.get("l").getClass());
    }

    @Test
    void malformedText_namesTheCharacter() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> JsonText.parse("{\"a\": 1,}"));
        assertTrue(e.getMessage().startsWith("JSON at character 8: "), e.getMessage());
        IllegalArgumentException trailing = assertThrows(IllegalArgumentException.class, () -> JsonText.parse("[1] 2"));
        assertEquals("JSON at character 4: unexpected text after the value", trailing.getMessage());
        IllegalArgumentException empty = assertThrows(IllegalArgumentException.class, () -> JsonText.parse("  "));
        assertEquals("JSON at character 2: unexpected end", empty.getMessage());
        // RFC 8259 §6 grammar: no leading zeros, no '+', a digit after '.'; §4: no trailing comma; no NaN
        for (String bad : List.of("[01]", "[+1]", "[1.]", "[1,]", "[NaN]", "{\"a\" 1}", "[\"open", "{\"a\":1", "tru"))
            assertThrows(IllegalArgumentException.class, () -> JsonText.parse(bad), bad);
    }

    /** Random trees of every writable type: the same bytes as the earlier writer, the same values as its reader. */
    @Test
    void randomTrees_sameTextAsEarlierWriter_sameValuesAsEarlierReader() {
        Random r = new Random(13L);
        for (int i = 0; i < 300; i++) {
            Object tree = tree(r, 0);
            assertEquals(EarlierJson.write(tree), JsonText.write(tree));
            assertEquals(EarlierJson.pretty(tree), JsonText.pretty(tree));
            String text = JsonText.pretty(tree);
            assertEquals(EarlierJson.parse(text), JsonText.parse(text));
        }
        Object deep = JsonText.obj("x", new double[] {1});   // deeper than the indentation written in one piece
        for (int level = 0; level < 40; level++) deep = level % 2 == 0 ? List.of(deep, level) : JsonText.obj("l" + level, deep);
        assertEquals(EarlierJson.pretty(deep), JsonText.pretty(deep));
        assertEquals(EarlierJson.parse(EarlierJson.pretty(deep)), JsonText.parse(JsonText.pretty(deep)));
        // the one intended difference: -0.0 keeps its sign
        assertEquals("[0.0]", EarlierJson.write(new double[] {-0.0}));
        assertEquals("[-0.0]", JsonText.write(new double[] {-0.0}));
    }

    private static Object tree(Random r, int depth) {
        int kind = r.nextInt(depth >= 4 ? 9 : 12);
        return switch (kind) {
            case 0 -> null;
            case 1 -> r.nextBoolean();
            case 2 -> string(r);
            case 3 -> number(r);
            case 4 -> r.nextInt();
            case 5 -> r.nextLong();
            case 6 -> Sample.values()[r.nextInt(Sample.values().length)];
            case 7 -> r.nextBoolean() ? Optional.of(string(r)) : r.nextBoolean() ? OptionalDouble.of(number(r)) : OptionalInt.empty();
            case 8 -> { double[] a = new double[r.nextInt(5)]; for (int k = 0; k < a.length; k++) a[k] = number(r); yield r.nextBoolean() ? a : r.ints(r.nextInt(4)).toArray(); }
            case 9, 10 -> {
                Map<String, Object> m = new LinkedHashMap<>();
                for (int k = r.nextInt(5); k > 0; k--) m.put(string(r), tree(r, depth + 1));
                yield m;
            }
            default -> {
                List<Object> l = new ArrayList<>();
                for (int k = r.nextInt(5); k > 0; k--) l.add(tree(r, depth + 1));
                yield l;
            }
        };
    }

    private static double number(Random r) {
        double d = switch (r.nextInt(5)) {
            case 0 -> Double.longBitsToDouble(r.nextLong());      // anything, NaN and infinities included
            case 1 -> r.nextInt(2_000_001) - 1_000_000;           // integral, written as "N.0"
            case 2 -> Math.rint(r.nextGaussian() * 1e16);         // integral around the 1e15 switch to Double.toString
            case 3 -> r.nextInt(100_000) / 1000.0;                // short decimals
            default -> r.nextGaussian() * Math.pow(10, r.nextInt(60) - 30);
        };
        return d == 0 ? 0.0 : d;   // -0.0 is the one intended difference, asserted separately
    }

    private static String string(Random r) {
        StringBuilder sb = new StringBuilder();
        for (int k = r.nextInt(8); k > 0; k--) {
            sb.append(switch (r.nextInt(6)) {
                case 0 -> (char) r.nextInt(0x20);                  // control characters
                case 1 -> "\"\\/".charAt(r.nextInt(3));
                case 2 -> (char) (0x80 + r.nextInt(0x780));        // Latin, Greek, Cyrillic...
                case 3 -> "µΩ°±é€";
                default -> (char) ('a' + r.nextInt(26));
            });
        }
        return sb.toString();
    }
}
