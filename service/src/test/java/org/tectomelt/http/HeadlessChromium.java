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
