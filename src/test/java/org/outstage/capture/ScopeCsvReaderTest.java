package org.outstage.capture;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import java.io.IOException;
import java.io.RandomAccessFile;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Locale;
import java.util.Random;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Scope CSV layouts of docs/references.md §9, each as a synthetic fixture generated here. Content: 1 V peak 1 kHz sine
 * plus a 3rd harmonic of 10 mV peak (1 %), sampled at 1 MHz for exactly two cycles (2000 points). Oracles: the
 * values as printed (parsed back with {@link Double#parseDouble}) and a single-bin DFT, which for a whole number of
 * cycles returns the peak amplitude of each harmonic exactly (Fourier series orthogonality; docs/references.md §9 suggests
 * this content so that parser and THD tests share one oracle).
 */
class ScopeCsvReaderTest {
    @TempDir Path dir;

    static final int N = 2000;
    static final double DT = 1e-6;
    static final double F0 = 1000;

    static double signal(int i) {
        double t = i * DT;
        return Math.sin(2 * Math.PI * F0 * t) + 0.01 * Math.sin(2 * Math.PI * 3 * F0 * t);
    }

    static String e(double x) { return String.format(Locale.ROOT, "%.9e", x); }

    /** Peak amplitude of the component at {@code f} over a whole number of cycles (single-bin DFT). */
    static double amplitude(double[] x, double fs, double f) {
        double re = 0, im = 0;
        for (int i = 0; i < x.length; i++) {
            double a = 2 * Math.PI * f * i / fs;
            re += x[i] * Math.cos(a);
            im += x[i] * Math.sin(a);
        }
        return 2 * Math.hypot(re, im) / x.length;
    }

    private Path file(String name, String text) throws IOException {
        Path p = dir.resolve(name);
        Files.write(p, text.getBytes(StandardCharsets.UTF_8));
        return p;
    }

    private Capture read(Path p) throws CaptureFormatException { return ScopeCsvReader.read(p, CaptureOptions.none()); }

    private String error(Path p, CaptureOptions o) {
        return assertThrows(CaptureFormatException.class, () -> ScopeCsvReader.read(p, o)).getMessage();
    }

    private static void assertSineContent(Capture c, int channel, double scale) {
        double[] x = c.readChannel(channel);
        assertEquals(N, x.length);
        // printed with 10 significant digits: values agree to 1e-9 relative; DFT amplitudes to well under 1e-8
        for (int i = 0; i < N; i += 97) assertEquals(scale * signal(i), x[i], 1e-9 * Math.abs(scale));
        assertEquals(Math.abs(scale), amplitude(x, c.sampleRateHz(), F0), 1e-8 * Math.abs(scale));
        assertEquals(Math.abs(scale) * 0.01, amplitude(x, c.sampleRateHz(), 3 * F0), 1e-8 * Math.abs(scale));
        assertEquals(0.0, amplitude(x, c.sampleRateHz(), 2 * F0), 1e-8 * Math.abs(scale));
    }

    // ------------------------------------------------------------------ layouts

    @Test
    void plainTable_timeCh1Ch2_readsRateAndBothChannels() throws Exception {
        StringBuilder s = new StringBuilder("time,CH1,CH2\n");
        for (int i = 0; i < N; i++) s.append(e(i * DT)).append(',').append(e(signal(i))).append(',').append(e(-0.5 * signal(i))).append('\n');
        Capture c = read(file("plain.csv", s.toString()));
        assertEquals(1e6, c.sampleRateHz(), 1e-6);
        assertEquals(2, c.channelCount());
        assertEquals(SampleUnit.VOLTS, c.unit());
        assertEquals(List.of(), c.warnings());
        assertSineContent(c, 0, 1.0);
        assertSineContent(c, 1, -0.5);
        assertEquals(Double.parseDouble(e(signal(5))), c.readChannel(0)[5], 0.0);
    }

    @Test
    void keyValuePreamble_sampleIntervalAndNoTimeColumn() throws Exception {
        StringBuilder s = new StringBuilder();
        s.append("Model,Invented bench scope\nFirmware Version,1.0\nRecord Length,").append(N).append('\n');
        s.append("Sample Interval,1.000000E-06\nTrigger Point,0\nSource,CH1\nVertical Units,V\nVertical Scale,0.2\n");
        s.append("Vertical Offset,0\nHorizontal Units,S\nHorizontal Scale,0.0002\nPt Fmt,Y\nYzero,0\nProbe Atten,10\n");
        for (int i = 0; i < N; i++) s.append(e(signal(i))).append('\n');
        Capture c = read(file("kv.csv", s.toString()));
        assertEquals(1e6, c.sampleRateHz(), 1e-6);
        assertEquals(1, c.channelCount());
        assertEquals(List.of(), c.warnings());
        assertSineContent(c, 0, 1.0); // probe attenuation is recognised but not applied (exports include it)
    }

    @Test
    void keyValuePreamble_thenSecondValueHeader() throws Exception {
        StringBuilder s = new StringBuilder("Record Length,").append(N).append("\nSample Interval,1e-06\nSecond,Value\n");
        for (int i = 0; i < N; i++) s.append(e(i * DT - 1e-3)).append(',').append(e(signal(i))).append('\n');
        Capture c = read(file("kv2.csv", s.toString()));
        assertEquals(1e6, c.sampleRateHz(), 1e-6);
        assertEquals(1, c.channelCount());
        assertSineContent(c, 0, 1.0);
    }

    @Test
    void keyValuePairsBesideTheData_timeAndValueInColumnsFourAndFive() throws Exception {
        String[] meta = {"Record Length,2000,Points", "Sample Interval,1.00E-06,s", "Trigger Point,1000,Samples", "Source,CH1,",
                "Vertical Units,V,", "Vertical Scale,0.5,", "Horizontal Units,s,", "Probe Atten,1,"};
        StringBuilder s = new StringBuilder();
        for (int i = 0; i < N; i++) {
            s.append(i < meta.length ? meta[i] : ",,").append(',').append(e(i * DT - 1e-3)).append(',').append(e(signal(i))).append(",\n");
        }
        Capture c = read(file("beside.csv", s.toString()));
        assertEquals(1, c.channelCount());
        assertEquals(1e6, c.sampleRateHz(), 1e-6);
        assertEquals(List.of(), c.warnings());
        assertSineContent(c, 0, 1.0);
    }

    @Test
    void keyValuePairsBesideTheData_badCellNamesItsRealColumn() throws Exception {
        String text = "Record Length,3,Points,0,1\nSample Interval,1e-6,s,1e-6,oops\n,,,2e-6,3\n";
        assertEquals("beside2.csv: line 2, column 5: 'oops' is not a number", error(file("beside2.csv", text), CaptureOptions.none()));
    }

    @Test
    void recordLengthDisagreeing_warns() throws Exception {
        StringBuilder s = new StringBuilder("Record Length,2500\nSample Interval,1e-06\n");
        for (int i = 0; i < N; i++) s.append(e(signal(i))).append('\n');
        Capture c = read(file("kv3.csv", s.toString()));
        assertEquals(List.of("line 1: record length says 2500 points, the file has 2000 data rows"), c.warnings());
    }

    @Test
    void startIncrementTwoLineHeader_indexColumnAndTrailingComma() throws Exception {
        StringBuilder s = new StringBuilder("X,CH1,CH2,Start,Increment,\nSequence,Volt,Volt,-1.000000e-03,1.000000e-06,\n");
        for (int i = 0; i < N; i++) s.append(i).append(',').append(e(signal(i))).append(',').append(e(2 * signal(i))).append(",\n");
        Capture c = read(file("si.csv", s.toString()));
        assertEquals(1e6, c.sampleRateHz(), 1e-6);
        assertEquals(2, c.channelCount());
        assertSineContent(c, 0, 1.0);
        assertSineContent(c, 1, 2.0);
    }

    @Test
    void semicolonDecimalCommaBomCrlf() throws Exception {
        StringBuilder s = new StringBuilder("\uFEFFTime;CH1;CH2\r\n");
        for (int i = 0; i < N; i++)
            s.append(e(i * DT).replace('.', ',')).append(';').append(e(signal(i)).replace('.', ',')).append(';')
                    .append(e(0.1 * signal(i)).replace('.', ',')).append("\r\n");
        Capture c = read(file("de.csv", s.toString()));
        assertEquals(1e6, c.sampleRateHz(), 1e-6);
        assertSineContent(c, 0, 1.0);
        assertSineContent(c, 1, 0.1);
    }

    @Test
    void decimalCommaWithThousandsDots() throws Exception {
        Capture c = read(file("thousands.csv", "time;CH1 (mV)\n0,000000;1.234,5\n0,000001;-2,25\n0,000002;0,5\n"));
        assertEquals(1e6, c.sampleRateHz(), 1e-3);
        assertArrayEquals(new double[] {1.2345, -0.00225, 0.0005}, c.readChannel(0), 1e-15);
    }

    @Test
    void latin1MicroSignInHeader_readAsMicroseconds() throws Exception {
        Path p = dir.resolve("latin1.csv");
        Files.write(p, "Time (\u00B5s),CH1\n0,0.5\n1,-0.5\n2,0.25\n".getBytes(StandardCharsets.ISO_8859_1));
        Capture c = read(p);
        assertEquals(1e6, c.sampleRateHz(), 1e-3);
        assertArrayEquals(new double[] {0.5, -0.5, 0.25}, c.readChannel(0));
    }

    @Test
    void tabDelimited_withIndexColumn() throws Exception {
        StringBuilder s = new StringBuilder("nr\ttime\tCH1\n");
        for (int i = 0; i < N; i++) s.append(i + 1).append('\t').append(e(i * DT)).append('\t').append(e(signal(i))).append('\n');
        Capture c = read(file("tab.txt", s.toString()));
        assertEquals(1, c.channelCount());
        assertEquals(1e6, c.sampleRateHz(), 1e-6);
        assertSineContent(c, 0, 1.0);
    }

    @Test
    void unitsRow_msAndMv_scaledToSecondsAndVolts() throws Exception {
        StringBuilder s = new StringBuilder("Time,CH1\nms,mV\n");
        for (int i = 0; i < N; i++) s.append(e(i * DT * 1e3)).append(',').append(e(signal(i) * 1e3)).append('\n');
        Capture c = read(file("units.csv", s.toString()));
        assertEquals(1e6, c.sampleRateHz(), 1e-3);
        assertSineContent(c, 0, 1.0);
    }

    @Test
    void unitsInHeaderNames_usAndMv_scaled() throws Exception {
        StringBuilder s = new StringBuilder("Time (us),CH1 [mV]\n");
        for (int i = 0; i < N; i++) s.append(e(i * 1.0)).append(',').append(e(signal(i) * 1e3)).append('\n');
        Capture c = read(file("units2.csv", s.toString()));
        assertEquals(1e6, c.sampleRateHz(), 1e-3);
        assertSineContent(c, 0, 1.0);
    }

    @Test
    void rawCodesWithScalingPreamble_convertedToVolts() throws Exception {
        // v = (code − y_ref)·y_inc + y_org, t from x_increment (docs/references.md §9, layout 5)
        double yInc = 0.01, yRef = 128, yOrg = 0.05;
        StringBuilder s = new StringBuilder("x_increment,1e-6\nx_origin,0\nx_reference,0\ny_increment,0.01\ny_origin,0.05\ny_reference,128\n");
        int[] codes = new int[N];
        for (int i = 0; i < N; i++) {
            codes[i] = (int) Math.round(signal(i) / yInc + yRef);
            s.append(codes[i]).append('\n');
        }
        Capture c = read(file("codes.csv", s.toString()));
        assertEquals(1e6, c.sampleRateHz(), 1e-6);
        double[] x = c.readChannel(0);
        for (int i = 0; i < N; i++) assertEquals((codes[i] - yRef) * yInc + yOrg, x[i], 1e-12);
    }

    @Test
    void headerlessTwoColumns_risingFirstColumnIsTime() throws Exception {
        StringBuilder s = new StringBuilder();
        for (int i = 0; i < N; i++) s.append(e(i * DT)).append(',').append(e(signal(i))).append('\n');
        Capture c = read(file("bare.csv", s.toString()));
        assertEquals(1, c.channelCount());
        assertEquals(1e6, c.sampleRateHz(), 1e-6);
        assertSineContent(c, 0, 1.0);
    }

    @Test
    void roundingJitterInTimeStamps_accepted() throws Exception {
        Random r = new Random(2026);
        StringBuilder s = new StringBuilder("time,CH1\n");
        for (int i = 0; i < N; i++) {
            double jitter = (r.nextDouble() - 0.5) * 0.16 * DT; // ±8 % of the interval, as coarse printing would give
            s.append(e(i == 0 || i == N - 1 ? i * DT : i * DT + jitter)).append(',').append(e(signal(i))).append('\n');
        }
        Capture c = read(file("jitter.csv", s.toString()));
        assertEquals(1e6, c.sampleRateHz(), 1e-6); // from first and last stamp
        assertSineContent(c, 0, 1.0);
    }

    @Test
    void withoutTimeButWithGivenSampleRate_usesIt() throws Exception {
        StringBuilder s = new StringBuilder("CH1\n");
        for (int i = 0; i < N; i++) s.append(e(signal(i))).append('\n');
        Capture c = ScopeCsvReader.read(file("rate.csv", s.toString()), CaptureOptions.none().withSampleRateHz(1e6));
        assertEquals(1e6, c.sampleRateHz());
        assertSineContent(c, 0, 1.0);
    }

    @Test
    void probeFactor_multipliesValues() throws Exception {
        StringBuilder s = new StringBuilder("time,CH1\n");
        for (int i = 0; i < N; i++) s.append(e(i * DT)).append(',').append(e(signal(i))).append('\n');
        Capture c = ScopeCsvReader.read(file("probe.csv", s.toString()), CaptureOptions.none().withProbeFactor(10));
        assertEquals(10.0, c.scale());
        assertEquals(SampleUnit.VOLTS, c.unit());
        assertSineContent(c, 0, 10.0);
    }

    @Test
    void fullScaleVoltsOnCsv_ignoredWithWarning() throws Exception {
        Capture c = ScopeCsvReader.read(file("fs.csv", "time,CH1\n0,1\n1e-6,2\n"), CaptureOptions.none().withFullScaleVolts(5));
        assertEquals(List.of("the full-scale voltage applies to WAV files only; ignored for this scope CSV (already in volts)"), c.warnings());
        assertArrayEquals(new double[] {1, 2}, c.readChannel(0));
    }

    // ------------------------------------------------------------------ refusals: exact messages

    @Test
    void nonUniformSpacing_refusedNamingTheLine() throws Exception {
        StringBuilder s = new StringBuilder("time,CH1\n");
        for (int i = 0; i < 30; i++) {
            int k = i < 12 ? i : i + 1; // sample 12 missing: the row at line 14 is 2 µs after line 13
            s.append(e(k * DT)).append(',').append(e(signal(k))).append('\n');
        }
        assertEquals("gap.csv: line 14: sample interval 2.0E-6 s differs from 1.0E-6 s",
                error(file("gap.csv", s.toString()), CaptureOptions.none()));
    }

    @Test
    void oneIntervalThirtyPercentLong_refused() throws Exception {
        // pins the documented tolerance: 20 % of the median interval (common practice for printed time stamps)
        StringBuilder s = new StringBuilder("time,CH1\n");
        for (int i = 0; i < 20; i++) s.append(e(i * DT + (i >= 10 ? 0.3 * DT : 0))).append(",0.5\n");
        assertEquals("slow.csv: line 12: sample interval 1.3E-6 s differs from 1.0E-6 s",
                error(file("slow.csv", s.toString()), CaptureOptions.none()));
    }

    @Test
    void nonNumericCell_refusedNamingLineAndColumn() throws Exception {
        String text = "time,CH1,CH2\n0,1,2\n1e-6,1,2\n2e-6,1,abc\n3e-6,1,2\n";
        assertEquals("bad.csv: line 4, column 3: 'abc' is not a number", error(file("bad.csv", text), CaptureOptions.none()));
    }

    @Test
    void emptyCellInData_refusedNamingLineAndColumn() throws Exception {
        String text = "time,CH1,CH2\n0,1,2\n1e-6,,2\n";
        assertEquals("hole.csv: line 3, column 2: empty cell in the data", error(file("hole.csv", text), CaptureOptions.none()));
    }

    @Test
    void noTimeNoIntervalNoRate_refused() throws Exception {
        assertEquals("norate.csv: line 2: no time column and no sample interval in the file, and no sample rate given (give the sample rate)",
                error(file("norate.csv", "CH1\n0.1\n0.2\n0.3\n"), CaptureOptions.none()));
    }

    @Test
    void givenRateDisagreeingWithTimeColumn_refused() throws Exception {
        assertEquals("clash.csv: line 2: the file's time column gives 1000000.0 Hz (interval 1.0E-6 s), the given sample rate is 48000.0 Hz",
                error(file("clash.csv", "time,CH1\n0,1\n1e-6,2\n2e-6,3\n"), CaptureOptions.none().withSampleRateHz(48000)));
    }

    @Test
    void shortRow_refused() throws Exception {
        assertEquals("short.csv: line 4: row has 2 values, the first data row (line 2) has 3",
                error(file("short.csv", "time,CH1,CH2\n0,1,2\n1e-6,1,2\n2e-6,1\n"), CaptureOptions.none()));
    }

    @Test
    void currentUnit_refused() throws Exception {
        assertEquals("amps.csv: line 2, column 2: column 2 (CH1) is in 'A'; only volts (V, mV, µV, kV) can be read",
                error(file("amps.csv", "time,CH1\ns,A\n0,1\n1e-6,2\n"), CaptureOptions.none()));
    }

    @Test
    void noNumericRows_refused() throws Exception {
        assertEquals("words.csv: line 2: no numeric data rows found (expected rows of numbers after any header lines)",
                error(file("words.csv", "hello,world\nfoo,bar\n"), CaptureOptions.none()));
    }

    @Test
    void absurdlyLargeFile_refusedBeforeReading() throws Exception {
        Path p = dir.resolve("huge.csv");
        try (RandomAccessFile f = new RandomAccessFile(p.toFile(), "rw")) {
            f.setLength(ScopeCsvReader.MAX_FILE_BYTES + 1); // sparse: takes no disk space
        }
        assertEquals("huge.csv: file: is 268435457 bytes; scope CSV files over 268435456 bytes are refused (convert long records to WAV)",
                error(p, CaptureOptions.none()));
    }

    @Test
    void missingFile_refused() {
        Path p = dir.resolve("nothere.csv");
        assertEquals("nothere.csv: file: not found (" + p.toAbsolutePath() + ")", error(p, CaptureOptions.none()));
    }
}
