package lariat.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;

import org.junit.jupiter.api.Test;
import picocli.CommandLine;

/** The README's configuration reference is the output of {@code config-doc}, so it cannot drift. */
class ReadmeConfigReferenceTest {

    private static final String BEGIN = "<!-- config-doc:begin -->\n";
    private static final String END = "<!-- config-doc:end -->";

    @Test
    void readme_configurationSection_equalsConfigDocOutput() throws IOException {
        String readme = Files.readString(Path.of("..", "README.md"), StandardCharsets.UTF_8);
        int from = readme.indexOf(BEGIN);
        int to = readme.indexOf(END);
        assertTrue(from >= 0 && to > from, "README.md must hold the config-doc markers");
        String section = readme.substring(from + BEGIN.length(), to);

        StringWriter out = new StringWriter();
        CommandLine cli = new CommandLine(new Main());
        cli.setOut(new PrintWriter(out));
        int code = cli.execute("config-doc");

        assertEquals(0, code);
        assertEquals(out.toString(), section,
                "README.md is out of date: regenerate with `java -jar processor/target/lariat.jar config-doc`");
    }
}
