package org.winnow.kafka;

/** Bytes on a topic that do not decode to the record the topic carries. */
public final class WireFormatException extends RuntimeException {
    private static final long serialVersionUID = 1L;

    public WireFormatException(String message) {
        super(message);
    }

    public WireFormatException(String message, Throwable cause) {
        super(message, cause);
    }
}
