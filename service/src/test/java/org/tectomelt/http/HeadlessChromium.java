package org.tectomelt.http;

import java.io.File;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.Comparator;
import java.util.Map;
import java.util.stream.Stream;
import org.openqa.selenium.By;
import org.openqa.selenium.Dimension;
import org.openqa.selenium.JavascriptExecutor;
import org.openqa.selenium.OutputType;
import org.openqa.selenium.WebElement;
import org.openqa.selenium.chrome.ChromeDriver;
import org.openqa.selenium.chrome.ChromeDriverService;
import org.openqa.selenium.chrome.ChromeOptions;
import org.openqa.selenium.support.ui.ExpectedConditions;
import org.openqa.selenium.support.ui.WebDriverWait;

/**
 * Debian's Chromium, headless, driven by Selenium through the system chromedriver (no driver or
 * browser is downloaded). Paths can be changed with {@code -Dtectomelt.chromium=...} and
 * {@code -Dtectomelt.chromedriver=...}. Each instance has a fresh profile and download folder.
 */
final class HeadlessChromium implements AutoCloseable {

    /** Where screenshots go, for people to look at after a run. */
    static final Path SCREENSHOTS = Path.of("target", "browser");

    final ChromeDriver driver;
    final Path downloads;
    private final Path profile;

    HeadlessChromium() {
        try {
            profile = Files.createTempDirectory("tectomelt-chromium-profile");
            downloads = Files.createTempDirectory("tectomelt-chromium-downloads");
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
        ChromeOptions options = new ChromeOptions();
        options.setBinary(System.getProperty("tectomelt.chromium", "/usr/bin/chromium"));
        // the flags this machine needs: no sandbox as root, and no background traffic to a closed network
        options.addArguments("--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run",
                "--disable-background-networking", "--disable-component-update", "--disable-sync",
                "--disable-dev-shm-usage", "--window-size=1400,1500", "--user-data-dir=" + profile);
        options.setExperimentalOption("prefs", Map.of(
                "download.default_directory", downloads.toString(),
                "download.prompt_for_download", false));
        ChromeDriverService service = new ChromeDriverService.Builder()
                .usingDriverExecutable(new File(System.getProperty("tectomelt.chromedriver", "/usr/bin/chromedriver")))
                .usingAnyFreePort()
                .build();
        driver = new ChromeDriver(service, options);
        driver.manage().timeouts().scriptTimeout(Duration.ofSeconds(20));
    }

    /** Loads {@code url} afresh (not a same-page hash change) and waits until the page has loaded its configuration. */
    void open(String url) {
        driver.get("about:blank");
        driver.get(url);
        waitFor(By.cssSelector("body[data-ready='true']"));
    }

    WebElement waitFor(By by) {
        return new WebDriverWait(driver, Duration.ofSeconds(30)).until(ExpectedConditions.presenceOfElementLocated(by));
    }

    Object js(String script, Object... args) {
        return ((JavascriptExecutor) driver).executeScript(script, args);
    }

    /** Replaces the text of the visible form control for API field {@code name}. */
    void fill(String name, String value) {
        WebElement input = driver.findElement(By.cssSelector(".field:not([hidden]) [name='" + name + "']"));
        input.clear();
        input.sendKeys(value);
    }

    /** Clicks "Calculate" and waits until the results are drawn or the request failed. */
    String submit() {
        js("document.getElementById('results').removeAttribute('data-state')");
        driver.findElement(By.id("run")).click();
        new WebDriverWait(driver, Duration.ofSeconds(60)).until(d -> {
            Object s = js("return document.getElementById('results').dataset.state");
            return "done".equals(s) || "failed".equals(s) ? s : null;
        });
        return (String) js("return document.getElementById('results').dataset.state");
    }

    /** Saves a PNG of the whole page (the window grown to the page's height) under target/browser/. */
    Path screenshot(String name) {
        Dimension window = driver.manage().window().getSize();
        try {
            long height = ((Number) js("return Math.ceil(document.documentElement.scrollHeight)")).longValue();
            driver.manage().window().setSize(new Dimension(window.getWidth(), (int) Math.min(Math.max(height, 600), 8000)));
            Files.createDirectories(SCREENSHOTS);
            Path file = SCREENSHOTS.resolve(name + ".png");
            Files.write(file, driver.getScreenshotAs(OutputType.BYTES));
            return file;
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        } finally {
            driver.manage().window().setSize(window);
        }
    }

    /** Sets the window's inner size (CSS pixels), e.g. a phone's 390 px width. */
    void resize(int width, int height) {
        driver.manage().window().setSize(new Dimension(width, height));
    }

    /** Shows the page as printed ("print"), or as the output medium says ("": no override). */
    void emulateMedia(String media) {
        driver.executeCdpCommand("Emulation.setEmulatedMedia", Map.of("media", media));
    }

    /** The page printed to PDF (A4, the page's own print stylesheet), also saved under target/browser/. */
    byte[] printToPdf(String name) {
        Map<String, Object> out = driver.executeCdpCommand("Page.printToPDF",
                Map.of("paperWidth", 8.27, "paperHeight", 11.69, "printBackground", true));
        byte[] pdf = java.util.Base64.getDecoder().decode((String) out.get("data"));
        try {
            Files.createDirectories(SCREENSHOTS);
            Files.write(SCREENSHOTS.resolve(name + ".pdf"), pdf);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
        return pdf;
    }

    /**
     * Runs the axe-core accessibility engine (the script shipped in the com.deque.html.axe-core
     * test dependency) on the page as it is and returns its violations: {id, impact, help, nodes}.
     */
    @SuppressWarnings("unchecked")
    java.util.List<Map<String, Object>> axeViolations() {
        String axe;
        try (var in = HeadlessChromium.class.getResourceAsStream("/axe.min.js")) {
            if (in == null) {
                throw new IllegalStateException("axe.min.js is not on the test class path");
            }
            axe = new String(in.readAllBytes(), java.nio.charset.StandardCharsets.UTF_8);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
        js(axe);
        Object r = driver.executeAsyncScript("const done = arguments[arguments.length - 1];"
                + "axe.run(document, {resultTypes: ['violations']}).then((res) => done(res.violations.map((v) => ({"
                + "  id: v.id, impact: v.impact, help: v.help,"
                + "  nodes: v.nodes.slice(0, 5).map((n) => n.target.join(' '))}))), (e) => done([{id: 'axe-error', impact: 'critical', help: String(e)}]));");
        return (java.util.List<Map<String, Object>>) r;
    }

    /** Removes an earlier download called {@code fileName}, so the next one keeps that name. */
    void forgetDownload(String fileName) {
        try {
            Files.deleteIfExists(downloads.resolve(fileName));
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /** Waits for a finished download called {@code fileName} and returns its path. */
    Path downloaded(String fileName) {
        Path file = downloads.resolve(fileName);
        new WebDriverWait(driver, Duration.ofSeconds(20)).until(d -> Files.isRegularFile(file)
                && !Files.exists(downloads.resolve(fileName + ".crdownload")));
        return file;
    }

    @Override
    public void close() {
        try {
            driver.quit();
        } finally {
            deleteQuietly(profile);
            deleteQuietly(downloads);
        }
    }

    private static void deleteQuietly(Path dir) {
        try (Stream<Path> files = Files.walk(dir)) {
            files.sorted(Comparator.reverseOrder()).forEach(p -> p.toFile().delete());
        } catch (IOException ignored) {
            // a temporary folder left behind is harmless
        }
    }
}
