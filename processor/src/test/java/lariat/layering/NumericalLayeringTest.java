package lariat.layering;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Enforces the layering of the design: the numerical packages (lariat.moments, lariat.path, lariat.select)
 * import neither Kafka nor Avro. Scans the main source files; Maven runs tests with the module directory
 * as the working directory, so the sources are at {@code src/main/java}.
 */
class NumericalLayeringTest {

    private static final List<String> NUMERICAL = List.of("lariat/moments", "lariat/path", "lariat/select");
    private static final List<String> FORBIDDEN = List.of("import org.apache.kafka", "import org.apache.avro");

    /** Source files under the numerical packages that import a forbidden package, as "file: line". */
    static List<String> offenders(Path sourceRoot) throws IOException {
        List<String> out = new ArrayList<>();
        for (String pkg : NUMERICAL) {
            Path dir = sourceRoot.resolve(pkg);
            if (!Files.isDirectory(dir)) {
                continue;
            }
            try (Stream<Path> files = Files.walk(dir)) {
                for (Path f : (Iterable<Path>) files.filter(p -> p.toString().endsWith(".java")).sorted()::iterator) {
                    for (String line : Files.readAllLines(f, StandardCharsets.UTF_8)) {
                        String t = line.strip();
                        for (String bad : FORBIDDEN) {
                            if (t.startsWith(bad) || t.startsWith(bad.replace("import ", "import static "))) {
                                out.add(sourceRoot.relativize(f) + ": " + t);
                            }
                        }
                    }
                }
            }
        }
        return out;
    }

    @Test
    void numericalPackages_mainSources_importNeitherKafkaNorAvro() throws IOException {
        Path root = Path.of("src", "main", "java");
        assertTrue(Files.isDirectory(root.resolve("lariat/moments")), "main sources found at " + root.toAbsolutePath());
        List<String> bad = offenders(root);
        assertEquals(List.of(), bad, "numerical packages must not import Kafka or Avro");
    }

    @Test
    void offenders_fileImportingKafka_isNamed(@TempDir Path root) throws IOException {
        Path dir = Files.createDirectories(root.resolve("lariat/select"));
        Files.writeString(dir.resolve("Leaky.java"), "package lariat.select;\n\n"
                + "import org.apache.kafka.clients.producer.Producer;\n\nfinal class Leaky {\n}\n");
        Files.writeString(dir.resolve("Clean.java"), "package lariat.select;\n\nfinal class Clean {\n}\n");
        assertEquals(List.of(Path.of("lariat/select/Leaky.java")
                + ": import org.apache.kafka.clients.producer.Producer;"), offenders(root));
    }
}
