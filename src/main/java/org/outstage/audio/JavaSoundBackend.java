package org.outstage.audio;

import java.io.IOException;
import java.util.ArrayList;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Locale;
import java.util.Optional;
import java.util.Set;
import javax.sound.sampled.AudioFormat;
import javax.sound.sampled.AudioSystem;
import javax.sound.sampled.DataLine;
import javax.sound.sampled.LineUnavailableException;
import javax.sound.sampled.Mixer;
import javax.sound.sampled.SourceDataLine;
import javax.sound.sampled.TargetDataLine;
import org.outstage.stimulus.Dither;

/**
 * {@link AudioBackend} on {@code javax.sound.sampled}. A device is a {@link Mixer} that offers a
 * {@link TargetDataLine} (input) or {@link SourceDataLine} (output); "what it accepts" is found by opening a line
 * at each standard rate and encoding and closing it again, because the backends answer
 * {@code isLineSupported} with yes for formats they then refuse or silently convert. With no device named, the
 * system default is used ({@link AudioSystem#getTargetDataLine}); with PulseAudio that default follows
 * {@code PULSE_SOURCE}/{@code PULSE_SINK}. Line buffers: 500 ms in, 200 ms out.
 */
public final class JavaSoundBackend implements AudioBackend {
    /** Input line buffer: long, so a stalled reader (a busy machine, a GC pause) loses nothing; it adds no latency. */
    static final double INPUT_BUFFER_SECONDS = 0.5;
    /** Output line buffer: the latency of a level change, and the stall the playback thread can ride out. */
    static final double OUTPUT_BUFFER_SECONDS = 0.2;
    private static final long DITHER_SEED = 0x5eed_0f_0a_0dL;

    @Override public String name() { return "Java Sound"; }

    @Override public List<DeviceInfo> inputs() { return devices(true); }

    @Override public List<DeviceInfo> outputs() { return devices(false); }

    private static List<DeviceInfo> devices(boolean input) {
        List<DeviceInfo> out = new ArrayList<>();
        Class<?> lineClass = input ? TargetDataLine.class : SourceDataLine.class;
        boolean first = true;
        for (Mixer.Info mi : AudioSystem.getMixerInfo()) {
            Mixer m;
            try {
                m = AudioSystem.getMixer(mi);
            } catch (RuntimeException e) {
                continue;
            }
            if (!m.isLineSupported(new DataLine.Info(lineClass, javaFormat(new LineFormat(48_000, SampleFormat.PCM_16, 1))))
                    && !m.isLineSupported(new DataLine.Info(lineClass, javaFormat(new LineFormat(44_100, SampleFormat.PCM_16, 2))))) continue;
            Set<Integer> rates = new LinkedHashSet<>();
            Set<SampleFormat> formats = new LinkedHashSet<>();
            int channels = 0;
            for (int rate : LineFormat.STANDARD_RATES_HZ) {
                for (SampleFormat sf : SampleFormat.values()) {
                    for (int ch = 2; ch >= 1; ch--) {
                        if (opens(m, lineClass, new LineFormat(rate, sf, ch))) {
                            rates.add(rate);
                            formats.add(sf);
                            channels = Math.max(channels, ch);
                            break;
                        }
                    }
                }
            }
            if (rates.isEmpty()) continue;
            List<SampleFormat> fl = new ArrayList<>();
            for (SampleFormat sf : SampleFormat.values()) if (formats.contains(sf)) fl.add(sf);
            out.add(new DeviceInfo(mi.getName(), mi.getDescription(), channels, new ArrayList<>(rates), fl, first && isDefaultName(mi.getName())));
            first = false;
        }
        return out;
    }

    private static boolean isDefaultName(String name) { return name.toLowerCase(Locale.ROOT).contains("default"); }

