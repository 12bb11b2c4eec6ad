package org.tectomelt.http;

import java.util.List;
import java.util.Map;

/**
 * An HTTP-level failure that becomes an RFC 9457 {@code application/problem+json} response.
 * Thrown by handlers and by the request plumbing; mapped in one place ({@link Problems}).
 */
public final class ApiProblem extends RuntimeException {

    private static final long serialVersionUID = 1L;

    private final int status;
    private final String type;
    private final String title;
    private final transient List<FieldError> errors;
    private final transient Map<String, String> headers;

    /**
     * @param status  HTTP status code
     * @param type    problem type slug, resolved to {@code /problems/<type>}
     * @param title   short, stable summary of the problem type
     * @param detail  human-readable explanation of this occurrence
     * @param errors  offending fields (may be empty)
     * @param headers extra response headers (e.g. {@code Retry-After})
     */
    public ApiProblem(int status, String type, String title, String detail,
                      List<FieldError> errors, Map<String, String> headers) {
        super(detail);
        this.status = status;
        this.type = type;
        this.title = title;
        this.errors = List.copyOf(errors);
        this.headers = Map.copyOf(headers);
    }

    /** 400 for one or more invalid fields. */
    public static ApiProblem invalid(List<FieldError> errors) {
        String detail = errors.size() == 1
                ? errors.get(0).field() + ": " + errors.get(0).message()
                : errors.size() + " fields are invalid";
        return new ApiProblem(400, "validation", "Invalid request field", detail, errors, Map.of());
    }

    /** 400 for a single invalid field. */
    public static ApiProblem invalid(String field, String message) {
        return invalid(List.of(new FieldError(field, message)));
    }

    /** 400 for a body that is not usable JSON at all. */
    public static ApiProblem malformed(String detail) {
        return new ApiProblem(400, "malformed-json", "Malformed JSON body", detail, List.of(), Map.of());
    }

    public int status() {
        return status;
    }

    public String type() {
        return type;
    }

    public String title() {
        return title;
    }

    public List<FieldError> errors() {
        return errors;
    }

    public Map<String, String> headers() {
        return headers;
    }
}
