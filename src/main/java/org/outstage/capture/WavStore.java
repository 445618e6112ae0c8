package org.outstage.capture;

import java.io.EOFException;
import java.io.IOException;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.channels.FileChannel;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;

/**
 * Samples of a WAV data chunk, read from the file on demand. Every {@link #open} gets its own
 * {@link FileChannel} and a bounded block buffer (about {@value #BLOCK_BYTES} bytes of whole frames), so the
 * store is thread-safe and never holds the record in the heap. A float sample that is NaN or infinite is an
 * {@link java.io.IOException} whose message is {@code "byte N: ..."} and whose cause is the {@link CaptureFormatException}
 * naming file and byte: the samples are read lazily, so this bad input shows only when they are read.
 */
final class WavStore implements SampleStore {
    static final int BLOCK_BYTES = 64 * 1024;

    private final Path file;
    private final long dataOffset;
    private final long frameCount;
    private final int blockAlign;
    private final int channelCount;
    private final WavCoding coding;

    WavStore(Path file, long dataOffset, long frameCount, int blockAlign, int channelCount, WavCoding coding) {
        this.file = file;
        this.dataOffset = dataOffset;
        this.frameCount = frameCount;
        this.blockAlign = blockAlign;
        this.channelCount = channelCount;
        this.coding = coding;
    }

    @Override
    public ChannelReader open(int channelIndex) throws IOException {
        if (channelIndex < 0 || channelIndex >= channelCount)
            throw new IllegalArgumentException("channelIndex=" + channelIndex + " must be in [0, " + (channelCount - 1) + "]");
        FileChannel ch = FileChannel.open(file, StandardOpenOption.READ);
        return new Reader(ch, channelIndex * coding.bytes);
    }

    private final class Reader implements ChannelReader {
        private final FileChannel ch;
        private final int sampleOffsetInFrame;
        private final int framesPerBlock = Math.max(1, BLOCK_BYTES / blockAlign);
        private final ByteBuffer buf = ByteBuffer.allocate(framesPerBlock * blockAlign).order(ByteOrder.LITTLE_ENDIAN);
        private long frame;

        Reader(FileChannel ch, int sampleOffsetInFrame) {
            this.ch = ch;
            this.sampleOffsetInFrame = sampleOffsetInFrame;
        }

        @Override
        public int read(double[] buffer, int offset, int length) throws IOException {
            if (length < 0 || offset < 0 || offset + length > buffer.length)
                throw new IndexOutOfBoundsException("offset=" + offset + ", length=" + length + ", buffer " + buffer.length);
            if (frame >= frameCount) return -1;
            if (length == 0) return 0;
            int n = (int) Math.min(Math.min(length, framesPerBlock), frameCount - frame);
            buf.clear().limit(n * blockAlign);
            long pos = dataOffset + frame * blockAlign;
            while (buf.hasRemaining()) {
                int k = ch.read(buf, pos);
                if (k < 0) throw new EOFException(file.getFileName() + ": byte " + pos + ": file ended while reading samples (was it changed after it was opened?)");
                pos += k;
            }
            coding.decode(buf, sampleOffsetInFrame, blockAlign, n, buffer, offset);
            for (int i = 0; coding.isFloat() && i < n; i++) {
                double v = buffer[offset + i];
                if (!Double.isFinite(v)) {   // only float codings can hold NaN or infinity
                    long at = dataOffset + (frame + i) * blockAlign + sampleOffsetInFrame;
                    String problem = "sample " + (frame + i + 1) + " of channel " + (sampleOffsetInFrame / coding.bytes + 1) + " is " + v
                            + "; a float WAV must hold finite numbers";
                    throw new java.io.IOException("byte " + at + ": " + problem, CaptureFormatException.atByte(file, at, problem));
                }
            }
            frame += n;
            return n;
        }

        @Override
        public void close() throws IOException { ch.close(); }
    }
}
