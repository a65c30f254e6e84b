package lariat.report.demo;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import org.junit.jupiter.api.Test;

/** Hand-checked cases of matching alerts to injected changes. */
class DetectionTest {

    @Test
    void of_firstMatchingAlertAfterChange_isTheDetection() {
        ChangeMark enters = ChangeMark.of(1_000, "vib_2x_mm_s", ChangeMark.Kind.ENTERS);
        ChangeMark leaves = ChangeMark.of(5_000, "vib_2x_mm_s", ChangeMark.Kind.LEAVES);
        List<AlertMark> alerts = List.of(
                AlertMark.of(900, 1, List.of("vib_2x_mm_s"), List.of(), List.of()),
                AlertMark.of(1_200, 2, List.of(), List.of("vib_2x_mm_s"), List.of()),
                AlertMark.of(1_600, 3, List.of("vib_2x_mm_s"), List.of(), List.of()),
                AlertMark.of(1_900, 4, List.of("vib_2x_mm_s", "flow_m3h"), List.of(), List.of()));
        StationReport s = StationReport.of("cedar-14", List.of(), List.of(), Double.NaN, List.of(enters, leaves),
                alerts);
        List<Detection> d = Detection.of(s);
        assertTrue(d.get(0).detected());
        assertEquals(600, d.get(0).delayMs());
        assertEquals(3, d.get(0).alert().version());
        assertFalse(d.get(1).detected());
        assertEquals(-1, d.get(1).delayMs());
        assertEquals(3, Detection.otherAlerts(s));
    }

    @Test
    void of_alertAfterNextChange_doesNotDetectTheEarlierOne() {
        ChangeMark flip = ChangeMark.of(1_000, "supply_voltage_v", ChangeMark.Kind.SIGN_FLIP);
        ChangeMark enters = ChangeMark.of(2_000, "oil_temp_c", ChangeMark.Kind.ENTERS);
        AlertMark late = AlertMark.of(2_500, 7, List.of("oil_temp_c"), List.of(), List.of("supply_voltage_v"));
        StationReport s = StationReport.of("basin-07", List.of(), List.of(), Double.NaN, List.of(flip, enters),
                List.of(late));
        List<Detection> d = Detection.of(s);
        assertFalse(d.get(0).detected());
        assertTrue(d.get(1).detected());
        assertEquals(500, d.get(1).delayMs());
        assertEquals(0, Detection.otherAlerts(s));
    }
}
