package lariat.report.demo;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;

/**
 * Writes a {@link DemoReport} into a folder: {@code index.html}, one self-contained page with inline
 * SVG plots (no scripts, no network), and {@code report.json}, the same data. The output is a pure
 * function of the report value: the same value gives the same bytes.
 */
public final class DemoReportWriter {

    public static final String HTML_FILE = "index.html";
    public static final String JSON_FILE = "report.json";

    private DemoReportWriter() {
    }

    /**
     * Creates {@code dir} if needed and writes both files, replacing earlier ones.
     *
     * @return the path of {@code index.html}
     * @throws IllegalArgumentException if {@code dir} names an existing regular file
     * @throws IOException              if the folder or a file cannot be written
     */
    public static Path write(DemoReport report, Path dir) throws IOException {
        if (Files.isRegularFile(dir)) {
            throw new IllegalArgumentException("dir must be a folder, got the file " + dir);
        }
        Files.createDirectories(dir);
        Path html = dir.resolve(HTML_FILE);
        Files.writeString(html, html(report), StandardCharsets.UTF_8);
        Files.writeString(dir.resolve(JSON_FILE), json(report), StandardCharsets.UTF_8);
        return html;
    }

    /** The page as text. */
    public static String html(DemoReport report) {
        return HtmlPage.render(report);
    }

    /** The JSON document as text. */
    public static String json(DemoReport report) {
        return ReportJson.render(report);
    }
}
