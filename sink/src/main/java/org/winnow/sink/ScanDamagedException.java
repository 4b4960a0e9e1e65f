package org.winnow.sink;

import java.io.IOException;

/**
 * A scan directory whose files are not what its checkpoint or manifest recorded: a part cut, edited,
 * missing or replaced, or a checkpoint field out of range. The message is one line naming the file and
 * what differs; nothing in the directory has been changed by the check.
 */
public final class ScanDamagedException extends IOException {
    private static final long serialVersionUID = 1L;

    public ScanDamagedException(String message) {
        super(message);
    }
}