    private static boolean opens(Mixer m, Class<?> lineClass, LineFormat f) {
        AudioFormat af = javaFormat(f);
        DataLine.Info info = new DataLine.Info(lineClass, af);
        if (!m.isLineSupported(info)) return false;
        try {
            DataLine line = (DataLine) m.getLine(info);
            try {
                if (line instanceof TargetDataLine t) t.open(af);
                else ((SourceDataLine) line).open(af);
                AudioFormat got = line.getFormat();
                return got.getSampleRate() == af.getSampleRate() && got.getSampleSizeInBits() == af.getSampleSizeInBits()
                        && got.getEncoding().equals(af.getEncoding()) && got.getChannels() == af.getChannels();
            } finally {
                line.close();
            }
        } catch (LineUnavailableException | IllegalArgumentException | SecurityException e) {
            return false;
        }
    }

    static AudioFormat javaFormat(LineFormat f) {
        SampleFormat sf = f.sampleFormat();
        AudioFormat.Encoding enc = sf.isFloat() ? AudioFormat.Encoding.PCM_FLOAT : AudioFormat.Encoding.PCM_SIGNED;
        return new AudioFormat(enc, f.sampleRateHz(), sf.bits(), f.channels(), f.frameBytes(), f.sampleRateHz(), false);
    }

    private static Mixer find(Optional<String> device, Class<?> lineClass, String what) throws AudioUnavailableException {
        Mixer.Info[] infos = AudioSystem.getMixerInfo();
        List<String> names = new ArrayList<>();
        String want = device.get().toLowerCase(Locale.ROOT);
        for (Mixer.Info mi : infos) {
            Mixer m = AudioSystem.getMixer(mi);
            if (m.getSourceLineInfo().length + m.getTargetLineInfo().length == 0) continue;
            boolean offers = lineClass == TargetDataLine.class ? m.getTargetLineInfo().length > 0 && hasLine(m.getTargetLineInfo(), lineClass)
                    : hasLine(m.getSourceLineInfo(), lineClass);
            if (!offers) continue;
            names.add(mi.getName());
            if (mi.getName().toLowerCase(Locale.ROOT).contains(want)) return m;
        }
        throw new AudioUnavailableException("no " + what + " device matches \"" + device.get() + "\""
                + (names.isEmpty() ? " (Java Sound lists no " + what + " device)" : " (" + what + " devices: " + String.join(", ", names) + ")"));
    }

    private static boolean hasLine(javax.sound.sampled.Line.Info[] infos, Class<?> lineClass) {
        for (javax.sound.sampled.Line.Info li : infos) if (lineClass.isAssignableFrom(li.getLineClass())) return true;
        return false;
    }

    @Override
    public InputLine openInput(Optional<String> device, LineFormat format) throws AudioUnavailableException {
        Opened<TargetDataLine> o = openLine(TargetDataLine.class, "input", device, format, INPUT_BUFFER_SECONDS, TargetDataLine::open);
        return new JsInput(o.line(), format, o.name());
    }

    @Override
    public OutputLine openOutput(Optional<String> device, LineFormat format) throws AudioUnavailableException {
        Opened<SourceDataLine> o = openLine(SourceDataLine.class, "output", device, format, OUTPUT_BUFFER_SECONDS, SourceDataLine::open);
        return new JsOutput(o.line(), format, o.name());
    }

    /** A line opened and started, and the name of its device. */
    private record Opened<L>(L line, String name) {}

    /** {@code open(AudioFormat, int)}, which the input and output line types each declare. */
    private interface LineOpener<L> {
        void open(L line, AudioFormat format, int bufferBytes) throws LineUnavailableException;
    }

