package org.tectomelt.http;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.dataformat.yaml.YAMLFactory;
import io.javalin.Javalin;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.concurrent.atomic.AtomicReference;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;
import org.openqa.selenium.By;
import org.openqa.selenium.WebElement;
import org.tectomelt.Config;

/**
 * The page at {@code /} in a real browser (headless Chromium): fills a form, submits it, reads
 * the summary, checks that the SVG drew its curves, downloads, "copy as curl" and the token box.
 * Screenshots land in {@code service/target/browser/}. Tagged "browser": run with {@code -Pbrowser}.
 */
@Tag("browser")
class PageBrowserTest {

    private static final ObjectMapper JSON = new ObjectMapper();
    private static HeadlessChromium browser;

    @BeforeAll
    static void startBrowser() {
        browser = new HeadlessChromium();
    }

    @AfterAll
    static void stopBrowser() {
        if (browser != null) {
            browser.close();
        }
    }

    private static String page(String tool) {
        return TestServer.baseUri() + "/#" + tool;
    }

    private static JsonNode spec() throws IOException {
        return new ObjectMapper(new YAMLFactory()).readTree(Path.of("..", "api-spec", "openapi.yaml").toFile());
    }

    private static String text(String css) {
        return browser.driver.findElement(By.cssSelector(css)).getText();
    }

    /** Numbers of the listing column {@code key}, as shown. */
    private static List<Double> column(String key) {
        List<Double> out = new ArrayList<>();
        for (WebElement td : browser.driver.findElements(By.cssSelector("#listing td[data-key='" + key + "']"))) {
            out.add(Double.parseDouble(td.getText()));
        }
        return out;
    }

    @Test
    void everyToolIsListedAndMarkedAvailableExactlyWhenTheSpecHasItsEndpoint() throws IOException {
        browser.open(page("pressure"));
        JsonNode paths = spec().get("paths");
        JsonNode tools = JSON.readTree(PageBrowserTest.class.getResourceAsStream("/public/tools.json")).get("tools");
        int available = 0;
        for (JsonNode t : tools) {
            WebElement link = browser.driver.findElement(By.cssSelector("#tools a[data-tool='" + t.get("id").asText() + "']"));
            boolean expected = paths.has(t.get("endpoint").asText());
            assertEquals(String.valueOf(expected), link.getAttribute("data-available"), t.get("id").asText());
            available += expected ? 1 : 0;
        }
        assertTrue(available >= 1, "at least the pressure tool has its endpoint");
        assertTrue(browser.driver.findElement(By.id("cautions")).isDisplayed());
        assertTrue(text("#cautions").contains("research estimates"));
        assertTrue(text("#cautions").contains("licensed professional practice"));
    }

    @Test
    void everyToolWhoseEndpointIsOnThisServerComputesWithItsDefaults() throws IOException {
        JsonNode paths = spec().get("paths");
        JsonNode tools = JSON.readTree(PageBrowserTest.class.getResourceAsStream("/public/tools.json")).get("tools");
        List<String> tried = new ArrayList<>();
        for (JsonNode t : tools) {
            String id = t.get("id").asText();
            if (!paths.has(t.get("endpoint").asText())) {
                continue; // marked unavailable, checked above
            }
            tried.add(id);
            browser.open(page(id));
            String state = browser.submit();
            assertEquals("done", state, id + ": " + text("#form-error"));
            if (!t.get("summary").isEmpty()) {
                assertFalse(browser.driver.findElements(By.cssSelector("#summary tr")).isEmpty(), id + ": summary rows");
            }
            List<WebElement> figures = browser.driver.findElements(By.cssSelector("#plots figure"));
            assertEquals(t.get("plots").size(), figures.size(), id + ": one figure per plot");
            for (WebElement f : figures) {
                boolean drawn = !f.findElements(By.cssSelector("svg path.curve, svg path.mark")).isEmpty();
                boolean saidWhy = !f.findElements(By.cssSelector("p.empty")).isEmpty();
                assertTrue(drawn || saidWhy, id + ": figure '" + f.getAttribute("data-plot") + "' drew nothing and said nothing");
            }
            browser.screenshot("defaults-" + id);
        }
        assertTrue(tried.contains("pressure"), "tried: " + tried);
    }

