package lariat.report.demo;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.ByteArrayInputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import javax.xml.parsers.DocumentBuilderFactory;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.w3c.dom.Document;
import org.w3c.dom.Element;
import org.w3c.dom.NodeList;

/** The page is checked with the JDK's XML parser (javax.xml) as the reference for well-formedness. */
class DemoReportWriterTest {

    private static final String SVG_NS = "http://www.w3.org/2000/svg";
    private static final String XHTML_NS = "http://www.w3.org/1999/xhtml";
    /** Pixel coordinates are written with one decimal. */
    private static final double PIXEL_TOL = 0.051;

    @TempDir
    Path dir;

    @Test
    void write_defaultScenario_pageIsXmlWithOnePathPlotAndOneTimelinePerStation() throws Exception {
        DemoReport report = DemoReportFixture.report();
        Path html = DemoReportWriter.write(report, dir);
        assertEquals(dir.resolve("index.html"), html);
        Document doc = parse(Files.readAllBytes(html));
        NodeList sections = doc.getElementsByTagNameNS(XHTML_NS, "section");
        assertEquals(report.stations().size(), sections.getLength());
        for (int i = 0; i < sections.getLength(); i++) {
            Element section = (Element) sections.item(i);
            assertEquals(report.stations().get(i).station(), section.getAttribute("id"));
            List<String> classes = new ArrayList<>();
            NodeList svgs = section.getElementsByTagNameNS(SVG_NS, "svg");
            for (int k = 0; k < svgs.getLength(); k++) {
                classes.add(((Element) svgs.item(k)).getAttribute("class"));
            }
            assertEquals(List.of("path-plot", "timeline"), classes);
        }
    }

    @Test
    void html_eachSvgAlone_parsesAsXml() throws Exception {
        String page = DemoReportWriter.html(DemoReportFixture.report());
        Matcher m = Pattern.compile("<svg .*?</svg>", Pattern.DOTALL).matcher(page);
        int count = 0;
        while (m.find()) {
            Document svg = parse(m.group().getBytes(StandardCharsets.UTF_8));
            assertEquals(SVG_NS, svg.getDocumentElement().getNamespaceURI());
            assertTrue(Double.parseDouble(svg.getDocumentElement().getAttribute("width")) > 0);
            assertTrue(Double.parseDouble(svg.getDocumentElement().getAttribute("height")) > 0);
            count++;
        }
        assertEquals(2 * DemoReportFixture.SPEC.stations(), count);
    }

    @Test
    void html_selfContained_noScriptsNoExternalResources() {
        String page = DemoReportWriter.html(DemoReportFixture.report());
        assertFalse(page.contains("<script"));
        assertFalse(page.contains("src="));
        assertFalse(page.contains("href"));
        assertFalse(page.contains("url("));
        assertEquals(page.replace(SVG_NS, "").replace(XHTML_NS, "").indexOf("http"), -1);
        assertTrue(page.contains(HtmlPage.CAUTION.replace("'", "&#39;")));
        assertTrue(page.contains("Lariat demo &lt;test&gt; &amp; report"));
    }

    @Test
    void pathPlot_series_oneLinePerChannelOnePointPerKnotStartingAtZero() throws Exception {
        StationReport s = DemoReportFixture.report().stations().get(0);
        Document svg = parse(PathPlot.draw(s).getBytes(StandardCharsets.UTF_8));
        NodeList lines = svg.getElementsByTagNameNS(SVG_NS, "polyline");
        List<String> channels = PathPlot.channelsByEntry(s.path());
        assertEquals(s.versions().get(s.versions().size() - 1).coefficients().size(), channels.size());
        assertEquals(channels.size(), lines.getLength());
        double zeroY = Double.NaN;
        for (int i = 0; i < lines.getLength(); i++) {
            Element line = (Element) lines.item(i);
            assertEquals(channels.get(i), line.getAttribute("data-channel"));
            String[] pts = line.getAttribute("points").split(" ");
            assertEquals(s.path().size(), pts.length);
            double y0 = Double.parseDouble(pts[0].split(",")[1]);
            if (i == 0) {
                zeroY = y0;
            }
            assertEquals(zeroY, y0, PIXEL_TOL);
            double yEnd = Double.parseDouble(pts[pts.length - 1].split(",")[1]);
            double last = s.path().get(s.path().size() - 1).coefficient(channels.get(i));
            assertEquals(last > 0, yEnd < zeroY, channels.get(i));
        }
    }

