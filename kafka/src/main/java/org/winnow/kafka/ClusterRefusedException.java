package org.winnow.kafka;

/**
 * A cluster stage cannot start or go on: the broker does not answer, the run's topics are missing, or a
 * record or model belongs to something else. The message is one line that names the bad input.
 */
public final class ClusterRefusedException extends RuntimeException {
    private static final long serialVersionUID = 1L;

    public ClusterRefusedException(String message) {
        super(message);
    }

    public ClusterRefusedException(String message, Throwable cause) {
        super(message, cause);
    }
}
