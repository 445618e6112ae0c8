package org.outstage.capture;

import java.io.IOException;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.channels.FileChannel;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;

/**
 * Reads WAV files (RIFF, RF64 and BW64) into a file-backed {@link Capture} in full-scale units.
 *
 * <p>Supported: PCM 8 (unsigned, 128 = zero), 16, 24 and 32 bits; IEEE float 32 and 64 bits;
 * WAVE_FORMAT_EXTENSIBLE with the PCM or IEEE-float SubFormat GUID (valid bits left-justified in the
 * container); any channel count and sample rate. Unknown chunks are skipped, with the pad byte after
 * odd-sized chunks; {@code fmt } may follow other chunks but must precede {@code data}. RF64 and BW64
 * (EBU Tech 3306, ITU-R BS.2088): a 32-bit size of 0xFFFFFFFF means "take the size from {@code ds64}".
 * Layouts from docs/references.md §10 (RIFF, WAVEFORMATEXTENSIBLE, ds64).
 *
 * <p>Scaling: integer codes are divided by 2<sup>bits−1</sup> of the container (16-bit −32768 → −1.0,
 * +32767 → 0.99997); floats are taken as they are. The result has unit {@link SampleUnit#FULL_SCALE}: 1.0 is
 * the digital full-scale peak, so a full-scale sine has an RMS of 0.7071 (0 dBFS, AES17).
 *
 * <p>Errors: a data chunk that claims more bytes than the file holds is read to the end (whole frames) and
 * a warning goes into {@link Capture#warnings()} (place and problem, without the file name, which the capture
 * carries); a data chunk without one whole frame is an error (a capture has samples); anything else malformed is a {@link CaptureFormatException}
 * naming the file, the byte offset and the problem. Sizes from the file are never used to allocate memory.
 */
public final class WavReader {
    /** Largest {@code fmt } chunk accepted; WAVEFORMATEXTENSIBLE needs 40 bytes. */
    static final long MAX_FMT_BYTES = 1024;
    private static final long MAX_DS64_TABLE = 1024;
    private static final long UNKNOWN_32 = 0xFFFFFFFFL;
    /** Trailing 12 bytes shared by KSDATAFORMAT_SUBTYPE_PCM and _IEEE_FLOAT ({@code xxxxxxxx-0000-0010-8000-00AA00389B71}). */
    private static final byte[] GUID_SUFFIX = {0x00, 0x00, 0x10, 0x00, (byte) 0x80, 0x00, 0x00, (byte) 0xAA, 0x00, 0x38, (byte) 0x9B, 0x71};

    private WavReader() {}

    /** True if the first four bytes are {@code RIFF}, {@code RF64} or {@code BW64}. */
    public static boolean hasWavMagic(byte[] head) {
        if (head.length < 4) return false;
        String m = new String(head, 0, 4, StandardCharsets.ISO_8859_1);
        return m.equals("RIFF") || m.equals("RF64") || m.equals("BW64");
    }

    /**
     * Reads the header of {@code file} and returns a capture backed by the file (samples are read when a
     * channel is opened). Unit {@link SampleUnit#FULL_SCALE}, scale 1.
     *
     * @throws CaptureFormatException if the file cannot be opened or is not a WAV file this reader supports
     */
    public static Capture read(Path file) throws CaptureFormatException {
        try (FileChannel ch = FileChannel.open(file, StandardOpenOption.READ)) {
            return new Parser(file, ch).parse();
        } catch (IOException e) {
            throw CaptureFormatException.unreadable(file, e);
        }
    }

    private static final class Format {
        long offset;
        WavCoding coding;
        int channels;
        long sampleRate;
        int blockAlign;
    }

    private static final class Parser {
        private final Path file;
        private final FileChannel ch;
        private final long fileSize;
        private final List<String> warnings = new ArrayList<>();
        private final Map<String, Long> ds64Sizes = new HashMap<>();
        private Long ds64DataSize;
        private boolean isRf64;
        private String kind = "RIFF";

        Parser(Path file, FileChannel ch) throws IOException {
            this.file = file;
            this.ch = ch;
            this.fileSize = ch.size();
        }

        private CaptureFormatException err(long offset, String problem) {
            return CaptureFormatException.atByte(file, offset, problem);
        }

        /** Reads exactly {@code n} (small, bounded) bytes at {@code pos}, or fewer if the file ends. */
        private ByteBuffer readAt(long pos, int n) throws IOException {
            ByteBuffer b = ByteBuffer.allocate(n).order(ByteOrder.LITTLE_ENDIAN);
            while (b.hasRemaining()) {
                int k = ch.read(b, pos + b.position());
                if (k < 0) break;
            }
            b.flip();
            return b;
        }

        private static String fourcc(ByteBuffer b, int index) {
            byte[] id = new byte[4];
            for (int i = 0; i < 4; i++) id[i] = b.get(index + i);
            return printable(id);
        }

