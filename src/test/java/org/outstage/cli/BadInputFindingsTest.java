package org.outstage.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.outstage.capture.WavWriter;
import org.outstage.json.JsonText;

/**
 * Findings of issue 10 item 5 (bad input), issue 11 item 9 (decimal-comma CSV) and issue 11 item 11 (messages a
 * technician can read), one test each, through {@code OutstageCommand.commandLine(out, err).execute(...)}.
 * Oracle: the product rules (DEVELOPERS.md: bad input is one line naming the file and place, exit 2).
 */
class BadInputFindingsTest {
    @TempDir Path dir;

    /** 0.5 s of a 997 Hz sine, amplitude 0.5 FS, 48 kHz float WAV (AES17 test frequency, docs/references.md §2). */
    private Path sineWav(String name) throws Exception {
        double[] y = new double[24000];
        for (int i = 0; i < y.length; i++) y[i] = 0.5 * Math.sin(2 * Math.PI * 997 * i / 48000.0);
        Path p = dir.resolve(name);
        WavWriter.write(p, 48000, WavWriter.Encoding.FLOAT_32, false, y);
        return p;
    }

    /** A 16-bit mono WAV whose data chunk holds {@code dataBytes} bytes but claims {@code claimed} (RIFF layout, docs/references.md §10). */
    private Path wavWithData(String name, int dataBytes, long claimed) throws Exception {
        ByteBuffer b = ByteBuffer.allocate(44 + dataBytes).order(ByteOrder.LITTLE_ENDIAN);
        b.put("RIFF".getBytes(StandardCharsets.US_ASCII)).putInt(36 + dataBytes).put("WAVE".getBytes(StandardCharsets.US_ASCII));
        b.put("fmt ".getBytes(StandardCharsets.US_ASCII)).putInt(16).putShort((short) 1).putShort((short) 1).putInt(48000).putInt(96000)
                .putShort((short) 2).putShort((short) 16);
        b.put("data".getBytes(StandardCharsets.US_ASCII)).putInt((int) claimed);
        for (int i = 0; i < dataBytes / 2; i++) b.putShort((short) (16000 * Math.sin(2 * Math.PI * 997 * i / 48000.0)));
        Path p = dir.resolve(name);
        Files.write(p, b.array());
        return p;
    }

    private Path text(String name, String content) throws Exception {
        Path p = dir.resolve(name);
        Files.writeString(p, content);
        return p;
    }

    private static int lines(String s) {
        return (int) s.lines().filter(l -> !l.isBlank()).count();
    }

    // ---------------------------------------------------------------- issue 10 item 5

    @Test
    void finding10_emptyCaptureExits2() throws Exception {
        Path empty = wavWithData("empty.wav", 0, 0);
        CliRun r = CliRun.of("analyze", empty.toString());
        assertEquals(2, r.exit(), r.err());
        assertEquals("outstage: " + empty + ": byte 40: data chunk is empty: the file holds no samples", r.err().strip());
        assertEquals("", r.out());
        CliRun j = CliRun.of("analyze", "--json", empty.toString());
        assertEquals(2, j.exit(), j.err());
    }

    /** A float WAV holding a NaN sample (IEEE 754 quiet NaN) is bad input naming file and byte, not a fault or NaN figures. */
    @Test
    void finding10_nanSampleInFloatWavExits2() throws Exception {
        Path wav = sineWav("nan.wav");
        byte[] b = Files.readAllBytes(wav);
        int dataStart = b.length - 24000 * 4;   // the data chunk is last: 24000 float32 samples
        ByteBuffer.wrap(b).order(ByteOrder.LITTLE_ENDIAN).putFloat(dataStart + 4 * 99, Float.NaN);
        Files.write(wav, b);
        CliRun r = CliRun.of("analyze", "--json", wav.toString());
        assertEquals(2, r.exit(), r.err());
        assertEquals("outstage: " + wav + ": byte " + (dataStart + 396) + ": sample 100 of channel 1 is NaN; a float WAV must hold finite numbers",
                r.err().strip());
    }

    @Test
    void finding10_jsonWarningAlsoOnStderrNamingFile() throws Exception {
        Path cut = wavWithData("cut.wav", 9600, 20000);   // claims more than it holds: salvaged, with a warning
        CliRun r = CliRun.of("analyze", "--json", cut.toString());
        assertEquals(0, r.exit(), r.err());
        assertTrue(r.err().contains("outstage: warning: " + cut + ": byte 40: data chunk claims 20000 bytes but the file holds 9600"), r.err());
        assertEquals(1, r.err().lines().filter(l -> l.startsWith("outstage: warning:")).count(), r.err());
        @SuppressWarnings("unchecked")
        Map<String, Object> c = (Map<String, Object>) ((List<Object>) ((Map<String, Object>) JsonText.parse(r.out())).get("captures")).get(0);
        assertEquals(List.of("byte 40: data chunk claims 20000 bytes but the file holds 9600 after its header; read 4800 whole frames"), c.get("warnings"));
    }

