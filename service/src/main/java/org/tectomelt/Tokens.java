package org.tectomelt;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.regex.Pattern;

/**
 * The group's personal access tokens, from the file named by {@code TECTOMELT_TOKENS_FILE}: one
 * {@code name:token} line per member (blank lines and lines starting with {@code #} are skipped).
 * A run records the name of the token that started it; any token holder reads every run, only its
 * owner deletes it. The single {@code TECTOMELT_TOKEN}, when set as well, is the member
 * {@value #SHARED_TOKEN_NAME}.
 *
 * @param byToken member name of each token
 */
public record Tokens(Map<String, String> byToken) {

    /** Owner name of the single {@code TECTOMELT_TOKEN}. */
    public static final String SHARED_TOKEN_NAME = "default";
    /** Owner name recorded on a server without tokens. */
    public static final String ANONYMOUS = "anonymous";

    private static final Pattern NAME = Pattern.compile("[A-Za-z0-9._@-]{1,64}");

    /** Copies the map. */
    public Tokens {
        byToken = Map.copyOf(byToken);
    }

    /** No personal tokens. */
    public static Tokens none() {
        return new Tokens(Map.of());
    }

    /**
     * Reads {@code TECTOMELT_TOKENS_FILE} (if set) and adds {@code sharedToken} (if not empty) as
     * {@value #SHARED_TOKEN_NAME}.
     *
     * @throws IllegalArgumentException when the file cannot be read or a line is unusable
     */
    public static Tokens fromEnvironment(Map<String, String> env, String sharedToken) {
        Map<String, String> out = new LinkedHashMap<>();
        String file = env.get("TECTOMELT_TOKENS_FILE");
        if (file != null && !file.isBlank()) {
            List<String> lines;
            try {
                lines = Files.readAllLines(Path.of(file.trim()), StandardCharsets.UTF_8);
            } catch (IOException | RuntimeException e) {
                throw new IllegalArgumentException("TECTOMELT_TOKENS_FILE: cannot read '" + file.trim() + "' ("
                        + e.getClass().getSimpleName() + ")");
            }
            for (int i = 0; i < lines.size(); i++) {
                String line = lines.get(i).trim();
                if (line.isEmpty() || line.startsWith("#")) {
                    continue;
                }
                String where = "TECTOMELT_TOKENS_FILE line " + (i + 1) + ": ";
                int colon = line.indexOf(':');
                if (colon < 0) {
                    throw new IllegalArgumentException(where + "expected name:token");
                }
                String name = line.substring(0, colon).trim();
                String token = line.substring(colon + 1).trim();
                if (!NAME.matcher(name).matches()) {
                    throw new IllegalArgumentException(where + "a name is 1 to 64 characters from A-Z a-z 0-9 . _ @ -");
                }
                if (token.length() < Config.MIN_TOKEN_LENGTH || !Config.TOKEN_CHARS.matcher(token).matches()) {
                    throw new IllegalArgumentException(where + "the token of '" + name + "' must have at least "
                            + Config.MIN_TOKEN_LENGTH + " characters from A-Z a-z 0-9 - . _ ~ + /");
                }
                if (out.containsValue(name)) {
                    throw new IllegalArgumentException(where + "the name '" + name + "' appears twice");
                }
                if (out.put(token, name) != null) {
                    throw new IllegalArgumentException(where + "this token is already given to another name");
                }
            }
        }
        if (sharedToken != null && !sharedToken.isEmpty()) {
            if (out.containsValue(SHARED_TOKEN_NAME) || out.containsKey(sharedToken)) {
                throw new IllegalArgumentException("TECTOMELT_TOKENS_FILE: the name '" + SHARED_TOKEN_NAME
                        + "' and the token of TECTOMELT_TOKEN belong to TECTOMELT_TOKEN");
            }
            out.put(sharedToken, SHARED_TOKEN_NAME);
        }
        return new Tokens(out);
    }

    /** True when any token is required. */
    public boolean required() {
        return !byToken.isEmpty();
    }

    /** Never prints a token. */
    @Override
    public String toString() {
        return "Tokens[" + byToken.size() + " members]";
    }
}
