package org.tectomelt.http;

/**
 * Told about every finished request. Production passes {@link #NONE}; the contract tests use
 * one to prove that every status code documented in the spec is really produced.
 */
@FunctionalInterface
public interface RequestObserver {

    /** Does nothing. */
    RequestObserver NONE = (method, routePath, status) -> { };

    /**
     * @param method    HTTP method
     * @param routePath the matched route template, or the raw path when no route matched
     * @param status    the final status code
     */
    void finished(String method, String routePath, int status);
}
