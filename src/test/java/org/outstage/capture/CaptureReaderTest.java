package org.outstage.capture;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.OptionalDouble;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** Choosing the reader and applying calibration options. */
class CaptureReaderTest {
    @TempDir Path dir;

    private Path sineWav(String name) throws Exception {
        // 48 kHz, 1 kHz full-scale sine over 48 cycles in float: RMS is 1/√2 (a sine of peak A has RMS A/√2; AES17 0 dBFS)
        double[] x = new double[2304];
        for (int i = 0; i < x.length; i++) x[i] = Math.sin(2 * Math.PI * 1000 * i / 48000.0);
        Path p = dir.resolve(name);
        WavWriter.write(p, 48000, WavWriter.Encoding.FLOAT_64, false, x);
        return p;
    }

    private static double rms(double[] x) {
        double s = 0;
        for (double v : x) s += v * v;
        return Math.sqrt(s / x.length);
    }

    @Test
    void uncalibratedWav_fullScaleSineHasRmsOneOverRootTwo() throws Exception {
        Capture c = CaptureReader.open(sineWav("a.wav"), CaptureOptions.none());
        assertEquals(SampleUnit.FULL_SCALE, c.unit());
        assertEquals(1 / Math.sqrt(2), rms(c.readChannel(0)), 1e-12);
    }

    @Test
    void fullScaleVolts_makesVoltsWithThatScale() throws Exception {
        Capture c = CaptureReader.open(sineWav("a.wav"), CaptureOptions.none().withFullScaleVolts(20));
        assertEquals(SampleUnit.VOLTS, c.unit());
        assertEquals(20.0, c.scale());
        assertEquals(20 / Math.sqrt(2), rms(c.readChannel(0)), 1e-11);
    }

    @Test
    void wavContentUnderCsvName_isReadAsWav() throws Exception {
        Path wav = sineWav("a.wav");
        Path disguised = dir.resolve("capture.csv");
        Files.copy(wav, disguised);
        Capture c = CaptureReader.open(disguised, CaptureOptions.none());
        assertEquals(48000.0, c.sampleRateHz());
        assertEquals(SampleUnit.FULL_SCALE, c.unit());
    }

    @Test
    void wavExtensionWithoutMagic_getsTheWavError() throws Exception {
        Path p = dir.resolve("fake.wav");
        Files.write(p, "time,CH1\n0,1\n".getBytes(StandardCharsets.US_ASCII));
        CaptureFormatException e = assertThrows(CaptureFormatException.class, () -> CaptureReader.open(p, CaptureOptions.none()));
        assertEquals("fake.wav: byte 0: not a WAV file: starts with 'time', expected RIFF, RF64 or BW64", e.getMessage());
    }

    @Test
    void textFile_isReadAsScopeCsv() throws Exception {
        Path p = dir.resolve("scope.txt");
        Files.write(p, "time,CH1\n0,0.5\n1e-6,-0.5\n2e-6,0.25\n".getBytes(StandardCharsets.US_ASCII));
        Capture c = CaptureReader.open(p, CaptureOptions.none().withProbeFactor(10));
        assertEquals(SampleUnit.VOLTS, c.unit());
        assertEquals(1e6, c.sampleRateHz(), 1e-6);
        assertArrayEquals(new double[] {5, -5, 2.5}, c.readChannel(0));
    }

    @Test
    void wavSampleRateDisagreeingWithOption_refused() throws Exception {
        Path p = sineWav("rate.wav");
        CaptureFormatException e = assertThrows(CaptureFormatException.class,
                () -> CaptureReader.open(p, CaptureOptions.none().withSampleRateHz(44100)));
        assertEquals("rate.wav: fmt chunk: the file says 48000 Hz, the given sample rate is 44100 Hz", e.getMessage());
    }

    @Test
    void wavSampleRateAgreeingWithOption_accepted() throws Exception {
        assertEquals(48000.0, CaptureReader.open(sineWav("ok.wav"), CaptureOptions.none().withSampleRateHz(48000)).sampleRateHz());
    }

    @Test
    void probeFactorOnWav_ignoredWithWarning() throws Exception {
        Capture c = CaptureReader.open(sineWav("p.wav"), CaptureOptions.none().withProbeFactor(10));
        assertEquals(1.0, c.scale());
        assertEquals(List.of("the probe factor applies to scope CSV files only; ignored for this WAV (use the full-scale voltage)"), c.warnings());
    }

    @Test
    void missingFile_refused() {
        Path p = dir.resolve("nowhere.wav");
        CaptureFormatException e = assertThrows(CaptureFormatException.class, () -> CaptureReader.open(p, CaptureOptions.none()));
        assertEquals("nowhere.wav: file: not found (" + p.toAbsolutePath() + ")", e.getMessage());
    }

    @Test
    void directory_refused() {
        CaptureFormatException e = assertThrows(CaptureFormatException.class, () -> CaptureReader.open(dir, CaptureOptions.none()));
        assertEquals(dir.getFileName() + ": file: is a directory, not a capture file", e.getMessage());
    }

    @Test
    void options_rejectNonPositive() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> new CaptureOptions(OptionalDouble.of(-1), OptionalDouble.empty(), OptionalDouble.empty()));
        assertEquals("fullScaleVolts=-1.0 must be > 0", e.getMessage());
    }
}