    @Test
    void pressureFormDrawsItsCurveAndGivesTheReferencePressures() throws Exception {
        browser.open(page("pressure"));
        browser.fill("depthsKm", "0, 30.9, 61.8");
        browser.fill("crustThicknessKm", "0");
        assertEquals("done", browser.submit());

        // REFERENCES §1.1 [calc]: mantle-only column (3300 kg/m³, g = 9.81), 1 GPa at 30.9 km, 2 GPa at 61.8 km
        List<Double> p = column("pressureGPa");
        assertEquals(3, p.size());
        assertEquals(0.0, p.get(0), 1e-9);
        assertEquals(1.0, p.get(1), 0.002);
        assertEquals(2.0, p.get(2), 0.002);

        WebElement curve = browser.driver.findElement(By.cssSelector("#plots svg path.curve.role-path"));
        assertEquals("3", curve.getAttribute("data-points"));
        assertTrue(curve.getAttribute("d").matches("M[-0-9.,]+(L[-0-9.,]+){2}"), curve.getAttribute("d"));
        String svgText = text("#plots svg");
        assertTrue(svgText.contains("Depth (km)"), svgText);
        assertTrue(svgText.contains("Pressure (GPa)"), svgText);
        assertTrue(svgText.contains("lithostatic pressure"), "legend: " + svgText);
        assertTrue(text("#results .result-caution").contains("not a hazard, geothermal or site assessment"));
        browser.screenshot("pressure");
    }

    @Test
    void csvAndJsonDownloadsHoldTheResult() throws Exception {
        browser.open(page("pressure"));
        browser.fill("depthsKm", "10, 20");
        assertEquals("done", browser.submit());
        browser.driver.findElement(By.id("download-csv")).click();
        List<String> csv = Files.readAllLines(browser.downloaded("tectomelt-pressure.csv"), StandardCharsets.UTF_8);
        assertEquals("depthKm,pressureGPa", csv.get(0));
        assertEquals(3, csv.size());
        assertEquals(10.0, Double.parseDouble(csv.get(1).split(",")[0]), 0);
        browser.driver.findElement(By.id("download-json")).click();
        JsonNode json = JSON.readTree(browser.downloaded("tectomelt-pressure.json").toFile());
        assertEquals(20.0, json.at("/points/1/depthKm").asDouble(), 0);
        assertEquals("lithostatic-two-layer", json.at("/models/0/id").asText());
    }

    @Test
    void copyAsCurlReproducesTheRequest() throws Exception {
        browser.open(page("pressure"));
        browser.fill("depthsKm", "12.5, 80");
        browser.fill("crustThicknessKm", "30");
        assertEquals("done", browser.submit());
        browser.driver.findElement(By.id("copy-curl")).click();
        String command = browser.driver.findElement(By.id("curl-text")).getAttribute("value");
        assertTrue(command.startsWith("curl "), command);
        assertTrue(command.contains(TestServer.baseUri() + "/v1/pressure"), command);
        // run the copied command and compare its answer with what the page got
        Process proc = new ProcessBuilder("bash", "-c", command).redirectErrorStream(true).start();
        String out = new String(proc.getInputStream().readAllBytes(), StandardCharsets.UTF_8);
        assertEquals(0, proc.waitFor(), out);
        JsonNode fromCurl = JSON.readTree(out);
        assertEquals(List.of(12.5, 80.0), List.of(fromCurl.at("/points/0/depthKm").asDouble(),
                fromCurl.at("/points/1/depthKm").asDouble()));
        List<Double> shown = column("pressureGPa");
        assertEquals(fromCurl.at("/points/1/pressureGPa").asDouble(), shown.get(1), 0.0005);
    }

