package org.tectomelt.engine;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.tngtech.archunit.core.domain.JavaClass;
import com.tngtech.archunit.core.importer.ClassFileImporter;
import com.tngtech.archunit.core.importer.ImportOption;
import java.lang.reflect.Field;
import java.lang.reflect.Modifier;
import java.util.HashSet;
import java.util.List;
import java.util.Set;
import org.junit.jupiter.api.Test;

/** The catalogue behind {@code /v1/citations} holds every model the engine can cite, each with usable BibTeX. */
class ModelCatalogueTest {

    @Test
    void everyModelInfoConstantOfTheEngineIsInTheCatalogue() throws Exception {
        Set<String> listed = new HashSet<>(ModelCatalogue.all().stream().map(ModelInfo::id).toList());
        Set<String> missing = new HashSet<>();
        for (JavaClass c : new ClassFileImporter().withImportOption(ImportOption.Predefined.DO_NOT_INCLUDE_TESTS)
                .importPackages("org.tectomelt.engine")) {
            Class<?> k = Class.forName(c.getName());
            for (Field f : k.getDeclaredFields()) {
                int m = f.getModifiers();
                if (Modifier.isStatic(m) && Modifier.isPublic(m) && f.getType() == ModelInfo.class) {
                    ModelInfo info = (ModelInfo) f.get(null);
                    if (!listed.contains(info.id())) {
                        missing.add(k.getSimpleName() + "." + f.getName());
                    }
                }
            }
        }
        assertTrue(missing.isEmpty(), "not in ModelCatalogue.all(): " + missing);
    }

    @Test
    void idsAreUnique() {
        List<String> ids = ModelCatalogue.all().stream().map(ModelInfo::id).toList();
        assertEquals(ids.size(), new HashSet<>(ids).size());
    }

    @Test
    void everyJournalArticleWithADoiParsesIntoAuthorsYearTitleJournalAndPages() {
        for (ModelInfo m : ModelCatalogue.all()) {
            BibtexEntry e = m.bibtex();
            String text = e.text();
            assertTrue(text.startsWith("@" + e.type() + "{" + m.id() + ","), text);
            if (!m.doi().isEmpty()) {
                assertTrue(text.contains("doi = {" + m.doi() + "}"), text);
            }
            if (e.type().equals("article")) {
                for (String field : List.of("author", "title", "journal", "year", "volume", "pages")) {
                    assertTrue(e.fields().containsKey(field), m.id() + " lacks " + field + ": " + text);
                }
            }
            if (e.type().equals("misc")) {
                assertEquals(m.citation(), e.fields().get("note"), "a citation in no known form is kept as written");
            }
        }
        // McKenzie & Bickle (1988), J. Petrol. 29(3), 625-679: an article with its page range
        BibtexEntry mb = ModelCatalogue.all().stream().filter(m -> m.id().equals("peridotite-mckenzie-bickle1988"))
                .findFirst().orElseThrow().bibtex();
        assertEquals("article", mb.type());
        assertEquals("McKenzie, D. and Bickle, M.J.", mb.fields().get("author"));
        assertEquals("Journal of Petrology", mb.fields().get("journal"));
        assertEquals("625--679", mb.fields().get("pages"));
        // Turcotte & Schubert (2014), Geodynamics, 3rd ed., Cambridge University Press: a book
        BibtexEntry ts = ModelCatalogue.all().stream().filter(m -> m.id().equals("oceanic-half-space-cooling"))
                .findFirst().orElseThrow().bibtex();
        assertEquals("book", ts.type());
        assertEquals("Geodynamics", ts.fields().get("title"));
        assertEquals("3rd", ts.fields().get("edition"));
        assertEquals("Cambridge University Press", ts.fields().get("publisher"));
    }
}
