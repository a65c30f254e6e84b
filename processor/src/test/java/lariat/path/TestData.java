package lariat.path;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStream;
import java.io.InputStreamReader;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;
import java.util.zip.GZIPInputStream;

/** Loads the vendored data under {@code src/test/resources/path} (see its README). */
final class TestData {

    private TestData() {
    }

    /** The diabetes data of Efron, Hastie, Johnstone and Tibshirani (2004): 442 rows, 10 raw predictors. */
    static RawProblem diabetes() {
        List<double[]> x = readRows("diabetes_data_raw.csv.gz");
        List<double[]> y = readRows("diabetes_target.csv.gz");
        double[][] rows = x.toArray(new double[0][]);
        double[] target = new double[y.size()];
        for (int i = 0; i < target.length; i++) {
            target[i] = y.get(i)[0];
        }
        return RawProblem.unweighted(rows, target);
    }

    static JsonNode json(String name) {
        try (InputStream in = open(name)) {
            return new ObjectMapper().readTree(in);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    static double[] doubles(JsonNode array) {
        double[] out = new double[array.size()];
        for (int i = 0; i < out.length; i++) {
            out[i] = array.get(i).asDouble();
        }
        return out;
    }

    static int[] ints(JsonNode array) {
        int[] out = new int[array.size()];
        for (int i = 0; i < out.length; i++) {
            out[i] = array.get(i).asInt();
        }
        return out;
    }

    /** A problem stored with its rows in a fixture. */
    static RawProblem problem(JsonNode node) {
        JsonNode x = node.get("x");
        double[][] rows = new double[x.size()][];
        for (int i = 0; i < rows.length; i++) {
            rows[i] = doubles(x.get(i));
        }
        return new RawProblem(rows, doubles(node.get("y")), doubles(node.get("w")));
    }

    private static InputStream open(String name) {
        InputStream in = TestData.class.getResourceAsStream("/path/" + name);
        if (in == null) {
            throw new IllegalStateException("missing test resource path/" + name);
        }
        return in;
    }

    private static List<double[]> readRows(String name) {
        List<double[]> rows = new ArrayList<>();
        try (BufferedReader r = new BufferedReader(new InputStreamReader(new GZIPInputStream(open(name)),
                StandardCharsets.US_ASCII))) {
            for (String line = r.readLine(); line != null; line = r.readLine()) {
                if (!line.isBlank()) {
                    String[] parts = line.trim().split("\\s+");
                    double[] row = new double[parts.length];
                    for (int j = 0; j < row.length; j++) {
                        row[j] = Double.parseDouble(parts[j]);
                    }
                    rows.add(row);
                }
            }
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
        return rows;
    }
}