    /** Opens an input or output line on the named device (or the default), checks the format it got, starts it. */
    private static <L extends DataLine> Opened<L> openLine(Class<L> lineClass, String what, Optional<String> device, LineFormat format,
                                                           double bufferSeconds, LineOpener<L> opener) throws AudioUnavailableException {
        AudioFormat af = javaFormat(format);
        DataLine.Info info = new DataLine.Info(lineClass, af);
        L line;
        String name;
        try {
            if (device.isPresent()) {
                Mixer m = find(device, lineClass, what);
                name = m.getMixerInfo().getName();
                line = lineClass.cast(m.getLine(info));
            } else {
                if (AudioSystem.getMixerInfo().length == 0) throw new AudioUnavailableException("no " + what + " device: Java Sound lists no audio device");
                name = "default";
                line = lineClass.cast(AudioSystem.getLine(info));
            }
            int buffer = (int) Math.round(format.sampleRateHz() * bufferSeconds) * format.frameBytes();
            opener.open(line, af, buffer);
        } catch (IllegalArgumentException e) {
            throw new AudioUnavailableException(what + " device " + device.orElse("default") + " does not accept " + format + " (" + e.getMessage() + ")", e);
        } catch (LineUnavailableException e) {
            throw new AudioUnavailableException(what + " device " + device.orElse("default") + " cannot be opened at " + format + ": " + e.getMessage(), e);
        }
        checkFormat(line.getFormat(), af, what, device, format, line);
        line.start();
        return new Opened<>(line, name);
    }

    private static void checkFormat(AudioFormat got, AudioFormat want, String what, Optional<String> device, LineFormat format, DataLine line)
            throws AudioUnavailableException {
        if (got.getSampleRate() != want.getSampleRate() || got.getSampleSizeInBits() != want.getSampleSizeInBits()
                || !got.getEncoding().equals(want.getEncoding()) || got.getChannels() != want.getChannels()) {
            line.close();
            throw new AudioUnavailableException(what + " device " + device.orElse("default") + " opened as " + got + " instead of " + format);
        }
    }

    /** What an open input and an open output line share: the line, its format and its device's name. */
    private abstract static class JsLine<L extends DataLine> {
        final L line;
        final LineFormat format;
        final String name;
        byte[] bytes = new byte[0];

        JsLine(L line, LineFormat format, String name) {
            this.line = line;
            this.format = format;
            this.name = name;
        }

        public LineFormat format() { return format; }
        public String deviceName() { return name; }
        public int bufferFrames() { return line.getBufferSize() / format.frameBytes(); }
        public int available() { return line.available() / format.frameBytes(); }

        public void close() {
            line.stop();
            line.flush();
            line.close();
        }
    }

    private static final class JsInput extends JsLine<TargetDataLine> implements InputLine {
        JsInput(TargetDataLine line, LineFormat format, String name) { super(line, format, name); }

        @Override
        public int read(double[][] out, int offset, int frames) throws IOException {
            int need = frames * format.frameBytes();
            if (bytes.length < need) bytes = new byte[need];
            int got = 0;
            while (got < need) {
                if (!line.isOpen()) break;
                int k = line.read(bytes, got, need - got);
                if (k <= 0) {
                    if (!line.isOpen() || !line.isActive()) break;
                    continue;
                }
                got += k;
            }
            int whole = got / format.frameBytes();
            PcmCodec.decode(bytes, whole, format, out, offset);
            return whole;
        }
    }

    private static final class JsOutput extends JsLine<SourceDataLine> implements OutputLine {
        private final Dither dither = new Dither(DITHER_SEED);

        JsOutput(SourceDataLine line, LineFormat format, String name) { super(line, format, name); }

        @Override
        public int write(double[] mono, int offset, int frames) {
            int need = frames * format.frameBytes();
            if (bytes.length < need) bytes = new byte[need];
            PcmCodec.encode(mono, offset, frames, format, dither, bytes);
            int done = 0;
            while (done < need && line.isOpen()) {
                int k = line.write(bytes, done, need - done);
                if (k <= 0) break;
                done += k;
            }
            return done / format.frameBytes();
        }

        @Override public void drain() { if (line.isOpen()) line.drain(); }
    }
}
