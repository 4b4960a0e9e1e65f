package org.winnow.scorer.model;

import java.io.IOException;

/** A model file that cannot be used; the message is one line naming the file and the reason. */
public final class ModelFileException extends IOException {
    public ModelFileException(String message) {
        super(message);
    }
}