        private static String printable(byte[] id) {
            StringBuilder s = new StringBuilder();
            for (byte x : id) {
                int c = x & 0xff;
                if (c >= 0x20 && c < 0x7f) s.append((char) c);
                else s.append(String.format("\\x%02X", c));
            }
            return s.toString();
        }

        Capture parse() throws IOException, CaptureFormatException {
            ByteBuffer head = readAt(0, 12);
            if (head.remaining() >= 4) {
                byte[] first = new byte[4];
                head.get(0, first);
                if (!hasWavMagic(first))
                    throw err(0, "not a WAV file: starts with '" + printable(first) + "', expected RIFF, RF64 or BW64");
                kind = new String(first, StandardCharsets.ISO_8859_1);
            }
            if (head.remaining() < 12)
                throw err(fileSize, "file ends after " + fileSize + " bytes, inside the 12-byte RIFF header");
            String wave = fourcc(head, 8);
            if (!wave.equals("WAVE")) throw err(8, "form type is '" + wave + "', expected WAVE");
            isRf64 = !kind.equals("RIFF");

            long pos = 12;
            if (isRf64) pos = readDs64(pos);

            Format fmt = null;
            while (true) {
                if (pos + 8 > fileSize) {
                    if (fmt == null) throw err(pos, "no fmt chunk before the end of the file");
                    throw err(pos, "no data chunk before the end of the file");
                }
                ByteBuffer h = readAt(pos, 8);
                String id = fourcc(h, 0);
                long size = h.getInt(4) & 0xFFFFFFFFL;
                long body = pos + 8;
                if (isRf64 && size == UNKNOWN_32) size = sizeFromDs64(id, pos);
                switch (id) {
                    case "fmt ":
                        if (fmt != null) throw err(pos, "second fmt chunk (the first is at byte " + fmt.offset + ")");
                        fmt = readFmt(pos, size);
                        break;
                    case "data":
                        if (fmt == null) throw err(pos, "data chunk comes before any fmt chunk");
                        return capture(fmt, body, size);
                    default:
                        break;
                }
                long next = body + size + (size & 1);
                if (next < body) throw err(pos + 4, "chunk '" + id + "' size " + size + " overflows");
                pos = next;
            }
        }

        private long readDs64(long pos) throws IOException, CaptureFormatException {
            if (pos + 8 > fileSize) throw err(pos, kind + " file ends before its ds64 chunk");
            ByteBuffer h = readAt(pos, 8);
            String id = fourcc(h, 0);
            if (!id.equals("ds64")) throw err(pos, kind + " file must have a ds64 chunk first, found '" + id + "'");
            long size = h.getInt(4) & 0xFFFFFFFFL;
            if (size < 28) throw err(pos + 4, "ds64 chunk is " + size + " bytes, at least 28 needed");
            if (pos + 8 + size > fileSize) throw err(pos + 4, "ds64 chunk claims " + size + " bytes, the file has " + (fileSize - pos - 8) + " after its header");
            ByteBuffer b = readAt(pos + 8, 28);
            // riffSize64 at 0 is not needed; dataSize64 at 8; sampleCount64 at 16; table length at 24.
            ds64DataSize = b.getLong(8);
            long tableLength = b.getInt(24) & 0xFFFFFFFFL;
            if (ds64DataSize < 0) throw err(pos + 16, "ds64 data size " + Long.toUnsignedString(ds64DataSize) + " is out of range");
            if (tableLength > MAX_DS64_TABLE || 28 + tableLength * 12 > size)
                throw err(pos + 32, "ds64 table claims " + tableLength + " entries, the chunk has room for " + (size - 28) / 12);
            for (long i = 0; i < tableLength; i++) {
                ByteBuffer e = readAt(pos + 8 + 28 + 12 * i, 12);
                ds64Sizes.put(fourcc(e, 0), e.getLong(4));
            }
            return pos + 8 + size + (size & 1);
        }

        private long sizeFromDs64(String id, long chunkPos) throws CaptureFormatException {
            Long s = id.equals("data") ? ds64DataSize : ds64Sizes.get(id);
            if (s == null) throw err(chunkPos + 4, "chunk '" + id + "' has size 0xFFFFFFFF but ds64 gives no size for it");
            if (s < 0) throw err(chunkPos + 4, "ds64 size of chunk '" + id + "' is out of range");
            return s;
        }

