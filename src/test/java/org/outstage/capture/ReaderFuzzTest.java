package org.outstage.capture;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assertions.fail;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.OptionalDouble;
import java.util.concurrent.atomic.AtomicLong;
import net.jqwik.api.Arbitraries;
import net.jqwik.api.Arbitrary;
import net.jqwik.api.Combinators;
import net.jqwik.api.Example;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.Provide;
import net.jqwik.api.ShrinkingMode;
import net.jqwik.api.lifecycle.AfterContainer;

/**
 * Property-based fuzzing of the WAV (RIFF, RF64) and scope-CSV readers (issue 10 item 6). Valid small files are
 * mutated at random, their size fields forged, and truncated at every byte; the only exception that may leave
 * {@link CaptureReader#open} or a channel read is {@link CaptureFormatException}, with a one-line message that
 * starts with the file name and a place. Whatever opens must be a sane capture whose channels read to the end.
 *
 * <p>Oracle: the readers' own contract (DEVELOPERS.md, "Bad input"); no value is compared. Cases per property
 * come from {@code jqwik.tries.default} (pom: {@code fuzz.tries}, 2 500 in {@code mvn verify}, 250 000 with
 * {@code -Pfuzz} in a 64 MB heap). Every property has a fixed seed, so a run is repeatable.
 */
class ReaderFuzzTest {
    private static final Path DIR;
    private static final AtomicLong CASES = new AtomicLong();

