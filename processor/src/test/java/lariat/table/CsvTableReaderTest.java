package lariat.table;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class CsvTableReaderTest {

    @TempDir
    Path dir;

    private Path file(String name, String text) throws IOException {
        Path f = dir.resolve(name);
        Files.writeString(f, text, StandardCharsets.UTF_8);
        return f;
    }

    private TableFormatException bad(String text, List<String> wanted) throws IOException {
        Path f = file("bad.csv", text);
        return assertThrows(TableFormatException.class, () -> new CsvTableReader().read(f, wanted));
    }

    @Test
    void read_quotedFieldsAndCrlf_parsesRfc4180() throws IOException {
        Path f = file("t.csv", "\uFEFFa,\"b, with comma\",\"c \"\"q\"\"\"\r\n1,2.5,-3e2\r\n\r\n\"4\",5,+.5\r\n");
        NumericTable t = new CsvTableReader().read(f, null);
        assertEquals(List.of("a", "b, with comma", "c \"q\""), t.columns());
        assertEquals(2, t.rows());
        assertArrayEquals(new double[] {1, 4}, t.column(0));
        assertArrayEquals(new double[] {2.5, 5}, t.column(1));
        assertArrayEquals(new double[] {-300, 0.5}, t.column(2));
    }

    @Test
    void read_wantedColumns_keepsOrderAndSkipsOthers() throws IOException {
        Path f = file("t.csv", "id,x,y\nabc,1,2\ndef,3,4\n");
        NumericTable t = new CsvTableReader().read(f, List.of("y", "x"));
        assertEquals(List.of("y", "x"), t.columns());
        assertArrayEquals(new double[] {2, 4}, t.column(0));
    }

    @Test
    void read_missingFile_namesFile() {
        Path f = dir.resolve("nope.csv");
        TableFormatException e = assertThrows(TableFormatException.class, () -> new CsvTableReader().read(f, null));
        assertTrue(e.getMessage().contains("nope.csv") && e.getMessage().contains("no such file"), e.getMessage());
    }

    @Test
    void read_emptyFile_saysEmpty() throws IOException {
        assertTrue(bad("", null).getMessage().contains("empty file"));
    }

    @Test
    void read_headerOnly_saysNoDataRows() throws IOException {
        assertTrue(bad("x,y\n", null).getMessage().contains("no data rows"));
    }

    @Test
    void read_missingColumn_namesColumn() throws IOException {
        TableFormatException e = bad("x,y\n1,2\n", List.of("x", "z"));
        assertEquals("z", e.column());
        assertTrue(e.getMessage().contains("'z'") && e.getMessage().contains("bad.csv"), e.getMessage());
    }

    @Test
    void read_nonNumericCell_namesRowAndColumn() throws IOException {
        TableFormatException e = bad("x,y\n1,2\n3,abc\n", null);
        assertEquals(2, e.row());
        assertEquals("y", e.column());
        assertTrue(e.getMessage().contains("row 2, column 'y'") && e.getMessage().contains("abc"), e.getMessage());
    }

    @Test
    void read_javaSuffixNumber_isRefused() throws IOException {
        assertEquals("x", bad("x\n1d\n", null).column());
    }

    @Test
    void read_nonFiniteCell_saysNonFinite() throws IOException {
        for (String v : List.of("NaN", "inf", "-Infinity", "1e400")) {
            TableFormatException e = bad("x,y\n1," + v + "\n", null);
            assertEquals(1, e.row());
            assertTrue(e.getMessage().contains("non-finite"), e.getMessage());
        }
    }

    @Test
    void read_emptyCell_saysMissing() throws IOException {
        assertTrue(bad("x,y\n1,\n", null).getMessage().contains("empty cell"));
    }

    @Test
    void read_shortRow_namesRow() throws IOException {
        TableFormatException e = bad("x,y\n1,2\n3\n", null);
        assertEquals(2, e.row());
        assertTrue(e.getMessage().contains("1 fields"), e.getMessage());
    }

    @Test
    void read_duplicateHeader_isRefused() throws IOException {
        assertEquals("x", bad("x,x\n1,2\n", null).column());
    }
}
