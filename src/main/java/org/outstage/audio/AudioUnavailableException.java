package org.outstage.audio;

/** No device, no device matching a name, or no accepted format: the message is one line saying which. */
public final class AudioUnavailableException extends Exception {
    public AudioUnavailableException(String message) { super(message); }
    public AudioUnavailableException(String message, Throwable cause) { super(message, cause); }
}
