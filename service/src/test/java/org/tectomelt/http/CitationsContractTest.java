package org.tectomelt.http;

import static org.hamcrest.Matchers.containsString;
import static org.hamcrest.Matchers.equalTo;
import static org.hamcrest.Matchers.hasItem;
import static org.hamcrest.Matchers.startsWith;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.tectomelt.http.Problem.assertInvalidField;

import java.util.List;
import org.junit.jupiter.api.Test;
import org.tectomelt.engine.ModelCatalogue;

/** {@code GET /v1/citations}: every model with its citation, DOI and BibTeX, and the software itself. */
class CitationsContractTest {

    @Test
    void everyModelIsListedWithItsBibtex() {
        List<String> ids = TestServer.given().get("/v1/citations").then()
                .statusCode(200)
                .contentType(startsWith("application/json"))
                .body("software.id", equalTo("tectomelt"))
                .body("software.bibtex", containsString("Version " + BuildInfo.CURRENT.version()))
                .body("models.id", hasItem("peridotite-katz2003"))
                .extract().path("models.id");
        assertEquals(ModelCatalogue.all().stream().map(m -> m.id()).toList(), ids);
    }

    @Test
    void katz2003IsAnArticleWithItsJournalVolumeIssueAndDoi() {
        // Katz, Spiegelman & Langmuir (2003), Geochem. Geophys. Geosyst. 4(9), 1073, doi:10.1029/2002GC000433
        String bib = TestServer.given().get("/v1/citations").then().statusCode(200)
                .extract().path("models.find { it.id == 'peridotite-katz2003' }.bibtex");
        assertTrue(bib.startsWith("@article{peridotite-katz2003,"), bib);
        assertTrue(bib.contains("author = {Katz, R.F. and Spiegelman, M. and Langmuir, C.H.}"), bib);
        assertTrue(bib.contains("title = {A new parameterization of hydrous mantle melting}"), bib);
        assertTrue(bib.contains("journal = {Geochemistry, Geophysics, Geosystems}"), bib);
        assertTrue(bib.contains("year = {2003}") && bib.contains("volume = {4}") && bib.contains("number = {9}")
                && bib.contains("pages = {1073}"), bib);
        assertTrue(bib.contains("doi = {10.1029/2002GC000433}"), bib);
    }

    @Test
    void bibtexOnRequestByAcceptOrQuery() {
        String byAccept = TestServer.given().header("Accept", "application/x-bibtex").get("/v1/citations").then()
                .statusCode(200).contentType(startsWith("application/x-bibtex")).extract().asString();
        String byQuery = TestServer.given().queryParam("cite", "bibtex").get("/v1/citations").then()
                .statusCode(200).contentType(startsWith("application/x-bibtex")).extract().asString();
        assertEquals(byAccept, byQuery);
        long entries = byAccept.lines().filter(l -> l.startsWith("@")).count();
        assertEquals(ModelCatalogue.all().size() + 1, entries, "one entry per model and one for the software");
        assertTrue(byAccept.contains("@article{melt-thickness-mckenzie-bickle1988,"), byAccept);
        assertTrue(byAccept.contains("@book{oceanic-half-space-cooling,"), byAccept);
    }

    @Test
    void anUnknownCiteFormatIsNamed() {
        assertInvalidField(TestServer.given().queryParam("cite", "ris").get("/v1/citations"), "cite");
    }
}
