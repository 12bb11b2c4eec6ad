package org.tectomelt.http;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;

/**
 * Collects field errors for one request, then throws them all at once as a 400 problem.
 *
 * <p>Typical use in a handler:
 * <pre>{@code
 * Validation v = new Validation();
 * double age = v.required("lithosphere.ageMyr", req.ageMyr(), 0, 200);
 * double k = v.optional("lithosphere.conductivityWPerMK", req.k(), 3.3, 0.5, 10);
 * v.throwIfInvalid();
 * }</pre>
 * Range checks are inclusive. A missing or failed value returns {@code NaN} (or {@code null});
 * callers must call {@link #throwIfInvalid()} before using the values.
 */
public final class Validation {

    private final List<FieldError> errors;
    private final String prefix;

    /** A fresh validation with no errors. */
    public Validation() {
        this(new ArrayList<>(), "");
    }

    private Validation(List<FieldError> errors, String prefix) {
        this.errors = errors;
        this.prefix = prefix;
    }

    /** A view that prefixes field names with {@code name.}; it shares this validation's error list. */
    public Validation at(String name) {
        return new Validation(errors, path(name) + ".");
    }

    /** A view for element {@code index} of the array {@code name}: {@code name[index].}. */
    public Validation at(String name, int index) {
        return new Validation(errors, path(name) + "[" + index + "].");
    }

    /** The full path of {@code name} as reported to the caller. */
    public String path(String name) {
        return prefix + name;
    }

    /** A required number within [min, max]. */
    public double required(String name, Double value, double min, double max) {
        if (value == null) {
            error(name, "is required (allowed range " + range(min, max) + ")");
            return Double.NaN;
        }
        return inRange(name, value, min, max);
    }

    /** An optional number within [min, max], {@code fallback} when absent. */
    public double optional(String name, Double value, double fallback, double min, double max) {
        return value == null ? fallback : inRange(name, value, min, max);
    }

    /** A required integer within [min, max]. */
    public int requiredInt(String name, Integer value, int min, int max) {
        if (value == null) {
            error(name, "is required (allowed range " + min + " to " + max + ")");
            return 0;
        }
        return optionalInt(name, value, value, min, max);
    }

    /** An optional integer within [min, max], {@code fallback} when absent. */
    public int optionalInt(String name, Integer value, int fallback, int min, int max) {
        if (value == null) {
            return fallback;
        }
        if (value < min || value > max) {
            error(name, "must be between " + min + " and " + max + ", got " + value);
        }
        return value;
    }

    /** A required choice among {@code allowed}. */
    public String requiredChoice(String name, String value, List<String> allowed) {
        if (value == null) {
            error(name, "is required; one of " + allowed);
            return null;
        }
        return optionalChoice(name, value, null, allowed);
    }

    /** An optional choice among {@code allowed}, {@code fallback} when absent. */
    public String optionalChoice(String name, String value, String fallback, List<String> allowed) {
        if (value == null) {
            return fallback;
        }
        if (!allowed.contains(value)) {
            error(name, "must be one of " + allowed + ", got '" + abbreviate(value) + "'");
        }
        return value;
    }

    /** A required object or array: reports its absence and returns whether it is present. */
    public boolean present(String name, Object value) {
        if (value == null) {
            error(name, "is required");
            return false;
        }
        return true;
    }

    /** A list whose length must lie in [min, max]; {@code null} counts as absent (and is an error when min > 0). */
    public <T> List<T> list(String name, List<T> value, int min, int max) {
        if (value == null) {
            if (min > 0) {
                error(name, "is required (" + min + " to " + max + " entries)");
            }
            return List.of();
        }
        if (value.size() < min || value.size() > max) {
            error(name, "must have between " + min + " and " + max + " entries, got " + value.size());
        }
        return value;
    }

    /**
     * A list whose length must lie in [min, max], where {@code max} is a server cap set by the
     * environment variable {@code capVariable}; the message names the variable, so a caller who hits
     * the cap knows it is the server's setting and not the model's limit.
     */
    public <T> List<T> list(String name, List<T> value, int min, int max, String capVariable) {
        if (value != null && value.size() > max) {
            error(name, "must have between " + min + " and " + max + " entries (server cap " + capVariable
                    + "), got " + value.size());
            return value;
        }
        return list(name, value, min, max);
    }

    /**
     * A size (cells × steps, a duration) that must not exceed a server cap set by the environment
     * variable {@code capVariable}. Returns whether it is within the cap.
     */
    public boolean cap(String name, double size, double max, String what, String capVariable) {
        if (!(size <= max)) {
            error(name, what + " " + format(size) + " exceeds the server cap of " + format(max) + " ("
                    + capVariable + ")");
            return false;
        }
        return true;
    }

    /** Records an error when {@code ok} is false. Returns {@code ok}. */
    public boolean check(boolean ok, String name, String message) {
        if (!ok) {
            error(name, message);
        }
        return ok;
    }

    /** Records an error on {@code name}. */
    public void error(String name, String message) {
        errors.add(new FieldError(path(name), message));
    }

    /** True when no error has been recorded (on this validation or any view of it). */
    public boolean ok() {
        return errors.isEmpty();
    }

    /** Throws a 400 problem listing every recorded error, if any. */
    public void throwIfInvalid() {
        if (!errors.isEmpty()) {
            throw ApiProblem.invalid(errors);
        }
    }

    private double inRange(String name, double value, double min, double max) {
        if (!(value >= min && value <= max)) {
            error(name, "must be between " + range(min, max) + ", got " + format(value));
            return Double.NaN;
        }
        return value;
    }

    /** Formats a range for messages: "0 and 200". */
    static String range(double min, double max) {
        return format(min) + " and " + format(max);
    }

    static String format(double x) {
        if (x == Math.rint(x) && Math.abs(x) < 1e15) {
            return String.valueOf((long) x);
        }
        return String.format(Locale.ROOT, "%.6g", x).replaceAll("\\.?0+(e|$)", "$1");
    }

    private static String abbreviate(String s) {
        return s.length() <= 40 ? s : s.substring(0, 40) + "…";
    }
}
