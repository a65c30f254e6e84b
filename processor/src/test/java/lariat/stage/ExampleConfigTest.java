package lariat.stage;

import lariat.config.StageConfig;
import org.junit.jupiter.api.Test;

import java.io.IOException;
import java.io.InputStream;
import java.util.Properties;

import static org.junit.jupiter.api.Assertions.assertEquals;

class ExampleConfigTest {

    @Test
    void exampleProperties_parseIntoStageSettings() throws IOException {
        Properties p = new Properties();
        try (InputStream in = ExampleConfigTest.class.getResourceAsStream("/examples/stage.properties")) {
            p.load(in);
        }
        StageSettings s = StageAssembly.settings(StageConfig.of(p));
        assertEquals("pump-stations-0", s.transactionalId());
        assertEquals("station.readings", s.inputTopic());
        assertEquals(500, s.refitEveryRecords());
        assertEquals(2, s.alertPersistence());
        assertEquals(120_000, s.restoreTimeoutMs(), "the documented default of restore.timeout.ms");
    }

    @Test
    void settings_restoreTimeout_reachesTheStage() throws IOException {
        Properties p = new Properties();
        try (InputStream in = ExampleConfigTest.class.getResourceAsStream("/examples/stage.properties")) {
            p.load(in);
        }
        p.setProperty("restore.timeout.ms", "30000");
        p.setProperty("transaction.timeout.ms", "15000");
        assertEquals(30_000, StageAssembly.settings(StageConfig.of(p)).restoreTimeoutMs());
    }
}
