package org.tectomelt.engine;

/**
 * Raised by the engine when a published model cannot give a number for the inputs it was handed
 * (outside its validity range in a way that cannot be extrapolated, or a root that does not
 * exist). The HTTP layer turns it into a 400 problem; the message must therefore be written for
 * the caller and name the quantity and the allowed range.
 */
public final class EngineException extends RuntimeException {

    private static final long serialVersionUID = 1L;

    /** @param message what cannot be computed and why, with the allowed range */
    public EngineException(String message) {
        super(message);
    }
}
