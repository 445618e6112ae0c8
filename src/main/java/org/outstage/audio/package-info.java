/**
 * Live audio: devices, formats, playing a stimulus and capturing blocks. The rest of the program sees only our own
 * small interfaces: {@link org.outstage.audio.AudioBackend} (list devices, open lines),
 * {@link org.outstage.audio.InputLine} and {@link org.outstage.audio.OutputLine}, so another backend (a native one)
 * can join later. {@link org.outstage.audio.JavaSoundBackend} implements them with {@code javax.sound.sampled}, the
 * only package allowed to import it. {@link org.outstage.audio.BlockCapture} turns an input into
 * {@link org.outstage.capture.Capture}-shaped blocks with dropped-frame accounting; {@link org.outstage.audio.Player}
 * plays a {@link org.outstage.stimulus.Generator} on a daemon thread and always fades out and closes;
 * {@link org.outstage.audio.WavRecorder} keeps the raw input in a WAV file whose header is finalised on close.
 * Timing, drops and latency live here, never in analysis. Imports: stimulus, capture, JDK.
 */
package org.outstage.audio;