        private Format readFmt(long pos, long size) throws IOException, CaptureFormatException {
            long body = pos + 8;
            if (size < 16) throw err(pos + 4, "fmt chunk is " + size + " bytes, at least 16 needed");
            if (size > MAX_FMT_BYTES) throw err(pos + 4, "fmt chunk claims " + size + " bytes, more than the " + MAX_FMT_BYTES + " a format description may use");
            if (body + size > fileSize) throw err(pos + 4, "fmt chunk claims " + size + " bytes, the file has " + (fileSize - body) + " after its header");
            ByteBuffer b = readAt(body, (int) size);
            int tag = b.getShort(0) & 0xffff;
            int channels = b.getShort(2) & 0xffff;
            long rate = b.getInt(4) & 0xFFFFFFFFL;
            int blockAlign = b.getShort(12) & 0xffff;
            int bits = b.getShort(14) & 0xffff;
            Format f = new Format();
            f.offset = pos;
            if (channels == 0) throw err(body + 2, "fmt chunk declares 0 channels");
            if (rate == 0) throw err(body + 4, "fmt chunk declares a sample rate of 0 Hz");
            WavCoding coding;
            switch (tag) {
                case 0x0001:
                    coding = WavCoding.pcm(bits);
                    if (coding == null) throw err(body + 14, "PCM with " + bits + " bits per sample is not supported (8, 16, 24 or 32 expected; other depths need WAVE_FORMAT_EXTENSIBLE)");
                    break;
                case 0x0003:
                    coding = WavCoding.floating(bits);
                    if (coding == null) throw err(body + 14, "IEEE float with " + bits + " bits per sample is not supported (32 or 64 expected)");
                    break;
                case 0xFFFE:
                    coding = readExtensible(b, body, size, bits);
                    break;
                default:
                    throw err(body, String.format("format tag 0x%04X is not supported (PCM 0x0001, IEEE float 0x0003 or extensible 0xFFFE expected)", tag));
            }
            long expected = (long) channels * coding.bytes;
            if (blockAlign != expected)
                throw err(body + 12, "block align is " + blockAlign + ", expected " + expected + " for " + channels + " channel(s) of " + coding.bits() + " bits");
            f.coding = coding;
            f.channels = channels;
            f.sampleRate = rate;
            f.blockAlign = blockAlign;
            return f;
        }

        private WavCoding readExtensible(ByteBuffer b, long body, long size, int bits) throws CaptureFormatException {
            if (size < 40) throw err(body - 4, "WAVE_FORMAT_EXTENSIBLE fmt chunk is " + size + " bytes, at least 40 needed");
            int cbSize = b.getShort(16) & 0xffff;
            if (cbSize < 22) throw err(body + 16, "WAVE_FORMAT_EXTENSIBLE extension size is " + cbSize + ", at least 22 needed");
            int validBits = b.getShort(18) & 0xffff;
            for (int i = 0; i < GUID_SUFFIX.length; i++) {
                if (b.get(28 + i) != GUID_SUFFIX[i])
                    throw err(body + 24, "SubFormat GUID is not PCM or IEEE float");
            }
            long sub = b.getInt(24) & 0xFFFFFFFFL;
            WavCoding coding;
            if (sub == 1) {
                coding = WavCoding.pcm(bits);
                if (coding == null) throw err(body + 14, "extensible PCM container of " + bits + " bits is not supported (8, 16, 24 or 32 expected)");
            } else if (sub == 3) {
                coding = WavCoding.floating(bits);
                if (coding == null) throw err(body + 14, "extensible IEEE float of " + bits + " bits is not supported (32 or 64 expected)");
            } else {
                throw err(body + 24, String.format("SubFormat 0x%04X is not supported (PCM 0x0001 or IEEE float 0x0003 expected)", sub));
            }
            if (validBits > bits) throw err(body + 18, "valid bits " + validBits + " exceed the container of " + bits + " bits");
            return coding;
        }

        private Capture capture(Format f, long dataOffset, long claimed) throws CaptureFormatException {
            long available = Math.max(0, fileSize - dataOffset);
            long bytes = claimed;
            if (claimed > available) {
                bytes = available - available % f.blockAlign;
                warnings.add("byte " + (dataOffset - 4) + ": data chunk claims " + claimed
                        + " bytes but the file holds " + available + " after its header; read " + bytes / f.blockAlign + " whole frames");
            } else if (claimed % f.blockAlign != 0) {
                bytes = claimed - claimed % f.blockAlign;
                warnings.add("byte " + (dataOffset - 4) + ": data chunk size " + claimed
                        + " is not a whole number of " + f.blockAlign + "-byte frames; the last partial frame is ignored");
            }
            long frames = bytes / f.blockAlign;
            if (frames == 0)
                throw err(dataOffset - 4, claimed == 0 ? "data chunk is empty: the file holds no samples"
                        : "data chunk holds no whole " + f.blockAlign + "-byte frame (" + Math.min(claimed, available) + " bytes): the file holds no samples");
            WavStore store = new WavStore(file, dataOffset, frames, f.blockAlign, f.channels, f.coding);
            return new Capture(String.valueOf(file.getFileName()), f.sampleRate, f.channels, frames,
                    SampleUnit.FULL_SCALE, 1.0, warnings, store,
                    f.coding.isFloat() ? java.util.OptionalInt.empty() : java.util.OptionalInt.of(f.coding.bits()));
        }
    }
}