    @Test
    void validationMessagesAppearBesideTheirFields() {
        browser.open(page("pressure"));
        browser.fill("depthsKm", "-1, 10");
        browser.fill("crustThicknessKm", "-5");
        assertEquals("failed", browser.submit());
        String crust = text(".field[data-field='crustThicknessKm'] .field-error");
        assertTrue(crust.contains("between 0 and 100"), crust);
        String depths = text(".field[data-field='depthsKm'] .field-error");
        assertTrue(depths.contains("depthsKm[0]"), depths);
        assertTrue(browser.driver.findElement(By.cssSelector(".field[data-field='crustThicknessKm']"))
                .getAttribute("class").contains("invalid"));
        browser.screenshot("pressure-validation");

        browser.fill("crustThicknessKm", "thirty");
        browser.driver.findElement(By.id("run")).click();
        assertTrue(text(".field[data-field='crustThicknessKm'] .field-error").contains("not a number"));
    }

    /** The number shown in the summary row for response path {@code path}. */
    private static double summary(String path) {
        return Double.parseDouble(text("#summary tr[data-path='" + path + "'] td.value"));
    }

    @Test
    void continentalGeothermGivesTheClosedFormMohoTemperatureAndDrawsItsCurve() {
        browser.open(page("geotherm"));
        // the invented plateau's defaults: 62 mW/m², 60 % reduced heat flow, 10 km scale, k = 2.5, 38 km crust
        browser.fill("lithosphere.surfaceHeatFlowMWPerM2", "62");
        browser.fill("maxDepthKm", "250");
        browser.fill("stepKm", "2");
        assertEquals("done", browser.submit());

        // Turcotte & Schubert (2014) eq. 4.31, exponential heat production, evaluated here:
        // T(z) = T0 + qm z / k + (q0 - qm) hr / k (1 - exp(-z / hr))
        double q0 = 0.062, qm = 0.6 * q0, hr = 10e3, k = 2.5, z = 38e3;
        double moho = qm * z / k + (q0 - qm) * hr / k * (1 - Math.exp(-z / hr));
        assertEquals(moho, summary("mohoTemperatureC"), 0.51, "shown to the degree");
        assertEquals(62.0, summary("surfaceHeatFlowMWPerM2"), 0.051);
        double base = summary("lithosphereBaseDepthKm");
        assertTrue(base > 38 && base < 250, "the conductive profile meets the adiabat below the Moho: " + base);

        WebElement curve = browser.driver.findElement(By.cssSelector("#plots svg path.curve.role-path"));
        assertEquals("126", curve.getAttribute("data-points"), "0 to 250 km every 2 km");
        List<double[]> v = vertices(curve.getAttribute("d"));
        for (int i = 1; i < v.size(); i++) {
            assertTrue(v.get(i)[1] > v.get(i - 1)[1], "depth increases downward");
        }
        String svgText = text("#plots svg");
        assertTrue(svgText.contains("Moho") && svgText.contains("base of thermal lithosphere"), svgText);
        assertTrue(svgText.contains("Temperature (°C)") && svgText.contains("Depth (km)"), svgText);
        assertTrue(svgText.contains("Pressure (GPa)"), "the pressure axis beside the depth axis: " + svgText);
        browser.screenshot("geotherm");
    }

    @Test
    void oceanicPlateShowsItsOwnFieldsAndTheSeaFloorDepth() {
        browser.open(page("geotherm"));
        new org.openqa.selenium.support.ui.Select(browser.driver.findElement(By.name("lithosphere.type")))
                .selectByValue("oceanic-plate");
        assertTrue(browser.driver.findElements(By.cssSelector(".field:not([hidden])[data-field='lithosphere.surfaceHeatFlowMWPerM2']")).isEmpty(),
                "continental fields are hidden and not sent");
        browser.fill("lithosphere.ageMyr", "-1");
        assertEquals("failed", browser.submit());
        assertTrue(text(".field[data-field='lithosphere.ageMyr'] .field-error").contains("between"),
                "a nested field's message sits beside it");

        browser.fill("lithosphere.ageMyr", "60");
        assertEquals("done", browser.submit());
        // Stein & Stein (1992) GDH1 depth fit for t >= 20 Myr: d = 5651 - 2473 exp(-0.0278 t) m
        assertEquals(5651 - 2473 * Math.exp(-0.0278 * 60), summary("seafloorDepthM"), 20);
    }

