package lariat.it.demo;

import java.awt.image.BufferedImage;
import java.io.File;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.TimeUnit;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

import javax.imageio.ImageIO;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * The demo command, shortened (60 s, 5 stations: four with injected changes, one without), run as
 * a child JVM exactly as a user runs it, on its own embedded broker: it must exit 0, alert every
 * injected change, raise no alert on the unchanged station and write index.html and report.json;
 * the page must open in headless Chromium (Debian's chromium package, installed by .ci/run)
 * without console messages, and its plots must draw: the DOM holds SVGs of positive size and a
 * screenshot holds ink.
 */
class DemoIT {

    private static final String CHROMIUM = "/usr/bin/chromium";
    private static final long TIMEOUT_S = 150;
    /** Share of non-white pixels a page of tables and plots has at least (judged from screenshots). */
    private static final double MIN_INK = 0.01;

    @TempDir
    static Path tmp;

    private static int exitCode;
    private static String console;
    private static Path reportDir;

    @BeforeAll
    static void runDemo() throws IOException, InterruptedException {
        reportDir = tmp.resolve("report");
        Path log = tmp.resolve("demo.log");
        String java = Path.of(System.getProperty("java.home"), "bin", "java").toString();
        ProcessBuilder pb = new ProcessBuilder(java, "-Xmx512m", "-cp", System.getProperty("java.class.path"),
                "lariat.cli.Main", "demo", "--duration", "60s", "--stations", "5", "--report", reportDir.toString())
                .redirectErrorStream(true).redirectOutput(log.toFile());
        Process p = pb.start();
        if (!p.waitFor(TIMEOUT_S, TimeUnit.SECONDS)) {
            p.destroyForcibly();
            throw new AssertionError("demo did not finish within " + TIMEOUT_S + " s; log: " + Files.readString(log));
        }
        exitCode = p.exitValue();
        console = Files.readString(log, StandardCharsets.UTF_8);
    }

    @Test
    void demo_shortRun_exitsZeroAndWritesBothFiles() {
        assertEquals(0, exitCode, console);
        assertTrue(Files.isRegularFile(reportDir.resolve("index.html")), console);
        assertTrue(Files.isRegularFile(reportDir.resolve("report.json")), console);
    }

    @Test
    void demo_shortRun_everyInjectedChangeAlertedAndNoAlertOnUnchangedStation() throws IOException {
        JsonNode report = new ObjectMapper().readTree(reportDir.resolve("report.json").toFile());
        int changes = 0;
        int unchanged = 0;
        for (JsonNode s : report.get("stations")) {
            String name = s.get("station").asText();
            if (s.get("changes").isEmpty()) {
                unchanged++;
                assertEquals(0, s.get("alerts").size(), name + " has no injected change but alerted: " + s.get("alerts"));
            }
            for (JsonNode d : s.get("detection")) {
                changes++;
                assertTrue(d.get("detected").asBoolean(), name + ": " + d.get("change").asText() + " not alerted");
            }
            assertFalse(s.get("versions").isEmpty(), name + " has no published version");
        }
        assertEquals(5, changes, "the default plan injects five changes into stations 0 to 3");
        assertEquals(1, unchanged, "station 4 has no injected change");
    }

    @Test
    void demo_console_plainLinesWithinEightyColumnsAndCaution() {
        for (String line : console.split("\n")) {
            assertFalse(line.contains("\r") || line.contains("\u001b"), "control characters off a terminal: " + line);
        }
        assertTrue(console.contains("statistical association, not cause"), console);
        assertTrue(console.contains("Detected 5 of 5 injected changes"), console);
        Pattern versionLine = Pattern.compile("(?m)^v\\d+ .*$");
        Matcher m = versionLine.matcher(console);
        int versions = 0;
        while (m.find()) {
            versions++;
            assertTrue(m.group().length() <= 79, "wider than 80 columns: " + m.group());
        }
        assertTrue(versions > 0, "no version line in: " + console);
    }

    @Test
    void report_inHeadlessChromium_noConsoleMessagesAndPlotsDrawn() throws IOException, InterruptedException {
        if (!new File(CHROMIUM).canExecute()) {
            throw new AssertionError(CHROMIUM + " is missing: install Debian's chromium package "
                    + "(apt-get install -y chromium; .ci/run does this)");
        }
        Path html = reportDir.resolve("index.html");
        Path shot = tmp.resolve("page.png");
        Chromium dom = chromium(List.of("--dump-dom", html.toUri().toString()));
        Chromium png = chromium(List.of("--screenshot=" + shot, "--window-size=900,2400", html.toUri().toString()));
        for (Chromium c : List.of(dom, png)) {
            assertEquals(0, c.exit, c.stderr);
            for (String line : c.stderr.split("\n")) {
                assertFalse(line.contains(":CONSOLE") || line.contains("Uncaught"), "console message: " + line);
            }
        }
        Matcher svg = Pattern.compile("<svg[^>]*\\swidth=\"([0-9.]+)\"[^>]*\\sheight=\"([0-9.]+)\"").matcher(dom.stdout);
        int svgs = 0;
        while (svg.find()) {
            svgs++;
            assertTrue(Double.parseDouble(svg.group(1)) > 0 && Double.parseDouble(svg.group(2)) > 0, svg.group());
        }
        assertEquals(10, svgs, "a path plot and a timeline for each of 5 stations");
        BufferedImage image = ImageIO.read(shot.toFile());
        long ink = 0;
        for (int y = 0; y < image.getHeight(); y++) {
            for (int x = 0; x < image.getWidth(); x++) {
                if ((image.getRGB(x, y) & 0xffffff) != 0xffffff) {
                    ink++;
                }
            }
        }
        assertTrue(ink > MIN_INK * image.getWidth() * image.getHeight(), "screenshot nearly blank: " + ink + " pixels");
    }

    private static final class Chromium {
        int exit;
        String stdout;
        String stderr;
    }

    private static Chromium chromium(List<String> args) throws IOException, InterruptedException {
        Path profile = Files.createTempDirectory(tmp, "chromium-profile");
        List<String> cmd = new ArrayList<>(List.of(CHROMIUM, "--headless", "--no-sandbox", "--disable-gpu",
                "--disable-quic", "--no-first-run", "--disable-background-networking", "--disable-component-update",
                "--disable-sync", "--user-data-dir=" + profile, "--enable-logging=stderr", "--v=0"));
        cmd.addAll(args);
        Path out = Files.createTempFile(tmp, "chromium", ".out");
        Path err = Files.createTempFile(tmp, "chromium", ".err");
        Process p = new ProcessBuilder(cmd).redirectOutput(out.toFile()).redirectError(err.toFile()).start();
        if (!p.waitFor(60, TimeUnit.SECONDS)) {
            p.destroyForcibly();
            throw new AssertionError("chromium did not finish within 60 s: " + cmd);
        }
        Chromium c = new Chromium();
        c.exit = p.exitValue();
        c.stdout = Files.readString(out, StandardCharsets.UTF_8);
        c.stderr = Files.readString(err, StandardCharsets.UTF_8);
        return c;
    }
}
