package org.outstage.json;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;

class JsonTest {
    @Test
    void roundTrip_preservesStructureAndValues() {
        Map<String, Object> m = Json.obj("a", 1.5, "s", "q\"uote\n", "l", List.of(1.0, 2.0), "n", null, "b", true,
                "arr", new double[] {0.1, 1e-300, Double.NaN});
        Object back = Json.parse(Json.write(m));
        assertEquals(Json.parse(Json.pretty(m)), back);
        @SuppressWarnings("unchecked") Map<String, Object> r = (Map<String, Object>) back;
        assertEquals(1.5, r.get("a"));
        assertEquals("q\"uote\n", r.get("s"));
        assertEquals(java.util.Arrays.asList(0.1, 1e-300, null), r.get("arr"));
        assertTrue(r.containsKey("n"));
    }

    @Test
    void malformed_namesOffset() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> Json.parse("{\"a\": 1,}"));
        assertEquals("JSON at character 8: expected a key", e.getMessage());
    }
}
