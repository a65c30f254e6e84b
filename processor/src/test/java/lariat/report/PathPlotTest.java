package lariat.report;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.ByteArrayInputStream;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;
import javax.xml.parsers.DocumentBuilderFactory;
import org.junit.jupiter.api.Test;
import org.w3c.dom.Document;
import org.w3c.dom.Element;
import org.w3c.dom.NodeList;

class PathPlotTest {

    static Document parse(String svg) throws Exception {
        DocumentBuilderFactory f = DocumentBuilderFactory.newInstance();
        f.setNamespaceAware(true);
        return f.newDocumentBuilder().parse(new ByteArrayInputStream(svg.getBytes(StandardCharsets.UTF_8)));
    }

    static List<String> legendNames(Document doc) {
        List<String> out = new ArrayList<>();
        NodeList groups = doc.getElementsByTagNameNS("http://www.w3.org/2000/svg", "g");
        for (int i = 0; i < groups.getLength(); i++) {
            Element g = (Element) groups.item(i);
            if (g.getAttribute("class").equals("legend-entry")) {
                out.add(g.getElementsByTagNameNS("http://www.w3.org/2000/svg", "text").item(0).getTextContent());
            }
        }
        return out;
    }

    @Test
    void toSvg_threeFeaturesOneAlwaysZero_wellFormedWithLegendPerPlottedFeature() throws Exception {
        double[] rel = {1, 0.6, 0.2, 0};
        double[][] values = {{0, 1, 2, 3}, {0, 0, 0, 0}, {0, 0, -0.5, -1.25}};
        PathPlot plot = PathPlot.of("paths <of> y & z", "raw", rel, List.of("a<b", "never", "c&d"), values);
        Document doc = parse(plot.toSvg());
        assertEquals("svg", doc.getDocumentElement().getLocalName());
        assertEquals(List.of("a<b", "c&d"), legendNames(doc));
        assertEquals(List.of("a<b", "c&d"), plot.plottedFeatures());
        NodeList lines = doc.getElementsByTagNameNS("http://www.w3.org/2000/svg", "polyline");
        assertEquals(2, lines.getLength());
        String all = doc.getDocumentElement().getTextContent();
        assertTrue(all.contains("relative penalty") && all.contains("coefficient (raw)"), all);
    }

    @Test
    void of_increasingPenalties_isRefused() {
        assertThrows(IllegalArgumentException.class,
                () -> PathPlot.of("t", "raw", new double[] {0.5, 1}, List.of("a"), new double[][] {{0, 1}}));
    }

    @Test
    void axisTicks_unitRange_niceStepsCoverRange() {
        AxisTicks t = AxisTicks.of(-0.13, 2.7, 6);
        assertTrue(t.low() <= -0.13 && t.high() >= 2.7);
        assertEquals(0.5, t.value(1) - t.value(0), 1e-12);
        assertEquals("-0.5", t.label(0));
        assertEquals("3.0", t.label(t.count() - 1));
    }
}