    @Test
    void timeline_marks_oneBarPerActiveChannelPerVersionOneLinePerChangeOneMarkerPerAlert() throws Exception {
        for (StationReport s : DemoReportFixture.report().stations()) {
            Document svg = parse(TimelinePlot.draw(s).getBytes(StandardCharsets.UTF_8));
            int bars = s.versions().stream().mapToInt(v -> v.coefficients().size()).sum();
            assertEquals(bars, svg.getElementsByTagNameNS(SVG_NS, "rect").getLength());
            int changeLines = 0;
            NodeList lines = svg.getElementsByTagNameNS(SVG_NS, "line");
            for (int i = 0; i < lines.getLength(); i++) {
                if (Svg.CHANGE.equals(((Element) lines.item(i)).getAttribute("stroke"))) {
                    changeLines++;
                }
            }
            assertEquals(s.changes().size(), changeLines);
            assertEquals(s.alerts().size(), svg.getElementsByTagNameNS(SVG_NS, "path").getLength());
        }
    }

    @Test
    void json_written_holdsSameStationsVersionsAndDetection() throws Exception {
        DemoReport report = DemoReportFixture.report();
        DemoReportWriter.write(report, dir);
        JsonNode root = new ObjectMapper().readTree(dir.resolve("report.json").toFile());
        assertEquals(HtmlPage.CAUTION, root.get("caution").textValue());
        assertEquals(report.stations().size(), root.get("stations").size());
        for (int i = 0; i < report.stations().size(); i++) {
            StationReport s = report.stations().get(i);
            JsonNode n = root.get("stations").get(i);
            assertEquals(s.station(), n.get("station").textValue());
            assertEquals(s.versions().size(), n.get("versions").size());
            assertEquals(s.path().size(), n.get("path").size());
            assertEquals(s.changes().size(), n.get("changes").size());
            assertEquals(s.alerts().size(), n.get("alerts").size());
            VersionSummary last = s.versions().get(s.versions().size() - 1);
            JsonNode lastJson = n.get("versions").get(s.versions().size() - 1);
            for (Map.Entry<String, Double> e : last.coefficients().entrySet()) {
                assertEquals(e.getValue(), lastJson.get("coefficients").get(e.getKey()).doubleValue());
            }
            for (JsonNode d : n.get("detection")) {
                assertTrue(d.get("detected").booleanValue(), s.station());
                assertTrue(d.get("delay_ms").longValue() >= 0);
            }
            assertEquals(0, n.get("other_alerts").intValue());
        }
    }

    @Test
    void write_twice_sameBytes() throws Exception {
        DemoReportWriter.write(DemoReportFixture.report(), dir.resolve("a"));
        DemoReportWriter.write(DemoReportFixture.report(), dir.resolve("b"));
        for (String f : List.of(DemoReportWriter.HTML_FILE, DemoReportWriter.JSON_FILE)) {
            assertArrayEquals(Files.readAllBytes(dir.resolve("a").resolve(f)), Files.readAllBytes(dir.resolve("b").resolve(f)));
        }
    }

    @Test
    void write_emptyStation_stillDrawsBothPlots() throws Exception {
        StationReport empty = StationReport.of("idle-01", List.of(), List.of(), Double.NaN, List.of(), List.of());
        Document doc = parse(DemoReportWriter.html(DemoReport.of("t", "", List.of(empty)))
                .getBytes(StandardCharsets.UTF_8));
        assertEquals(2, doc.getElementsByTagNameNS(SVG_NS, "svg").getLength());
    }

    @Test
    void values_badInput_throwNamingTheArgument() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> PathPoint.of(1.5, Map.of()));
        assertTrue(e.getMessage().contains("relativePenalty"));
        e = assertThrows(IllegalArgumentException.class,
                () -> VersionSummary.of(1, 0, 10, Map.of("flow_m3h", Double.NaN), 0.5));
        assertTrue(e.getMessage().contains("flow_m3h"));
        assertThrows(IllegalArgumentException.class, () -> VersionSummary.of(1, 10, 0, Map.of(), 0.5));
        StationReport s = StationReport.of("a-01", List.of(), List.of(), Double.NaN, List.of(), List.of());
        assertThrows(IllegalArgumentException.class, () -> DemoReport.of("t", "", List.of(s, s)));
    }

    private static Document parse(byte[] xml) throws Exception {
        DocumentBuilderFactory f = DocumentBuilderFactory.newInstance();
        f.setNamespaceAware(true);
        f.setFeature("http://apache.org/xml/features/disallow-doctype-decl", false);
        f.setFeature("http://apache.org/xml/features/nonvalidating/load-external-dtd", false);
        return f.newDocumentBuilder().parse(new ByteArrayInputStream(xml));
    }
}
