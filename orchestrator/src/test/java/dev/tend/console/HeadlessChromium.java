package dev.tend.console;

import org.openqa.selenium.OutputType;
import org.openqa.selenium.chrome.ChromeDriver;
import org.openqa.selenium.chrome.ChromeDriverService;
import org.openqa.selenium.chrome.ChromeOptions;

import java.io.File;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;

/**
 * Debian's chromium driven headless through Debian's chromedriver, both at fixed paths, so
 * that Selenium never looks for or downloads a browser or a driver of its own. A fresh
 * profile in a temporary folder each time. When either binary is missing this fails (it
 * does not skip) and says how to install them.
 */
final class HeadlessChromium implements AutoCloseable {
    static final Path BROWSER = Path.of("/usr/bin/chromium");
    static final Path DRIVER = Path.of("/usr/bin/chromedriver");
    /** Set to a folder to keep a screenshot of each page (while working on the layout; never committed). */
    static final String SCREENSHOTS = "tend.console.screenshots";

    private final ChromeDriver driver;

    private HeadlessChromium(Path profile) {
        // Selenium Manager is never wanted here: the driver path is explicit, and offline if it ran anyway
        System.setProperty("SE_OFFLINE", "true");
        ChromeOptions options = new ChromeOptions();
        options.setBinary(BROWSER.toFile());
        options.addArguments("--headless=new", "--no-sandbox", "--disable-gpu", "--disable-dev-shm-usage", "--disable-quic",
                "--no-first-run", "--disable-background-networking", "--disable-component-update", "--disable-sync",
                "--window-size=1360,1000", "--user-data-dir=" + profile.toAbsolutePath());
        ChromeDriverService service = new ChromeDriverService.Builder().usingDriverExecutable(DRIVER.toFile())
                .usingAnyFreePort().withLogOutput(java.io.OutputStream.nullOutputStream()).build();
        driver = new ChromeDriver(service, options);
        driver.manage().timeouts().scriptTimeout(Duration.ofSeconds(20));
    }

    /** Starts a browser with a profile under {@code dir}; fails with install instructions when Chromium is missing. */
    static HeadlessChromium start(Path dir) {
        if (!Files.isExecutable(BROWSER) || !Files.isExecutable(DRIVER)) {
            throw new AssertionError("the console's end-to-end test needs Debian's Chromium and its driver at " + BROWSER
                    + " and " + DRIVER + "; install them with `apt-get update && apt-get install -y chromium chromium-driver`"
                    + " (.ci/run does this in CI)");
        }
        try {
            return new HeadlessChromium(Files.createDirectories(dir.resolve("chromium-profile")));
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    ChromeDriver driver() {
        return driver;
    }

    /** Saves a screenshot of the page as NAME.png when {@link #SCREENSHOTS} names a folder; otherwise nothing. */
    void screenshot(String name) {
        String folder = System.getProperty(SCREENSHOTS);
        if (folder == null || folder.isBlank()) return;
        try {
            File shot = driver.getScreenshotAs(OutputType.FILE);
            Path out = Files.createDirectories(Path.of(folder)).resolve(name + ".png");
            Files.copy(shot.toPath(), out, java.nio.file.StandardCopyOption.REPLACE_EXISTING);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    @Override
    public void close() {
        driver.quit();
    }
}
