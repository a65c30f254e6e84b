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
    }
}