    @Test
    void subductionWedgeIsSolidDryButMeltsWithWaterAndDrawsTheWaterCurve() {
        browser.open(page("subduction"));
        browser.fill("depthKm", "100");
        browser.fill("wedgeTemperatureC", "1300");
        browser.fill("bulkWaterWtPct", "0.4");
        browser.fill("maxWaterWtPct", "1");
        assertEquals("done", browser.submit());
        // common practice: mantle near 100 km at about 1300 °C is solid when dry, partially molten with slab water
        assertTrue(summary("drySolidusC") > 1300, "dry solidus above the wedge temperature");
        assertTrue(summary("wetSolidusC") < 1300, "wet solidus below it");
        assertTrue(summary("meltFraction") > 0, "melt with water");
        assertTrue(summary("magmaProductionKm3PerYrPerKm") > 0, "a flux gives a magma production");

        WebElement curve = browser.driver.findElement(By.cssSelector("#plots svg path.curve.role-melt"));
        assertTrue(Integer.parseInt(curve.getAttribute("data-points")) >= 20, curve.getAttribute("data-points"));
        List<double[]> v = vertices(curve.getAttribute("d"));
        assertTrue(v.get(v.size() - 1)[1] < v.get(0)[1], "melt fraction rises (upward) with added water");
        assertEquals(1, browser.driver.findElements(By.cssSelector("#plots svg g path.mark")).size()
                - browser.driver.findElements(By.cssSelector("#plots svg .legend path.mark")).size(),
                "the requested water content is marked on the curve");
        assertTrue(text("#plots svg").contains("Bulk water (wt%)"));
        browser.screenshot("subduction");
    }

    @Test
    void midOceanRidgeGivesTheReferenceOnsetAndDrawsPathSolidusLiquidusAndMelting() {
        browser.open(page("ridge"));
        browser.fill("potentialTemperatureC", "1350");
        browser.fill("bulkWaterWtPct", "0");
        browser.fill("fullSpreadingRateMmPerYr", "48");
        assertEquals("done", browser.submit());

        // REFERENCES §2.5 [calc], Katz et al. (2003) dry, Tp = 1350 °C: the solidus is met at 2.661 GPa (about 82 km)
        assertEquals(2.661, summary("column.onset.pressureGPa"), 0.011, "shown to 0.01 GPa");
        assertEquals(82, summary("column.onset.depthKm"), 1.5);
        double crust = summary("crustalThicknessKm");
        // common practice: a normal ridge makes crust of several km (Klein & Langmuir 1987 rule of thumb, REFERENCES §2.5)
        assertTrue(crust > 4 && crust < 12, "crust " + crust);
        // new crust per km of ridge per year = crust thickness × full spreading rate (issue definition)
        assertEquals(crust * 48e-6, summary("meltProductionKm3PerYrPerKm"), 0.00006);

        WebElement diagram = browser.driver.findElement(By.cssSelector("#plots figure:first-child svg"));
        List<String> drawn = new ArrayList<>();
        for (WebElement p : diagram.findElements(By.cssSelector("path.curve"))) {
            drawn.add(p.getAttribute("class").replace("curve role-", ""));
            assertTrue(Integer.parseInt(p.getAttribute("data-points")) >= 10, p.getAttribute("data-series"));
        }
        assertEquals(List.of("solidus", "liquidus", "adiabat", "melting"), drawn);
        String legend = diagram.getText();
        assertTrue(legend.contains("solidus") && legend.contains("liquidus") && legend.contains("melt-free adiabat"), legend);
        assertTrue(legend.contains("Pressure (GPa)"), legend);
        assertEquals(3, browser.driver.findElements(By.cssSelector("#plots svg.plot")).size(),
                "depth–temperature, melt fraction and productivity");
        assertTrue(browser.driver.findElements(By.cssSelector("#plots .plot-note")).isEmpty(),
                "every overlay was drawn");
        browser.screenshot("ridge");
    }

