package lariat.demo;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

import org.junit.jupiter.api.Test;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

class DemoConsoleTest {

    @Test
    void changes_enteredLeftFlipped_markedWithPlusMinusTilde() {
        Map<String, Double> before = new LinkedHashMap<>();
        before.put("flow_m3h", 0.4);
        before.put("supply_voltage_v", -1.2);
        before.put("suction_kpa", 0.1);
        Map<String, Double> now = new LinkedHashMap<>();
        now.put("flow_m3h", 0.5);
        now.put("supply_voltage_v", 1.1);
        now.put("vib_2x_mm_s", 2.0);
        assertEquals(List.of("~supply_voltage_v", "+vib_2x_mm_s", "-suction_kpa"), DemoConsole.changes(before, now));
    }

    @Test
    void progress_notTerminal_plainLinesWithoutCarriageReturn() {
        StringWriter s = new StringWriter();
        DemoConsole c = new DemoConsole(new PrintWriter(s), false);
        c.progress(100, 60_480, 1_709_510_400_000L, 1234.0, 17, 12.0);
        c.line("v1 north-03");
        c.progress(200, 60_480, 1_709_510_460_000L, 1234.5, 3, 13.0);
        c.endProgress();
        String text = s.toString();
        assertFalse(text.contains("\r"), text);
        assertEquals(3, text.split(System.lineSeparator()).length, text);
        assertTrue(text.startsWith("[ 12s] sent 100/60480   1234 rec/s  event time 2024-03-04 00:00  lag 17"), text);
    }

    @Test
    void progress_terminal_rewrittenInPlaceAndLinesPrintedAboveIt() {
        StringWriter s = new StringWriter();
        DemoConsole c = new DemoConsole(new PrintWriter(s), true);
        c.progress(100, 60_480, 1_709_510_400_000L, 10, 0, 1.0);
        c.line("event");
        String text = s.toString();
        assertTrue(text.contains("\r" + " ".repeat(DemoConsole.WIDTH) + "\revent"), text);
        assertTrue(text.endsWith("[  1s] sent 100/60480     10 rec/s  event time 2024-03-04 00:00  lag 0"), text);
    }

    @Test
    void progress_longText_cutToWidth() {
        StringWriter s = new StringWriter();
        DemoConsole c = new DemoConsole(new PrintWriter(s), false);
        c.progress(Long.MAX_VALUE / 2, Long.MAX_VALUE, 1_709_510_400_000L, 1e12, Long.MAX_VALUE / 3, 1e6);
        String line = s.toString().strip();
        assertEquals(DemoConsole.WIDTH, line.length(), line);
        assertTrue(line.endsWith("..."), line);
    }
}
