package lariat.report;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import java.util.List;
import org.junit.jupiter.api.Test;

class TextTableTest {

    @Test
    void render_mixedAlignment_padsToWidestCell() {
        TextTable t = new TextTable(List.of("name", "value"), List.of(TextTable.Align.LEFT, TextTable.Align.RIGHT));
        t.row("a", "1.5").row("long name", "-10");
        assertEquals("name       value\n---------  -----\na            1.5\nlong name    -10\n", t.render());
    }

    @Test
    void row_wrongWidth_isRefused() {
        TextTable t = new TextTable(List.of("a"), List.of(TextTable.Align.LEFT));
        assertThrows(IllegalArgumentException.class, () -> t.row("x", "y"));
    }
}