    @Test
    void heatingBudgetMatchesTheEnergyBalanceWorkedByHand() {
        browser.open(page("budget"));
        // the form's defaults: pelitic crust 450 -> 850 °C (its curve gives F = 0.25 at 850 °C),
        // basalt at 1230 °C crystallising wholly over its 1000-1200 °C interval
        assertEquals("done", browser.submit());
        // REFERENCES §3.3: qb = ρb [cb (Tb0 - Tf) + Xb Lb], qc = ρc [cc (Tf - Tc0) + F Lc], hb/hc = qc/qb
        double qb = 2900 * (1100 * (1230 - 850) + 1.0 * 400_000);
        double qc = 2750 * (1050 * (850 - 450) + 0.25 * 280_000);
        assertEquals(25.0, summary("crustMeltFraction"), 0.05);
        assertEquals(qb, summary("heatReleasedJPerM3"), qb * 1e-3, "shown to 4 significant digits");
        assertEquals(qc, summary("heatRequiredJPerM3"), qc * 1e-3);
        assertEquals(qc / qb, summary("basaltToCrustThicknessRatio"), 0.0006);
        // 500 m of intrusion brings hb / (hb/hc) of crust to the target
        assertEquals(500 / (qc / qb), summary("crustThicknessBroughtToTargetM"), 0.6);
        assertTrue(text("#note").contains("lower bound") || text("#note").contains("no-loss") || text("#note").contains("loss"),
                "the no-loss caveat is shown: " + text("#note"));
        browser.screenshot("budget");
    }

    @Test
    void sillModelDrawsCrustalMeltAgainstTimeFromItsSeries() throws Exception {
        browser.open(page("sill"));
        browser.fill("durationKyr", "300");
        browser.fill("outputEveryKyr", "5");
        browser.fill("profileTimesKyr", "0, 50, 150, 300");
        assertEquals("done", browser.submit());
        browser.driver.findElement(By.id("download-json")).click();
        JsonNode json = JSON.readTree(browser.downloaded("tectomelt-sill.json").toFile());
        JsonNode series = json.get("series");
        double peak = 0;
        for (JsonNode p : series) {
            peak = Math.max(peak, p.get("crustMeltThicknessM").asDouble());
        }
        assertTrue(peak > 0, "ten 250 m basalt sills at 1230 °C melt pelitic crust at 450 °C");
        assertEquals(json.at("/summary/peakCrustMeltThicknessM").asDouble(), summary("summary.peakCrustMeltThicknessM"), 0.051);

        WebElement meltPlot = browser.driver.findElement(By.cssSelector("#plots figure[data-plot='Crustal melt against time'] svg"));
        WebElement melt = meltPlot.findElement(By.cssSelector("path.curve.role-melt"));
        assertEquals(String.valueOf(series.size()), melt.getAttribute("data-points"), "one vertex per time of the series");
        assertTrue(meltPlot.getText().contains("Time (kyr)") && meltPlot.getText().contains("Thickness (m)"), meltPlot.getText());
        WebElement profiles = browser.driver.findElement(By.cssSelector("#plots figure[data-plot='Temperature profiles'] svg"));
        assertEquals(4, profiles.findElements(By.cssSelector("path.curve")).size(), "a profile per requested time");
        assertTrue(profiles.getText().contains("150 kyr"), profiles.getText());
        browser.screenshot("sill");
    }

