package org.tectomelt.http;

import io.javalin.http.Context;
import java.io.IOException;
import java.io.InputStream;
import java.io.UncheckedIOException;
import java.util.List;
import java.util.Properties;

/** Routes about the service itself: health and the OpenAPI document. */
final class MetaRoutes {

    /** Classpath location of the spec, copied byte for byte from {@code api-spec/} by the build. */
    static final String SPEC_RESOURCE = "/api-spec/openapi.yaml";

    private static final byte[] SPEC = loadSpec();

    private MetaRoutes() {
    }

    static List<Route> routes() {
        return List.of(
                Route.liveGet("/v1/health", MetaRoutes::health),
                Route.get("/v1/citations", MetaRoutes::citations),
                Route.get("/docs", MetaRoutes::docs),
                Route.get("/openapi.yaml", MetaRoutes::spec));
    }

    /** Where the renderer's files are served (from the swagger-ui webjar in the jar). */
    static final String DOCS_UI_PATH = "/docs/ui";

    private static final byte[] DOCS = load("/docs/index.html");

    /** The classpath folder of the packaged swagger-ui webjar, whatever its version. */
    static String docsUiDirectory() {
        Properties p = new Properties();
        try (InputStream in = MetaRoutes.class.getResourceAsStream(
                "/META-INF/maven/org.webjars/swagger-ui/pom.properties")) {
            if (in == null) {
                throw new IllegalStateException("the build did not package the swagger-ui webjar");
            }
            p.load(in);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
        return "/META-INF/resources/webjars/swagger-ui/" + p.getProperty("version");
    }

    /** {@code GET /docs}: the rendered API reference of {@code /openapi.yaml}, every file from this jar. */
    static void docs(Context ctx) {
        ctx.contentType("text/html; charset=utf-8").result(DOCS);
    }

    private static byte[] load(String resource) {
        try (InputStream in = MetaRoutes.class.getResourceAsStream(resource)) {
            if (in == null) {
                throw new IllegalStateException("the build did not package " + resource);
            }
            return in.readAllBytes();
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /** Health body: the build's version and the git commit it was built from. */
    record Health(String status, String version, String commit) {
    }

    static void health(Context ctx) {
        Responses.json(ctx, new Health("up", BuildInfo.CURRENT.version(), BuildInfo.CURRENT.commitLabel()));
    }

    /** One citable model. */
    record Citation(String id, String citation, String doi, String bibtex) {
    }

    /** Body of {@code GET /v1/citations}. */
    record Citations(Citation software, List<Citation> models) {
    }

    /** BibTeX media type ({@code Accept: application/x-bibtex} or {@code ?cite=bibtex}). */
    static final String BIBTEX = "application/x-bibtex";

    /** Every model the service can cite, and the software itself, as JSON or as one BibTeX file. */
    static void citations(Context ctx) {
        List<org.tectomelt.engine.ModelInfo> models = org.tectomelt.engine.ModelCatalogue.all();
        if (wantsBibtex(ctx)) {
            StringBuilder sb = new StringBuilder(softwareBibtex());
            for (org.tectomelt.engine.ModelInfo m : models) {
                sb.append('\n').append(m.bibtex().text());
            }
            ctx.contentType(BIBTEX + "; charset=utf-8").result(sb.toString());
            return;
        }
        List<Citation> list = models.stream()
                .map(m -> new Citation(m.id(), m.citation(), m.doi(), m.bibtex().text())).toList();
        Responses.json(ctx, new Citations(new Citation("tectomelt", softwareCitation(), "", softwareBibtex()), list));
    }

    /** True when the caller asked for BibTeX: {@code ?cite=bibtex} or {@code Accept: application/x-bibtex}. */
    static boolean wantsBibtex(Context ctx) {
        String cite = ctx.queryParam("cite");
        if (cite != null) {
            if (!cite.equals("bibtex")) {
                throw ApiProblem.invalid("cite", "must be bibtex, got '"
                        + (cite.length() <= 20 ? cite : cite.substring(0, 20) + "…") + "'");
            }
            return true;
        }
        String accept = ctx.header("Accept");
        if (accept == null) {
            return false;
        }
        // the first of the two named wins: "application/json, application/x-bibtex" is JSON
        String a = accept.toLowerCase(java.util.Locale.ROOT);
        int bib = a.indexOf(BIBTEX);
        int json = a.indexOf(Responses.JSON);
        return bib >= 0 && (json < 0 || bib < json);
    }

    /** {@link #wantsBibtex} without refusing a bad {@code cite} (the handler refuses it). */
    static boolean wantsBibtexQuietly(Context ctx) {
        try {
            return wantsBibtex(ctx);
        } catch (ApiProblem e) {
            return false;
        }
    }

    /** The software itself, as its CITATION.cff describes it, with this build's version and commit. */
    static String softwareCitation() {
        BuildInfo b = BuildInfo.CURRENT;
        return "The tectomelt developers, tectomelt: melt estimates for tectonic settings from published models, "
                + "version " + b.version() + " (commit " + b.commitLabel() + "), Apache-2.0";
    }

    static String softwareBibtex() {
        BuildInfo b = BuildInfo.CURRENT;
        return "@misc{tectomelt-" + b.version() + ",\n"
                + "  author = {{The tectomelt developers}},\n"
                + "  title = {tectomelt: melt estimates for tectonic settings from published models},\n"
                + "  note = {Version " + b.version() + ", commit " + b.commitLabel() + ". Licence Apache-2.0},\n"
                + "}\n";
    }

    static void spec(Context ctx) {
        ctx.contentType("application/yaml").result(SPEC);
    }

    private static byte[] loadSpec() {
        try (InputStream in = MetaRoutes.class.getResourceAsStream(SPEC_RESOURCE)) {
            if (in == null) {
                throw new IllegalStateException("the build did not package " + SPEC_RESOURCE);
            }
            return in.readAllBytes();
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }
}
