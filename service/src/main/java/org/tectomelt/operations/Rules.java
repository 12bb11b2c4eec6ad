package org.tectomelt.operations;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;

/**
 * Collects the violations of an operation's own rules (across fields, limits of the chosen model,
 * server caps), then throws them all at once. Ranges the spec states are not checked here: the
 * request has already passed the spec.
 *
 * <pre>{@code
 * Rules rules = new Rules();
 * rules.check(crust < lithosphere, "crustThicknessKm", "must be less than lithosphereThicknessKm ...");
 * rules.within("pressureGPa", p, 0, lithologyMaxGPa);   // a limit that depends on the model chosen
 * rules.throwIfBroken();
 * }</pre>
 */
public final class Rules {

    private final List<Violation> violations;
    private final String prefix;

    /** No violation yet. */
    public Rules() {
        this(new ArrayList<>(), "");
    }

    private Rules(List<Violation> violations, String prefix) {
        this.violations = violations;
        this.prefix = prefix;
    }

    /** A view that prefixes field names with {@code name.}; it shares this collector's list. */
    public Rules at(String name) {
        return new Rules(violations, path(name) + ".");
    }

    /** A view for element {@code index} of the array {@code name}: {@code name[index].}. */
    public Rules at(String name, int index) {
        return new Rules(violations, path(name) + "[" + index + "].");
    }

    /** The full path of {@code name} as reported to the caller. */
    public String path(String name) {
        return prefix + name;
    }

    /** Records a violation on {@code name}. */
    public void error(String name, String message) {
        violations.add(new Violation(path(name), message));
    }

    /** Records a violation when {@code ok} is false; returns {@code ok}. */
    public boolean check(boolean ok, String name, String message) {
        if (!ok) {
            error(name, message);
        }
        return ok;
    }

    /**
     * A limit that depends on the request (the chosen lithology's maximum pressure, the column's
     * deepest depth): inclusive, with the same wording as the spec's ranges. Returns whether it holds.
     */
    public boolean within(String name, double value, double min, double max) {
        if (value >= min && value <= max) {
            return true;   // the message is built only for a broken rule (this runs on every request)
        }
        return check(false, name, "must be between " + format(min) + " and " + format(max) + ", got " + format(value));
    }

    /**
     * A size (cells × steps, a duration, a sample count) that must not exceed a server cap set by
     * {@code capVariable}. Returns whether it is within the cap.
     */
    public boolean cap(String name, double size, double max, String what, String capVariable) {
        if (size <= max) {
            return true;
        }
        return check(false, name, what + " " + format(size) + " exceeds the server cap of " + format(max)
                + " (" + capVariable + ")");
    }

    /** What was recorded, in order. */
    public List<Violation> violations() {
        return List.copyOf(violations);
    }

    /** True when nothing was recorded (on this collector or any view of it). */
    public boolean ok() {
        return violations.isEmpty();
    }

    /** Throws an {@link OperationException} with every recorded violation, if any. */
    public void throwIfBroken() {
        if (!violations.isEmpty()) {
            throw new OperationException(violations);
        }
    }

    /** A number for a message: integers without a decimal point, others to six significant digits. */
    public static String format(double x) {
        if (x == Math.rint(x) && Math.abs(x) < 1e15) {
            return String.valueOf((long) x);
        }
        return String.format(Locale.ROOT, "%.6g", x).replaceAll("\\.?0+(e|$)", "$1");
    }
}