    /** Runs {@code body} (which may await) in the page with the page's modules as {@code plot} and {@code app}. */
    @SuppressWarnings("unchecked")
    private static Map<String, Object> inPage(String body) {
        return (Map<String, Object>) browser.driver.executeAsyncScript(
                "const done = arguments[arguments.length - 1];"
                        + "Promise.all([import('/plot.js'), import('/app.js')]).then(async ([plot, app]) => {"
                        + body + "}).then(done, (e) => done({error: String(e)}));");
    }

    /** The (x, y) pairs of an SVG path's "M x,y L x,y ..." data. */
    private static List<double[]> vertices(String d) {
        List<double[]> out = new ArrayList<>();
        Matcher m = Pattern.compile("[ML](-?[0-9.]+),(-?[0-9.]+)").matcher(d);
        while (m.find()) {
            out.add(new double[] {Double.parseDouble(m.group(1)), Double.parseDouble(m.group(2))});
        }
        return out;
    }

    @Test
    @SuppressWarnings("unchecked")
    void depthPlotsPutDepthDownwardAndDrawLegendLevelsMarksAndGaps() {
        browser.open(page("pressure"));
        Map<String, Object> r = inPage(""
                + "const svg = plot.drawPlot({title: 'Test geotherm', x: {label: 'Temperature', unit: '°C'},"
                + "  y: {label: 'Depth', unit: 'km'}, invertY: true,"
                + "  series: [{label: 'geotherm', role: 'path', points: [[0, 0], [600, 40], [1300, 100]]},"
                + "           {label: 'melting part', role: 'melting', points: [[1200, 50], [NaN, NaN], [1250, 60], [1300, 100]]}],"
                + "  levels: [{y: 40, label: 'Moho'}], marks: [{x: 1000, y: 50, label: 'sample'}]});"
                + "document.body.append(svg);"
                + "const xy = plot.drawPlot({title: 'Test series', x: {label: 'Time', unit: 'kyr'},"
                + "  y: {label: 'Melt', unit: 'm'}, series: [{label: 'melt', role: 'melt', points: [[0, 0], [10, 5]]}]});"
                + "return {paths: [...svg.querySelectorAll('path.curve')].map((p) => p.getAttribute('d')),"
                + "  legend: [...svg.querySelectorAll('.legend-text')].map((t) => t.textContent),"
                + "  axes: [...svg.querySelectorAll('.axis-title')].map((t) => t.textContent),"
                + "  levels: [...svg.querySelectorAll('.level-label')].map((t) => t.textContent),"
                + "  marks: svg.querySelectorAll('path.mark').length,"
                + "  xyPath: xy.querySelector('path.curve').getAttribute('d')};");
        assertEquals(null, r.get("error"));
        List<String> paths = (List<String>) r.get("paths");
        assertEquals(2, paths.size());
        List<double[]> geotherm = vertices(paths.get(0));
        assertEquals(3, geotherm.size());
        assertTrue(geotherm.get(1)[1] > geotherm.get(0)[1] && geotherm.get(2)[1] > geotherm.get(1)[1],
                "deeper is lower on the page: " + paths.get(0));
        assertTrue(geotherm.get(2)[0] > geotherm.get(0)[0], "hotter is to the right");
        assertEquals(2, paths.get(1).chars().filter(c -> c == 'M').count(), "a gap breaks the curve: " + paths.get(1));
        assertEquals(List.of("geotherm", "melting part", "sample"), r.get("legend"));
        assertEquals(List.of("Temperature (°C)", "Depth (km) ↓"), r.get("axes"));
        assertEquals(List.of("Moho"), r.get("levels"));
        assertEquals(2L, ((Number) r.get("marks")).longValue(), "the mark and its legend entry");
        List<double[]> xy = vertices((String) r.get("xyPath"));
        assertTrue(xy.get(1)[1] < xy.get(0)[1], "an ordinary plot has its y axis upward");
    }

