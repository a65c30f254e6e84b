package lariat.it.demo;

import java.io.File;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.concurrent.TimeUnit;

import lariat.config.StageConfig;
import org.junit.jupiter.api.Test;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * The repository's docker-compose.yml is valid Compose (checked by Debian's docker-compose 1.29,
 * which validates a file without a Docker engine; .ci/run installs it), and the stage
 * configuration it mounts, docker/stage.properties, is a valid stage configuration.
 */
class DockerComposeIT {

    private static final String VALIDATOR = "/usr/bin/docker-compose";
    private static final Path ROOT = Path.of("..").toAbsolutePath().normalize();

    @Test
    void dockerCompose_config_validWithoutEngine() throws IOException, InterruptedException {
        if (!new File(VALIDATOR).canExecute()) {
            throw new AssertionError(VALIDATOR + " is missing: install Debian's docker-compose package "
                    + "(apt-get install -y docker-compose; .ci/run does this)");
        }
        Path file = ROOT.resolve("docker-compose.yml");
        assertTrue(Files.isRegularFile(file), "no " + file);
        Path log = Files.createTempFile("compose", ".log");
        Process p = new ProcessBuilder(VALIDATOR, "-f", file.toString(), "config", "-q").directory(ROOT.toFile())
                .redirectErrorStream(true).redirectOutput(log.toFile()).start();
        assertTrue(p.waitFor(60, TimeUnit.SECONDS), "docker-compose config did not finish within 60 s");
        String out = Files.readString(log, StandardCharsets.UTF_8);
        Files.delete(log);
        assertEquals(0, p.exitValue(), "docker-compose config -q rejected docker-compose.yml: " + out);
    }

    @Test
    void dockerCompose_rejectsInvalidFile_validatorIsNotVacuous() throws IOException, InterruptedException {
        if (!new File(VALIDATOR).canExecute()) {
            throw new AssertionError(VALIDATOR + " is missing: install Debian's docker-compose package");
        }
        Path dir = Files.createTempDirectory("compose-bad");
        Path file = dir.resolve("docker-compose.yml");
        Files.writeString(file, "services:\n  stage:\n    image: eclipse-temurin:17-jre\n    not_a_key: 1\n");
        Process p = new ProcessBuilder(VALIDATOR, "-f", file.toString(), "config", "-q").directory(dir.toFile())
                .redirectErrorStream(true).redirectOutput(dir.resolve("log").toFile()).start();
        assertTrue(p.waitFor(60, TimeUnit.SECONDS), "docker-compose config did not finish within 60 s");
        assertTrue(p.exitValue() != 0, "an unknown service key must be rejected");
    }

    @Test
    void stageProperties_mountedByCompose_isValidConfiguration() throws IOException {
        StageConfig c = StageConfig.load(ROOT.resolve("docker/stage.properties"));
        assertEquals("kafka:9092", c.producerProperties().get("bootstrap.servers"));
        assertEquals("station.readings", c.get(StageConfig.INPUT_TOPIC));
    }
}