    static {
        try {
            DIR = Files.createTempDirectory("outstage-fuzz");
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    @AfterContainer
    static void cleanUp() throws IOException {
        try (var s = Files.list(DIR)) {
            for (Path p : (Iterable<Path>) s::iterator) Files.deleteIfExists(p);
        }
        Files.deleteIfExists(DIR);
        System.out.println("ReaderFuzzTest: " + CASES.get() + " files read");
    }

    // ------------------------------------------------------------------ valid seed files

    private static final byte[] FMT_PCM16_STEREO = WavBytes.fmt(1, 2, 8000, 4, 16);

    static byte[][] wavSeeds() {
        long[][] codes = {{0, 1000, -1000, 32767, -32768, 5, 6, 7, 8, 9}, {1, 2, 3, 4, 5, 6, 7, 8, 9, 10}};
        byte[] pcm16 = WavBytes.pcm(2, codes);
        byte[] pcm8 = WavBytes.pcm(1, new long[][] {{0, 127, -128, 1, 2, 3, 4}});
        byte[] pcm24 = WavBytes.pcm(3, new long[][] {{0, 8388607, -8388608, 4, 5}});
        byte[] f32 = WavBytes.floats(new float[] {0f, 0.5f, -0.5f, 1f, -1f});
        byte[] f64 = WavBytes.doubles(new double[] {0, 0.25, -0.25});
        byte[] ext = WavBytes.pcm(4, new long[][] {{0, 1L << 20, -(1L << 20)}, {7, 8, 9}});
        byte[] ds64 = WavBytes.buf(40).putLong(0).putLong(pcm16.length).putLong(10).putInt(1)
                .put("JUNK".getBytes(StandardCharsets.ISO_8859_1)).putLong(6).array();
        return new byte[][] {
            WavBytes.riff().chunk("LIST", new byte[] {1, 2, 3}).chunk("fmt ", FMT_PCM16_STEREO).chunk("data", pcm16).bytes(),
            WavBytes.riff().chunk("fmt ", WavBytes.fmt(1, 1, 44100, 1, 8)).chunk("data", pcm8).bytes(),
            WavBytes.riff().chunk("fmt ", WavBytes.fmt(1, 1, 96000, 3, 24)).chunk("data", pcm24).bytes(),
            WavBytes.riff().chunk("fmt ", WavBytes.fmt(3, 1, 48000, 4, 32)).chunk("fact", WavBytes.le32(5)).chunk("data", f32).bytes(),
            WavBytes.riff().chunk("fmt ", WavBytes.fmt(3, 1, 48000, 8, 64)).chunk("data", f64).bytes(),
            WavBytes.riff().chunk("fmt ", WavBytes.fmtExtensible(2, 48000, 32, 24, 1)).chunk("data", ext).bytes(),
            WavBytes.riff().magic("RF64").riffSize(0xFFFFFFFFL).chunk("ds64", ds64).chunk("JUNK", 0xFFFFFFFFL, new byte[6], true)
                    .chunk("fmt ", FMT_PCM16_STEREO).chunk("data", 0xFFFFFFFFL, pcm16, true).bytes(),
            WavBytes.riff().magic("BW64").riffSize(0xFFFFFFFFL).chunk("ds64", WavBytes.buf(28).putLong(0).putLong(pcm16.length).putLong(10).putInt(0).array())
                    .chunk("fmt ", FMT_PCM16_STEREO).chunk("data", 0xFFFFFFFFL, pcm16, true).bytes(),
        };
    }

    /** Layouts of docs/references.md §9 (docs/references.md §9), each small. */
    static final String[] CSV_SEEDS = {
        "time,CH1,CH2\n0,0.1,0.2\n1e-5,0.2,0.3\n2e-5,0.3,0.1\n3e-5,-0.1,0.0\n4e-5,0.0,0.5\n",
        "X,CH1,Start,Increment,\nSequence,Volt,-1e-3,1e-5,\n0,0.10,\n1,0.20,\n2,0.30,\n3,0.25,\n",
        "Record Length,4\nSample Interval,1e-6\nVertical Units,mV\nSecond,Value\n0,1\n1e-6,2\n2e-6,3\n3e-6,4\n",
        "Zeit;Kanal A\ns;V\n0,000;1,25\n0,001;1,30\n0,002;-1,10\n0,003;0,05\n",
        "Record Length,3,Points,0.000,0.1\nSample Interval,1e-3,s,0.001,0.2\nTrigger Point,0,,0.002,0.3\n",
        "\uFEFFsecond,Volt\r\n0.0,1.0\r\n0.5,2.0\r\n1.0,1.5\r\n",
        "Sample Rate\t1000\nnr\tCH1 (mV)\n0\t1.5\n1\t2.5\n2\t-3.5\n",
        "y increment,0.01\ny origin,0\ny reference,128\nx increment,1e-6\n128\n130\n126\n129\n",
    };

    // ------------------------------------------------------------------ the check

    /** Opens {@code bytes} as a file named {@code name}; any throwable other than CaptureFormatException fails the case. */
    static void readAll(String name, byte[] bytes, CaptureOptions options) {
        CASES.incrementAndGet();
        Path file = DIR.resolve(name);
        try {
            Files.write(file, bytes);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
        Capture c;
        try {
            c = CaptureReader.open(file, options);
        } catch (CaptureFormatException e) {
            String m = e.getMessage();
            assertFalse(m.contains("\n") || m.contains("\r"), "message is more than one line: " + m);
            assertTrue(m.startsWith(name + ": ") && !e.location().isBlank(), "message does not name the file and a place: " + m);
            return;
        } catch (Throwable t) {
            fail("escaped " + t + " for " + describe(name, bytes), t);
            return;
        }
        try {
            assertTrue(c.channelCount() >= 1 && c.frameCount() >= 0, c.toString());
            assertTrue(c.sampleRateHz() > 0 && Double.isFinite(c.sampleRateHz()), c.toString());
            assertTrue(c.frameCount() <= bytes.length, "more frames than bytes: " + c);
            double[] buf = new double[4096];
            for (int ch = 0; ch < c.channelCount(); ch++) {
                long n = 0;
                try (ChannelReader r = c.openChannel(ch)) {
                    for (int k; (k = r.read(buf, 0, buf.length)) >= 0; ) n += k;
                } catch (IOException e) {
                    // the one sample-time refusal (a NaN or infinite float sample): it carries the format exception
                    assertTrue(e.getCause() instanceof CaptureFormatException, "sample read failed without a CaptureFormatException: " + e);
                    assertTrue(e.getCause().getMessage().startsWith(name + ": byte "), e.getCause().getMessage());
                    continue;
                }
                assertEquals(c.frameCount(), n, "channel " + (ch + 1) + " of " + c);
            }
        } catch (AssertionError e) {
            throw e;
        } catch (Throwable t) {
            fail("reading samples threw " + t + " for " + describe(name, bytes), t);
        }
    }

    private static String describe(String name, byte[] b) {
        StringBuilder s = new StringBuilder(name).append(" (").append(b.length).append(" bytes):");
        for (int i = 0; i < Math.min(b.length, 160); i++) s.append(String.format(" %02X", b[i]));
        return s.toString();
    }

    // ------------------------------------------------------------------ generators

    @Provide
    Arbitrary<CaptureOptions> options() {
        Arbitrary<OptionalDouble> fs = Arbitraries.of(OptionalDouble.empty(), OptionalDouble.of(40));
        Arbitrary<OptionalDouble> probe = Arbitraries.of(OptionalDouble.empty(), OptionalDouble.of(10));
        Arbitrary<OptionalDouble> rate = Arbitraries.of(OptionalDouble.empty(), OptionalDouble.of(8000), OptionalDouble.of(1e6), OptionalDouble.of(1e-3));
        return Combinators.combine(fs, probe, rate).as(CaptureOptions::new);
    }

    /** One edit: kind 0 = overwrite a byte, 1 = insert, 2 = delete a run, 3 = duplicate a run. */
    record Edit(int kind, int where, int value, int length) {}

    @Provide
    Arbitrary<List<Edit>> edits() {
        Arbitrary<Edit> e = Combinators.combine(Arbitraries.integers().between(0, 3), Arbitraries.integers().between(0, 1 << 16),
                Arbitraries.integers().between(0, 255), Arbitraries.integers().between(1, 12)).as(Edit::new);
        return e.list().ofMinSize(1).ofMaxSize(6);
    }

    static byte[] apply(byte[] seed, List<Edit> edits) {
        List<Byte> b = new ArrayList<>(seed.length + 16);
        for (byte x : seed) b.add(x);
        for (Edit e : edits) {
            int at = b.isEmpty() ? 0 : e.where() % (b.size() + (e.kind() == 1 ? 1 : 0));
            switch (e.kind()) {
                case 0 -> { if (!b.isEmpty()) b.set(Math.min(at, b.size() - 1), (byte) e.value()); }
                case 1 -> b.add(at, (byte) e.value());
                case 2 -> { for (int i = 0; i < e.length() && at < b.size(); i++) b.remove(at); }
                default -> { List<Byte> run = new ArrayList<>(b.subList(Math.min(at, b.size()), Math.min(at + e.length(), b.size()))); b.addAll(at, run); }
            }
        }
        byte[] out = new byte[b.size()];
        for (int i = 0; i < out.length; i++) out[i] = b.get(i);
        return out;
    }

    // ------------------------------------------------------------------ properties

    /** Random byte edits of valid RIFF, RF64 and BW64 files, read as .wav (and now and then as .csv: binary through the text reader). */
    @Property(seed = "20261204", shrinking = ShrinkingMode.BOUNDED)
    void wav_randomMutations_onlyFormatErrors(@ForAll("edits") List<Edit> edits, @ForAll("options") CaptureOptions options,
                                              @ForAll @net.jqwik.api.constraints.IntRange(min = 0, max = 7) int seed,
                                              @ForAll @net.jqwik.api.constraints.IntRange(min = 0, max = 9) int nameKind) {
        byte[] bytes = apply(wavSeeds()[seed], edits);
        readAll(nameKind == 0 ? "fuzz.csv" : nameKind == 1 ? "fuzz.rf64" : "fuzz.wav", bytes, options);
    }

    static final long[] FORGED_32 = {0, 1, 2, 3, 7, 8, 15, 16, 27, 28, 39, 40, 41, 0x7FFFFFFFL, 0x80000000L, 0xFFFFFFFEL, 0xFFFFFFFFL};
    static final long[] FORGED_64 = {0, 1, -1, 28, Long.MAX_VALUE, Long.MIN_VALUE, 0xFFFFFFFFL, 1L << 32, (1L << 62) + 1};

    /** Offsets of the 32-bit size fields (RIFF size and every chunk's size) and of the ds64 64-bit sizes in a seed. */
    static List<int[]> sizeFields(byte[] f) {
        List<int[]> out = new ArrayList<>();  // {offset, width}
        out.add(new int[] {4, 4});
        ByteBuffer b = ByteBuffer.wrap(f).order(ByteOrder.LITTLE_ENDIAN);
        int pos = 12;
        while (pos + 8 <= f.length) {
            String id = new String(f, pos, 4, StandardCharsets.ISO_8859_1);
            long size = b.getInt(pos + 4) & 0xFFFFFFFFL;
            out.add(new int[] {pos + 4, 4});
            if (id.equals("ds64")) {
                for (int k = 0; k < 3; k++) out.add(new int[] {pos + 8 + 8 * k, 8});
                out.add(new int[] {pos + 8 + 24, 4});
                if (size >= 40) out.add(new int[] {pos + 8 + 32, 8});
            }
            if (id.equals("fmt ")) { out.add(new int[] {pos + 8 + 2, 2}); out.add(new int[] {pos + 8 + 12, 2}); out.add(new int[] {pos + 8 + 14, 2}); }
            if (size == 0xFFFFFFFFL) size = id.equals("data") ? f.length : 6;  // RF64 seeds: data runs to the end, JUNK is 6
            pos += 8 + (int) Math.min(size + (size & 1), f.length);
        }
        return out;
    }

    /** Size fields (RIFF, chunk, ds64, and fmt channel/block/bit fields) set to edge values or random ones. */
    @Property(seed = "4711", shrinking = ShrinkingMode.BOUNDED)
    void wav_forgedSizes_onlyFormatErrors(@ForAll @net.jqwik.api.constraints.IntRange(min = 0, max = 7) int seed,
                                          @ForAll @net.jqwik.api.constraints.Size(min = 1, max = 3) List<@net.jqwik.api.constraints.IntRange(min = 0, max = 1000) Integer> fields,
                                          @ForAll @net.jqwik.api.constraints.Size(min = 3, max = 3) List<Long> randomValues,
                                          @ForAll @net.jqwik.api.constraints.Size(min = 3, max = 3) List<@net.jqwik.api.constraints.IntRange(min = 0, max = 40) Integer> picks,
                                          @ForAll("options") CaptureOptions options) {
        byte[] f = wavSeeds()[seed];
        List<int[]> where = sizeFields(f);
        ByteBuffer b = ByteBuffer.wrap(f).order(ByteOrder.LITTLE_ENDIAN);
        for (int i = 0; i < fields.size(); i++) {
            int[] w = where.get(fields.get(i) % where.size());
            int pick = picks.get(i);
            long v;
            if (w[1] == 8) v = pick < FORGED_64.length ? FORGED_64[pick] : randomValues.get(i);
            else if (pick < FORGED_32.length) v = FORGED_32[pick];
            else if (pick < 25) v = f.length - w[0] - 4 + (pick - 21);   // about the rest of the file, ±
            else v = randomValues.get(i);
            if (w[1] == 8) b.putLong(w[0], v);
            else if (w[1] == 4) b.putInt(w[0], (int) v);
            else b.putShort(w[0], (short) v);
        }
        readAll(seed >= 6 ? "fuzz.rf64" : "fuzz.wav", f, options);
    }

    static final String[] CSV_TOKENS = {",", ";", "\t", "\n", "\r", "\r\n", "\"", "\"\"", "e", "E", "-", "+", ".", "0", "9", "NaN", "1e400",
        "1e-320", "4.9e-324", "-0", "ms", "mV", "kV", "µs", "Start,Increment", "Sample Interval,", "Sample Rate,", "Record Length,",
        "x increment,", "y increment,", "\uFEFF", "X", " ", "Infinity", "0x10", "#", "time", "Sequence", "Volt", "(s)", "[mV]", "1,5", "0,000000E+00",
        "\u0000", "\uFFFD", "9999999999999999999999", "1e308", "-1e308", "2e-5", "CH1"};

    /** One text edit: kind 0 = insert a token, 1 = replace a run with a token, 2 = delete a run, 3 = truncate. */
    record TextEdit(int kind, int where, int token, int length) {}

    @Provide
    Arbitrary<List<TextEdit>> textEdits() {
        Arbitrary<TextEdit> e = Combinators.combine(Arbitraries.integers().between(0, 3), Arbitraries.integers().between(0, 1 << 16),
                Arbitraries.integers().between(0, CSV_TOKENS.length - 1), Arbitraries.integers().between(1, 8)).as(TextEdit::new);
        return e.list().ofMinSize(1).ofMaxSize(6);
    }

    /** Token edits of valid scope-CSV layouts (numbers, separators, quotes, units, preamble keys, BOM, control characters). */
    @Property(seed = "1981", shrinking = ShrinkingMode.BOUNDED)
    void csv_randomMutations_onlyFormatErrors(@ForAll("textEdits") List<TextEdit> edits, @ForAll("options") CaptureOptions options,
                                              @ForAll @net.jqwik.api.constraints.IntRange(min = 0, max = 7) int seed,
                                              @ForAll boolean latin1) {
        StringBuilder s = new StringBuilder(CSV_SEEDS[seed]);
        for (TextEdit e : edits) {
            int at = e.where() % (s.length() + 1);
            String t = CSV_TOKENS[e.token()];
            switch (e.kind()) {
                case 0 -> s.insert(at, t);
                case 1 -> s.replace(at, Math.min(s.length(), at + e.length()), t);
                case 2 -> s.delete(at, Math.min(s.length(), at + e.length()));
                default -> s.setLength(at);
            }
        }
        readAll("fuzz.csv", s.toString().getBytes(latin1 ? StandardCharsets.ISO_8859_1 : StandardCharsets.UTF_8), options);
    }

    /** Every number of a valid layout replaced by extreme or malformed ones (tiny or huge intervals, rates, lengths, codes). */
    @Property(seed = "1978", shrinking = ShrinkingMode.BOUNDED)
    void csv_forgedNumbers_onlyFormatErrors(@ForAll @net.jqwik.api.constraints.IntRange(min = 0, max = 7) int seed,
                                            @ForAll @net.jqwik.api.constraints.Size(min = 1, max = 4) List<@net.jqwik.api.constraints.IntRange(min = 0, max = 200) Integer> which,
                                            @ForAll @net.jqwik.api.constraints.Size(min = 4, max = 4) List<@net.jqwik.api.constraints.IntRange(min = 0, max = 19) Integer> value,
                                            @ForAll("options") CaptureOptions options) {
        String[] forged = {"0", "-0", "1e-320", "4.9e-324", "1e-300", "1e300", "1.7976931348623157e308", "-1e-6", "1e-30", "2147483648",
            "9223372036854775807", "1e-12", "0.5", "-1", "3", "1e15", "6.02e23", "1e-7", "1E+00", "-4.9e-324"};
        String text = CSV_SEEDS[seed];
        java.util.regex.Matcher m = java.util.regex.Pattern.compile("[-+]?\\d+(?:[.,]\\d+)?(?:[eE][-+]?\\d+)?").matcher(text);
        List<int[]> spans = new ArrayList<>();
        while (m.find()) spans.add(new int[] {m.start(), m.end()});
        java.util.Map<Integer, String> repl = new java.util.TreeMap<>(java.util.Comparator.reverseOrder());
        for (int i = 0; i < which.size(); i++) repl.put(which.get(i) % spans.size(), forged[value.get(i)]);
        StringBuilder s = new StringBuilder(text);
        for (var e : repl.entrySet()) s.replace(spans.get(e.getKey())[0], spans.get(e.getKey())[1], e.getValue());
        readAll("fuzz.csv", s.toString().getBytes(StandardCharsets.UTF_8), options);
    }

    // ------------------------------------------------------------------ truncation at every byte

    /** Every prefix of every WAV, RF64 and BW64 seed, read as .wav. */
    @Example
    void wav_truncatedAtEveryByte_onlyFormatErrors() {
        for (byte[] f : wavSeeds())
            for (int n = 0; n <= f.length; n++) readAll("cut.wav", java.util.Arrays.copyOf(f, n), CaptureOptions.none());
    }

    /** Every prefix of every CSV seed (with and without a sample rate). */
    @Example
    void csv_truncatedAtEveryByte_onlyFormatErrors() {
        for (String seed : CSV_SEEDS) {
            byte[] f = seed.getBytes(StandardCharsets.UTF_8);
            for (int n = 0; n <= f.length; n++) {
                readAll("cut.csv", java.util.Arrays.copyOf(f, n), CaptureOptions.none());
                readAll("cut.csv", java.util.Arrays.copyOf(f, n), CaptureOptions.none().withSampleRateHz(1000));
            }
        }
    }

    /** The seeds themselves open (the fuzzing starts from valid files, or it tests little). */
    @Example
    void seeds_areValid() throws CaptureFormatException, IOException {
        int i = 0;
        for (byte[] f : wavSeeds()) {
            Path p = DIR.resolve("seed" + i++ + ".wav");
            Files.write(p, f);
            assertTrue(CaptureReader.open(p, CaptureOptions.none()).frameCount() > 0, p.toString());
        }
        for (String s : CSV_SEEDS) {
            Path p = DIR.resolve("seed" + i++ + ".csv");
            Files.writeString(p, s);
            assertTrue(CaptureReader.open(p, CaptureOptions.none()).frameCount() > 0, s);
        }
    }
}