    @Test
    void csvFlattensTheTableAndCurlQuotesForTheShell() throws Exception {
        browser.open(page("pressure"));
        Map<String, Object> r = inPage(""
                + "return {table: app.toCsv({table: ['column.profile', 'profile']},"
                + "    {profile: [{depthKm: 1, onset: {t: 2}}, {depthKm: 2.5, note: 'a,\"b\"'}]}),"
                + "  scalars: app.toCsv({table: ['profile']}, {meltFraction: 0.12, waterSaturated: false, models: [{id: 'x'}]}),"
                + "  curl: app.curlCommand('http://127.0.0.1:9/v1/x', {lithology: \"it's $HOME\"}, true),"
                + "  paths: [...app.specPaths('paths:\\n  /v1/a:\\n    post: {}\\n  /v1/b:\\n    get: {}\\ncomponents:\\n  /v1/c:\\n')],"
                + "  fmt: [app.fmt(1234.5678, 1), app.fmt(2.5e9, 3), app.fmt(0, 2)]};");
        assertEquals(null, r.get("error"));
        assertEquals("depthKm,onset.t,note\n1,2,\n2.5,,\"a,\"\"b\"\"\"\n", r.get("table"));
        assertEquals("field,value\nmeltFraction,0.12\nwaterSaturated,false\n", r.get("scalars"));
        assertEquals(List.of("/v1/a", "/v1/b"), r.get("paths"));
        assertEquals(List.of("1234.6", "2.500e+9", "0.00"), r.get("fmt"));
        // the copied command, run by bash with curl replaced by a function that prints its arguments
        ProcessBuilder pb = new ProcessBuilder("bash", "-c",
                "curl() { printf '%s\\n' \"$@\"; }\n" + r.get("curl"));
        pb.environment().put("TECTOMELT_TOKEN", "tok-1");
        Process proc = pb.redirectErrorStream(true).start();
        List<String> args = List.of(new String(proc.getInputStream().readAllBytes(), StandardCharsets.UTF_8).split("\n"));
        assertEquals(0, proc.waitFor());
        assertTrue(args.contains("Authorization: Bearer tok-1"), args.toString());
        assertTrue(args.contains("{\"lithology\":\"it's $HOME\"}"), "the body reaches curl unchanged: " + args);
        assertTrue(args.contains("http://127.0.0.1:9/v1/x"), args.toString());
    }

    @Test
    void theTokenStaysInTheTabAndIsSentAsABearerHeader() throws Exception {
        AtomicReference<String> seen = new AtomicReference<>();
        List<Route> routes = new ArrayList<>();
        for (Route r : App.routes(Config.defaults())) {
            routes.add(r.path().equals("/v1/pressure")
                    ? Route.post(r.path(), ctx -> {
                        seen.set(ctx.header("Authorization"));
                        r.handler().handle(ctx);
                    })
                    : r);
        }
        Javalin app = App.create(Config.defaults().withPort(0), RequestObserver.NONE, routes).start("127.0.0.1", 0);
        try {
            browser.open("http://127.0.0.1:" + app.port() + "/#pressure");
            browser.driver.findElement(By.id("token")).sendKeys("lab-token-7");
            browser.driver.findElement(By.cssSelector("#token-form button[type='submit']")).click();
            assertEquals("lab-token-7", browser.js("return sessionStorage.getItem('tectomelt.token')"));
            assertEquals("", browser.driver.findElement(By.id("token")).getAttribute("value"), "the box does not keep showing it");
            assertEquals("done", browser.submit());
            assertEquals("Bearer lab-token-7", seen.get());
            browser.driver.findElement(By.id("copy-curl")).click();
            String command = browser.driver.findElement(By.id("curl-text")).getAttribute("value");
            assertTrue(command.contains("Bearer $TECTOMELT_TOKEN"), command);
            assertFalse(command.contains("lab-token-7"), "the token itself is never copied");

            browser.driver.findElement(By.id("token-clear")).click();
            assertEquals(null, browser.js("return sessionStorage.getItem('tectomelt.token')"));
            assertEquals("done", browser.submit());
            assertEquals(null, seen.get());
        } finally {
            browser.js("sessionStorage.clear()");
            app.stop();
        }
    }
}
