package org.tectomelt.contract;

/** A request body that is not usable JSON at all (→ 400 {@code /problems/malformed-json}). */
public final class MalformedBodyException extends RuntimeException {

    private static final long serialVersionUID = 1L;

    /** @param detail what is wrong, for the caller */
    public MalformedBodyException(String detail) {
        super(detail);
    }
}