    @Test
    void finding10_warningDoesNotRepeatFileName() throws Exception {
        Path cut = wavWithData("x.wav", 9600, 20000);
        CliRun r = CliRun.of("analyze", cut.toString());
        assertEquals(0, r.exit(), r.err());
        String warning = r.err().lines().filter(l -> l.startsWith("outstage: warning:")).findFirst().orElseThrow();
        assertEquals("outstage: warning: " + cut + ": byte 40: data chunk claims 20000 bytes but the file holds 9600 after its header;"
                + " read 4800 whole frames", warning);
        assertFalse(warning.contains("x.wav: x.wav"), warning);
    }

    // ---------------------------------------------------------------- issue 11 item 9

    /** 1 kHz at 48 kHz written as 0,000000E+00 style cells: time and CH1, two names, four fields per row. */
    private static String decimalCommaRows(boolean header, boolean quoted) {
        StringBuilder s = new StringBuilder(header ? "time,CH1\n" : "");
        for (int i = 0; i < 4800; i++) {
            String t = String.format(java.util.Locale.GERMANY, "%.6E", i / 48000.0).replace("E", "E");
            String v = String.format(java.util.Locale.GERMANY, "%.4f", 10 * Math.sin(2 * Math.PI * 1000 * i / 48000.0));
            s.append(quoted ? "\"" + t + "\",\"" + v + "\"" : t + "," + v).append('\n');
        }
        return s.toString();
    }

    @Test
    void finding11_decimalCommaWithCommaSeparatorAndHeader_readAsTwoColumns() throws Exception {
        Path csv = text("dc.csv", decimalCommaRows(true, false));
        assertTrue(Files.readAllLines(csv).get(1).startsWith("0,000000E+00,0,0000"), Files.readAllLines(csv).get(1));
        CliRun r = CliRun.of("analyze", "--json", csv.toString());
        assertEquals(0, r.exit(), r.err());
        @SuppressWarnings("unchecked")
        List<Object> caps = (List<Object>) ((Map<String, Object>) JsonText.parse(r.out())).get("captures");
        assertEquals(1, caps.size(), "one channel (CH1), not four");
        @SuppressWarnings("unchecked")
        Map<String, Object> c = (Map<String, Object>) caps.get(0);
        // time stamps carry 7 significant digits (%.6E): the rate from (n − 1)/(last − first) is 48 kHz within about 1e-7
        assertEquals(48000.0, (Double) c.get("sample_rate_hz"), 0.01);
        @SuppressWarnings("unchecked")
        Map<String, Object> f = (Map<String, Object>) c.get("fundamental");
        assertEquals(1000.0, (Double) f.get("frequency_hz"), 1e-3);
        assertTrue(r.err().contains("decimal comma"), r.err());   // said, not silent
    }

    @Test
    void finding11_decimalCommaWithCommaSeparatorNoHeader_refusedNamingDecimalComma() throws Exception {
        Path csv = text("dc.csv", "0,000000E+00,10,0000\n2,083333E-05,11,0000\n4,166667E-05,12,0000\n");
        CliRun r = CliRun.of("analyze", csv.toString());
        assertEquals(2, r.exit(), r.err());
        assertEquals(1, lines(r.err()), r.err());
        assertTrue(r.err().startsWith("outstage: " + csv + ": line 1, column 2: '0,000000E+00' looks like one number with a decimal comma"), r.err());
    }

    @Test
    void finding11_quotedDecimalCommaCsv_readOrNamed() throws Exception {
        Path csv = text("q.csv", decimalCommaRows(true, true));
        CliRun r = CliRun.of("analyze", "--json", csv.toString());
        assertEquals(0, r.exit(), r.err());   // quoted cells are unambiguous: read with decimal commas
        @SuppressWarnings("unchecked")
        List<Object> caps = (List<Object>) ((Map<String, Object>) JsonText.parse(r.out())).get("captures");
        assertEquals(1, caps.size());
        // a quoted decimal-comma file with no readable rows says why
        Path bad = text("q2.csv", "time,CH1\n\"0,5\",\"x\"\n\"1,5\",\"y\"\n");
        CliRun b = CliRun.of("analyze", bad.toString());
        assertEquals(2, b.exit(), b.err());
        assertTrue(b.err().contains("decimal comma"), b.err());
    }

    // ---------------------------------------------------------------- issue 11 item 11

    @Test
    void finding11_fsVoltsWithUnit() throws Exception {
        Path wav = sineWav("s.wav");
        CliRun volts = CliRun.of("analyze", "--json", "--fs-volts", "40V", wav.toString());
        CliRun plain = CliRun.of("analyze", "--json", "--fs-volts", "40", wav.toString());
        CliRun milli = CliRun.of("analyze", "--json", "--fs-volts", "40000mV", wav.toString());
        assertEquals(0, volts.exit(), volts.err());
        assertEquals(plain.out(), volts.out());
        assertEquals(plain.out(), milli.out());
        CliRun bad = CliRun.of("analyze", "--fs-volts", "40x", wav.toString());
        assertEquals(2, bad.exit());
        assertTrue(bad.err().contains("'40x' is not a number of volts"), bad.err());
        assertFalse(bad.err().contains("double"), bad.err());
    }

