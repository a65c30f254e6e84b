package lariat.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Iterator;
import java.util.List;
import java.util.Locale;
import java.util.Random;
import javax.xml.parsers.DocumentBuilderFactory;
import org.apache.avro.Schema;
import org.apache.avro.SchemaBuilder;
import org.apache.avro.file.DataFileWriter;
import org.apache.avro.generic.GenericData;
import org.apache.avro.generic.GenericDatumWriter;
import org.apache.avro.generic.GenericRecord;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.w3c.dom.Document;
import org.w3c.dom.Element;
import org.w3c.dom.NodeList;
import picocli.CommandLine;

/** The {@code fit} command end to end, run in-process through {@link Main}'s command line. */
class FitCommandTest {

    static final String[] NAMES = {"bmi", "hdl", "age", "noise", "y"};

    @TempDir
    Path dir;

    /** Exit code, standard output and standard error of one run. */
    record Run(int code, String out, String err) {
    }

    static Run run(String... args) {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        CommandLine cl = new CommandLine(new Main());
        cl.setOut(new PrintWriter(out));
        cl.setErr(new PrintWriter(err));
        int code = cl.execute(args);
        return new Run(code, out.toString(), err.toString());
    }

    /** y = 1 + 2 bmi − 1.5 hdl + 0.3 age + N(0, 0.25) with one pure-noise column. */
    static double[][] rows(long seed, int n) {
        Random rnd = new Random(seed);
        double[][] r = new double[n][5];
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < 4; j++) {
                r[i][j] = rnd.nextGaussian();
            }
            r[i][4] = 1 + 2 * r[i][0] - 1.5 * r[i][1] + 0.3 * r[i][2] + 0.5 * rnd.nextGaussian();
        }
        return r;
    }

    Path csv(String name, double[][] rows) throws IOException {
        StringBuilder b = new StringBuilder(String.join(",", NAMES)).append('\n');
        for (double[] r : rows) {
            for (int j = 0; j < r.length; j++) {
                b.append(j == 0 ? "" : ",").append(String.format(Locale.ROOT, "%.17g", r[j]));
            }
            b.append('\n');
        }
        return text(name, b.toString());
    }

    Path text(String name, String content) throws IOException {
        Path f = dir.resolve(name);
        Files.writeString(f, content, StandardCharsets.UTF_8);
        return f;
    }

    Path avro(String name, double[][] rows) throws IOException {
        SchemaBuilder.FieldAssembler<Schema> fields = SchemaBuilder.record("Row").namespace("lariat.test").fields();
        for (String n : NAMES) {
            fields = fields.requiredDouble(n);
        }
        Schema schema = fields.endRecord();
        Path f = dir.resolve(name);
        try (DataFileWriter<GenericRecord> w = new DataFileWriter<>(new GenericDatumWriter<>(schema))) {
            w.create(schema, f.toFile());
            for (double[] r : rows) {
                GenericRecord g = new GenericData.Record(schema);
                for (int j = 0; j < r.length; j++) {
                    g.put(j, Double.parseDouble(String.format(Locale.ROOT, "%.17g", r[j])));
                }
                w.append(g);
            }
        }
        return f;
    }

    @Test
    void fit_temporaryCsv_writesJsonOfTheAgreedShape() throws IOException {
        Path in = csv("t.csv", rows(1, 200));
        Path json = dir.resolve("out.json");
        Run r = run("fit", "--input", in.toString(), "--target", "y", "--select", "bic", "--refit",
                "--json", json.toString());
        assertEquals(0, r.code(), r.err());
        JsonNode root = new ObjectMapper().readTree(json.toFile());
        assertEquals(List.of("bmi", "hdl", "age", "noise"), strings(root.get("columns")));
        assertTrue(root.get("excluded").isArray());
        JsonNode knots = root.get("knots");
        assertTrue(knots.size() >= 4);
        JsonNode k0 = knots.get(0);
        assertEquals(0, k0.get("step").asInt());
        assertEquals(1.0, k0.get("relativePenalty").asDouble(), 0.0);
        assertTrue(k0.get("penalty").asDouble() > 0);
        assertEquals(List.of("bmi"), strings(k0.get("entered")));
        for (JsonNode k : knots) {
            for (String field : List.of("step", "penalty", "relativePenalty", "active", "entered", "left",
                    "coefficients", "intercept", "rss", "r2")) {
                assertTrue(k.has(field), "knot lacks " + field);
            }
            assertEquals(strings(k.get("active")), names(k.get("coefficients")));
        }
        assertEquals(List.of("bmi", "hdl", "age"), strings(knots.get(2).get("active")));
        JsonNode sel = root.get("selected");
        assertEquals("bic", sel.get("rule").asText());
        assertTrue(strings(sel.get("active")).containsAll(List.of("bmi", "hdl", "age")));
        assertEquals(2.0, sel.get("refit").get("coefficients").get("bmi").asDouble(), 0.15);
        assertTrue(r.out().contains("+hdl") && r.out().contains("not causes"), r.out());
    }

    @Test
    void fit_avroContainer_equalsCsvInput() throws IOException {
        double[][] rows = rows(2, 150);
        JsonNode c = fitJson("c.json", "fit", "--input", csv("t.csv", rows).toString(), "--target", "y");
        JsonNode a = fitJson("a.json", "fit", "--input", avro("t.avro", rows).toString(), "--target", "y");
        assertEquals(c.get("knots"), a.get("knots"));
        assertEquals(c.get("selected"), a.get("selected"));
        assertEquals(c.get("columns"), a.get("columns"));
    }

    @Test
    void fit_plot_isWellFormedSvgWithLegendEntryPerPlottedFeature() throws Exception {
        Path svg = dir.resolve("p.svg");
        Path knotsCsv = dir.resolve("k.csv");
        Run r = run("fit", "--input", csv("t.csv", rows(3, 120)).toString(), "--target", "y", "--features",
                "bmi,hdl,age", "--select", "relative-penalty", "--select-value", "0.2", "--plot", svg.toString(),
                "--csv", knotsCsv.toString());
        assertEquals(0, r.code(), r.err());
        DocumentBuilderFactory f = DocumentBuilderFactory.newInstance();
        f.setNamespaceAware(true);
        Document doc = f.newDocumentBuilder().parse(svg.toFile());
        List<String> legend = new ArrayList<>();
        NodeList groups = doc.getElementsByTagNameNS("http://www.w3.org/2000/svg", "g");
        for (int i = 0; i < groups.getLength(); i++) {
            Element g = (Element) groups.item(i);
            if (g.getAttribute("class").equals("legend-entry")) {
                legend.add(g.getTextContent().strip());
            }
        }
        assertEquals(List.of("bmi", "hdl", "age"), legend);
        List<String> lines = Files.readAllLines(knotsCsv);
        assertEquals("step,event,penalty,relative_penalty,active_count,intercept,rss,r2,df,bmi,hdl,age", lines.get(0));
        assertTrue(lines.get(1).startsWith("0,+bmi,"), lines.get(1));
    }

    @Test
    void fit_cvOneSe_isNoLargerThanCvMinimum() throws IOException {
        Path in = csv("t.csv", rows(4, 300));
        String[] cv = {"fit", "--input", in.toString(), "--target", "y", "--select", "cv", "--folds", "10"};
        JsonNode min = fitJson("min.json", cv).get("selected");
        JsonNode se = fitJson("se.json", concat(cv, "--one-se")).get("selected");
        assertEquals(10, min.get("cv").get("folds").asInt());
        assertTrue(se.get("relativePenalty").asDouble() >= min.get("relativePenalty").asDouble());
        assertTrue(se.get("cv").get("oneSeIndex").asInt() <= se.get("cv").get("minIndex").asInt());
    }

    /**
     * {@code --ridge-rescale}: the chosen coefficients are (1 + L2) times the naive elastic-net ones (Zou &amp;
     * Hastie, J. R. Statist. Soc. B 67(2), 2005, section 3.2, from memory), the JSON says so, and the RSS
     * is the weighted squared error summed directly on the table's rows.
     */
    @Test
    void fit_ridgeRescale_reportsOnePlusRidgeTimesNaiveWithDirectRss() throws IOException {
        double[][] data = rows(5, 200);
        Path in = csv("t.csv", data);
        String[] common = {"fit", "--input", in.toString(), "--target", "y", "--ridge", "0.5", "--select",
            "relative-penalty", "--select-value", "0.1", "--refit"};
        JsonNode root0 = fitJson("naive.json", common);
        JsonNode root1 = fitJson("rescaled.json", concat(common, "--ridge-rescale"));
        Run r = run(concat(common, "--ridge-rescale"));
        assertTrue(r.out().contains("coefficients rescaled by 1.5 = 1 + ridge"), r.out());
        assertEquals(false, root0.get("ridgeRescale").asBoolean());
        assertEquals(true, root1.get("ridgeRescale").asBoolean());
        JsonNode s0 = root0.get("selected");
        JsonNode s1 = root1.get("selected");
        assertEquals(1.0, s0.get("coefficientScale").asDouble(), 0.0);
        assertEquals(1.5, s1.get("coefficientScale").asDouble(), 0.0);
        assertEquals(strings(s0.get("active")), strings(s1.get("active")));
        assertTrue(s0.get("active").size() >= 2);
        for (String f : strings(s0.get("active"))) {
            assertEquals(1.5 * s0.get("standardized").get(f).asDouble(), s1.get("standardized").get(f).asDouble(), 0.0);
            assertEquals(1.5, s1.get("coefficients").get(f).asDouble() / s0.get("coefficients").get(f).asDouble(),
                    1e-14, f);
            assertEquals(s0.get("refit").get("coefficients").get(f).asDouble(),
                    s1.get("refit").get("coefficients").get(f).asDouble(), 0.0, f);
        }
        double a = s1.get("intercept").asDouble();
        double rss = 0;
        for (double[] row : data) {
            double e = row[4] - a;
            for (int j = 0; j < 4; j++) {
                JsonNode c = s1.get("coefficients").get(NAMES[j]);
                e -= c == null ? 0 : c.asDouble() * row[j];
            }
            rss += e * e;
        }
        assertEquals(rss, s1.get("rss").asDouble(), 1e-9 * rss);
        assertTrue(Math.abs(rss - s0.get("rss").asDouble()) > 1e-6 * rss, "the naive model has another RSS");
    }

    @Test
    void fit_ridgeRescaleWithoutRidge_changesNothing() throws IOException {
        Path in = csv("t.csv", rows(6, 150));
        JsonNode root0 = fitJson("plain.json", "fit", "--input", in.toString(), "--target", "y");
        JsonNode root1 = fitJson("flag.json", "fit", "--input", in.toString(), "--target", "y", "--ridge-rescale");
        assertEquals(root0.get("selected"), root1.get("selected"));
        assertEquals(root0.get("knots"), root1.get("knots"));
        assertEquals(1.0, root1.get("selected").get("coefficientScale").asDouble(), 0.0);
    }

    /** Runs {@code fit args --json dir/name}, requires exit code 0 and returns the JSON written. */
    private JsonNode fitJson(String name, String... args) throws IOException {
        Path json = dir.resolve(name);
        Run r = run(concat(args, "--json", json.toString()));
        assertEquals(0, r.code(), r.err());
        return new ObjectMapper().readTree(json.toFile());
    }

    private static String[] concat(String[] head, String... tail) {
        String[] out = java.util.Arrays.copyOf(head, head.length + tail.length);
        System.arraycopy(tail, 0, out, head.length, tail.length);
        return out;
    }

    private void assertBadInput(Run r, String... fragments) {
        assertEquals(2, r.code(), r.err());
        String err = r.err().strip();
        assertEquals(1, err.lines().count(), err);
        for (String f : fragments) {
            assertTrue(err.contains(f), "stderr lacks '" + f + "': " + err);
        }
        assertEquals("", r.out());
    }

    @Test
    void fit_missingFile_exit2NamingFile() {
        assertBadInput(run("fit", "--input", dir.resolve("absent.csv").toString(), "--target", "y"),
                "absent.csv", "no such file");
    }

    @Test
    void fit_missingColumn_exit2NamingColumn() throws IOException {
        Path in = csv("t.csv", rows(5, 20));
        assertBadInput(run("fit", "--input", in.toString(), "--target", "current"), "t.csv", "'current'");
        assertBadInput(run("fit", "--input", in.toString(), "--target", "y", "--features", "bmi,ldl"), "'ldl'");
    }

    @Test
    void fit_nonNumericCell_exit2NamingRowAndColumn() throws IOException {
        Path in = text("t.csv", "bmi,y\n1,2\n2,3\n3,x7\n");
        assertBadInput(run("fit", "--input", in.toString(), "--target", "y"), "t.csv", "row 3", "'y'", "x7");
    }

    @Test
    void fit_nonFiniteCell_exit2NamingRowAndColumn() throws IOException {
        Path in = text("t.csv", "bmi,y\n1,2\nNaN,3\n3,4\n");
        assertBadInput(run("fit", "--input", in.toString(), "--target", "y"), "row 2", "'bmi'", "non-finite");
    }

    @Test
    void fit_emptyFile_exit2() throws IOException {
        assertBadInput(run("fit", "--input", text("e.csv", "").toString(), "--target", "y"), "e.csv", "empty");
    }

    @Test
    void fit_headerOnly_exit2() throws IOException {
        assertBadInput(run("fit", "--input", text("h.csv", "bmi,y\n").toString(), "--target", "y"), "h.csv",
                "no data rows");
    }

    @Test
    void fit_oneRow_exit2() throws IOException {
        assertBadInput(run("fit", "--input", text("o.csv", "bmi,y\n1,2\n").toString(), "--target", "y"), "o.csv",
                "only 1 data row");
    }

    @Test
    void fit_nonPositiveWeight_exit2NamingRowAndColumn() throws IOException {
        Path in = text("w.csv", "bmi,w,y\n1,1,2\n2,0,3\n3,1,5\n");
        assertBadInput(run("fit", "--input", in.toString(), "--target", "y", "--weight", "w"), "row 2", "'w'");
    }

    @Test
    void fit_usageErrors_exit2() throws IOException {
        Path in = csv("t.csv", rows(6, 30));
        assertEquals(2, run("fit", "--target", "y").code());
        assertEquals(2, run("fit", "--input", in.toString(), "--target", "y", "--select", "magic").code());
        assertEquals(2, run("fit", "--input", in.toString(), "--target", "y", "--select", "max-active").code());
        assertEquals(2, run("fit", "--input", in.toString(), "--target", "y", "--method", "ridge").code());
        assertEquals(2, run("fit", "--input", in.toString(), "--target", "y", "--folds", "1").code());
    }

    @Test
    void fit_help_showsExampleAndOptions() {
        Run r = run("fit", "--help");
        assertEquals(0, r.code());
        for (String s : List.of("--input", "--target", "--select", "--one-se", "--refit", "--plot", "Example")) {
            assertTrue(r.out().contains(s), s);
        }
    }

    private static List<String> strings(JsonNode array) {
        List<String> out = new ArrayList<>();
        array.forEach(n -> out.add(n.asText()));
        return out;
    }

    private static List<String> names(JsonNode object) {
        List<String> out = new ArrayList<>();
        Iterator<String> it = object.fieldNames();
        it.forEachRemaining(out::add);
        return out;
    }
}
