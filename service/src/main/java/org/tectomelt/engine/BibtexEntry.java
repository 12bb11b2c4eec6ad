package org.tectomelt.engine;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

/**
 * A BibTeX entry for a {@link ModelInfo}, read from its citation, which every model writes in one
 * form: {@code Authors (Year) Title. Journal Volume(Issue), pages[; note or (note)]}, for example
 * {@code Katz, R.F., Spiegelman, M. & Langmuir, C.H. (2003) A new parameterization of hydrous
 * mantle melting. Geochemistry, Geophysics, Geosystems 4(9), 1073}. A book reads
 * {@code Authors (Year) Title, edition, Publisher, chapter N (note)}. A citation in neither form
 * (a common-practice value, a caller's own curve) becomes a {@code @misc} entry whose note is the
 * citation as written; nothing is invented.
 *
 * @param type   BibTeX entry type: {@code article}, {@code book} or {@code misc}
 * @param key    citation key: the model id
 * @param fields field name to value, in BibTeX order, already braced where needed
 */
public record BibtexEntry(String type, String key, Map<String, String> fields) {

    private static final Pattern LEAD = Pattern.compile("^(?:.*?;\\s*)?(?:e\\.g\\.\\s+)?"
            + "(?<authors>[A-Z][^()]*?)\\s*\\((?<year>\\d{4})\\)\\s+(?<rest>.+)$");
    private static final Pattern ARTICLE = Pattern.compile("^(?<title>.+?)\\.\\s+(?<journal>[A-Z][^.;()]*?)\\s+"
            + "(?<volume>\\d+)(?:\\((?<number>[^)]+)\\))?,\\s+(?<pages>\\d+(?:-\\d+)?)(?<tail>.*)$");
    private static final Pattern BOOK = Pattern.compile("^(?<title>[^,]+),\\s+(?:(?<edition>\\d+(?:st|nd|rd|th))\\s+ed\\.,\\s+)?"
            + "(?<publisher>[^,]*Press[^,]*)(?<tail>.*)$");
    private static final Pattern AUTHOR = Pattern.compile("([A-Z][A-Za-z' -]+?), ((?:[A-Z]\\.-?)+)");

    /** Defensive copy. */
    public BibtexEntry {
        fields = java.util.Collections.unmodifiableMap(new LinkedHashMap<>(fields));
    }

    /** The entry of {@code model}. */
    public static BibtexEntry of(ModelInfo model) {
        String citation = model.citation().trim();
        Map<String, String> f = new LinkedHashMap<>();
        Matcher lead = LEAD.matcher(citation);
        String type = "misc";
        if (lead.matches()) {
            String authors = authors(lead.group("authors"));
            String rest = lead.group("rest").trim();
            Matcher a = ARTICLE.matcher(rest);
            Matcher b = BOOK.matcher(rest);
            if (authors != null && a.matches()) {
                type = "article";
                f.put("author", authors);
                f.put("title", a.group("title").trim());
                f.put("journal", a.group("journal").trim());
                f.put("year", lead.group("year"));
                f.put("volume", a.group("volume"));
                if (a.group("number") != null) {
                    f.put("number", a.group("number"));
                }
                f.put("pages", a.group("pages").replace("-", "--"));
                putNote(f, a.group("tail"));
            } else if (authors != null && b.matches()) {
                type = "book";
                f.put("author", authors);
                f.put("title", b.group("title").trim());
                if (b.group("edition") != null) {
                    f.put("edition", b.group("edition"));
                }
                f.put("publisher", b.group("publisher").trim());
                f.put("year", lead.group("year"));
                putNote(f, b.group("tail"));
            }
        }
        if (type.equals("misc")) {
            f.put("title", "{" + model.id() + "}");
            f.put("note", citation);
        }
        if (!model.doi().isEmpty()) {
            f.put("doi", model.doi());
        }
        return new BibtexEntry(type, model.id(), f);
    }

    /** {@code Katz, R.F., Spiegelman, M. & Langmuir, C.H.} → {@code Katz, R.F. and Spiegelman, M. and ...}. */
    private static String authors(String raw) {
        List<String> names = new ArrayList<>();
        Matcher m = AUTHOR.matcher(raw);
        int end = 0;
        while (m.find()) {
            String between = raw.substring(end, m.start()).replaceAll("[,&\\s]", "");
            if (!between.isEmpty()) {
                return null;
            }
            names.add(m.group(1).trim() + ", " + m.group(2));
            end = m.end();
        }
        if (names.isEmpty() || !raw.substring(end).replaceAll("[,&.\\s]", "").isEmpty()) {
            return null;
        }
        return String.join(" and ", names);
    }

    private static void putNote(Map<String, String> f, String tail) {
        String note = tail == null ? "" : tail.trim().replaceFirst("^[;,]\\s*", "").trim();
        if (note.startsWith("(") && note.endsWith(")")) {
            note = note.substring(1, note.length() - 1);
        }
        if (!note.isEmpty()) {
            f.put("note", note);
        }
    }

    /** The entry as BibTeX text, values in braces, special characters escaped. */
    public String text() {
        StringBuilder sb = new StringBuilder();
        sb.append('@').append(type).append('{').append(key);
        for (Map.Entry<String, String> e : fields.entrySet()) {
            sb.append(",\n  ").append(e.getKey()).append(" = {").append(escape(e.getKey(), e.getValue())).append('}');
        }
        return sb.append("\n}\n").toString();
    }

    private static String escape(String field, String value) {
        if (field.equals("doi")) {
            return value;
        }
        return value.replace("&", "\\&").replace("%", "\\%").replace("#", "\\#").replace("_", "\\_")
                .replace("°", "{\\textdegree}");
    }
}
