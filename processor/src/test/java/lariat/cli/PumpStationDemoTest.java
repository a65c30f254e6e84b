package lariat.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.io.IOException;
import java.io.InputStream;
import java.nio.charset.StandardCharsets;
import org.junit.jupiter.api.Test;

class PumpStationDemoTest {

    @Test
    void committedDemoCsv_equalsGeneratorOutput() throws IOException {
        try (InputStream in = PumpStationDemoTest.class.getResourceAsStream("/demo/pump_station.csv")) {
            String committed = new String(in.readAllBytes(), StandardCharsets.UTF_8);
            assertEquals(PumpStationDemo.csv(PumpStationDemo.SEED, PumpStationDemo.ROWS), committed);
        }
    }
}
