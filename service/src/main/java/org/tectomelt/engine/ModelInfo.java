package org.tectomelt.engine;

/**
 * Identity and provenance of a published model, reported in every response that used it.
 *
 * @param id       stable identifier, e.g. {@code peridotite-katz2003}
 * @param citation author(s), year, title, journal
 * @param doi      DOI without the resolver prefix, or an empty string for books without one
 */
public record ModelInfo(String id, String citation, String doi) {

    /** This model's BibTeX entry (key: the id), read from the citation; see {@link BibtexEntry}. */
    public BibtexEntry bibtex() {
        return BibtexEntry.of(this);
    }
}
