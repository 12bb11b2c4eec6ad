package org.tectomelt.runs;

/** The run database cannot be reached or refused the operation. */
public final class StorageUnavailableException extends RuntimeException {

    private static final long serialVersionUID = 1L;

    /** @param message one line naming the database and the cause */
    public StorageUnavailableException(String message, Throwable cause) {
        super(message, cause);
    }
}