    @Test
    void finding11_loadWithOhmUnit() throws Exception {
        Path wav = sineWav("s.wav");
        CliRun plain = CliRun.of("analyze", "--json", "--fs-volts", "40", "--load", "8", wav.toString());
        for (String load : List.of("8ohm", "8 ohms", "8Ω", "8R")) {
            CliRun r = CliRun.of("analyze", "--json", "--fs-volts", "40", "--load", load, wav.toString());
            assertEquals(0, r.exit(), load + ": " + r.err());
            assertEquals(plain.out(), r.out(), load);
        }
        CliRun bad = CliRun.of("analyze", "--load", "8 apples", wav.toString());
        assertEquals(2, bad.exit());
        assertTrue(bad.err().contains("'8 apples' is not a number of ohms"), bad.err());
    }

    @Test
    void finding11_frequencyWithUnitAndDecimalComma() throws Exception {
        Path wav = sineWav("s.wav");
        CliRun plain = CliRun.of("analyze", "--json", "--fundamental", "997", wav.toString());
        CliRun khz = CliRun.of("analyze", "--json", "--fundamental", "0.997kHz", wav.toString());
        assertEquals(0, khz.exit(), khz.err());
        assertEquals(plain.out(), khz.out());
        CliRun comma = CliRun.of("analyze", "--fundamental", "0,997kHz", wav.toString());
        assertEquals(2, comma.exit());
        assertTrue(comma.err().contains("decimal comma"), comma.err());
    }

    /** Options in millivolts keep plain numbers as millivolts and convert a unit: 26 = 26mV = 0.026V (SI prefixes). */
    @Test
    void finding11_milliUnitsKeepPlainNumbers() {
        assertEquals(26.0, new Units.MilliVolts().convert("26"), 0);
        assertEquals(26.0, new Units.MilliVolts().convert("26mV"), 1e-12);
        assertEquals(26.0, new Units.MilliVolts().convert("0.026 V"), 1e-12);
        assertEquals(120.0, new Units.MilliAmps().convert("0.12A"), 1e-12);
        assertEquals(4700.0, new Units.Ohms().convert("4.7k"), 1e-9);
        assertEquals(4700.0, new Units.Ohms().convert("4.7kohm"), 1e-9);
        assertEquals(48000.0, new Units.Hertz().convert("48 kHz"), 0);
        assertEquals(0.5, new Units.Watts().convert("500mW"), 1e-12);
    }

    @Test
    void finding11_sessionIdNotANumber() {
        CliRun r = CliRun.of("session", "show", "abc", "--logbook", dir.resolve("l.db").toString());
        assertEquals(2, r.exit());
        assertTrue(r.err().contains("'abc' is not a session id (a number"), r.err());
        assertFalse(r.err().contains("long"), r.err());
    }

    @Test
    void finding11_residualOnSeveralFilesSaysFiles() throws Exception {
        List<String> args = new java.util.ArrayList<>(List.of("analyze", "--residual", dir.resolve("r.csv").toString()));
        for (int i = 0; i < 7; i++) args.add(sineWav("s" + i + ".wav").toString());
        CliRun r = CliRun.of(args.toArray(new String[0]));
        assertEquals(2, r.exit());
        assertTrue(r.err().contains("7 files were analysed; give one file"), r.err());
        assertFalse(Files.exists(dir.resolve("r.csv")));
    }

    @Test
    void finding11_specDecimalComma() throws Exception {
        Path spec = text("c.spec", "name X\nthd <= 0,05 % at 1 kHz\n");
        CliRun r = CliRun.of("verify", "--spec", spec.toString(), "--no-log", sineWav("s.wav").toString());
        assertEquals(2, r.exit(), r.err());
        assertEquals("outstage: " + spec + ", line 2: '0,05' has a decimal comma; write it with a point (0.05)", r.err().strip());
    }

    @Test
    void finding11_specDecimalCommaInCondition() throws Exception {
        Path spec = text("c2.spec", "name X\nthd <= 0.05 % at 1,5 kHz, 1 W\n");
        CliRun r = CliRun.of("verify", "--spec", spec.toString(), "--no-log", sineWav("s.wav").toString());
        assertEquals(2, r.exit(), r.err());
        assertEquals("outstage: " + spec + ", line 2: '1,5' has a decimal comma; write it with a point (1.5): commas separate the conditions",
                r.err().strip());
    }

    @Test
    void finding11_wavGivenAsSpec() throws Exception {
        Path wav = sineWav("s.wav");
        CliRun r = CliRun.of("verify", "--spec", wav.toString(), "--no-log", wav.toString());
        assertEquals(2, r.exit(), r.err());
        assertEquals(1, lines(r.err()), r.err());
        assertTrue(r.err().startsWith("outstage: " + wav + ": not a text spec file (it is a WAV capture"), r.err());
        assertFalse(r.err().contains("Input length"), r.err());
    }
}
