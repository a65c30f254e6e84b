package lariat.table;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.apache.avro.Schema;
import org.apache.avro.SchemaBuilder;
import org.apache.avro.file.DataFileWriter;
import org.apache.avro.generic.GenericData;
import org.apache.avro.generic.GenericDatumWriter;
import org.apache.avro.generic.GenericRecord;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class AvroTableReaderTest {

    @TempDir
    Path dir;

    private static final Schema SCHEMA = SchemaBuilder.record("Row").namespace("lariat.test").fields()
            .requiredDouble("x").requiredInt("n").requiredLong("t").requiredFloat("f").optionalDouble("o")
            .requiredString("label").endRecord();

    private Path write(Object[][] rows) throws IOException {
        Path f = dir.resolve("t.avro");
        try (DataFileWriter<GenericRecord> w = new DataFileWriter<>(new GenericDatumWriter<>(SCHEMA))) {
            w.create(SCHEMA, f.toFile());
            for (Object[] r : rows) {
                GenericRecord g = new GenericData.Record(SCHEMA);
                for (int i = 0; i < r.length; i++) {
                    g.put(i, r[i]);
                }
                w.append(g);
            }
        }
        return f;
    }

    @Test
    void read_numericFields_convertsEveryNumericType() throws IOException {
        Path f = write(new Object[][] {{1.5, 2, 3L, 0.25f, 7.0, "a"}, {-1.0, 5, 6L, 1.5f, 8.0, "b"}});
        NumericTable t = new AvroTableReader().read(f, List.of("x", "n", "t", "f", "o"));
        assertEquals(2, t.rows());
        assertArrayEquals(new double[] {1.5, 2, 3, 0.25, 7}, new double[] {t.get(0, 0), t.get(0, 1), t.get(0, 2),
            t.get(0, 3), t.get(0, 4)});
        assertArrayEquals(new double[] {-1, 8}, new double[] {t.get(1, 0), t.get(1, 4)});
    }

    @Test
    void read_nullValue_namesRowAndField() throws IOException {
        Path f = write(new Object[][] {{1.0, 2, 3L, 0.5f, 1.0, "a"}, {1.0, 2, 3L, 0.5f, null, "a"}});
        TableFormatException e = assertThrows(TableFormatException.class,
                () -> new AvroTableReader().read(f, List.of("x", "o")));
        assertEquals(2, e.row());
        assertEquals("o", e.column());
    }

    @Test
    void read_nonFiniteValue_isRefused() throws IOException {
        Path f = write(new Object[][] {{Double.NaN, 2, 3L, 0.5f, 1.0, "a"}});
        TableFormatException e = assertThrows(TableFormatException.class,
                () -> new AvroTableReader().read(f, List.of("x")));
        assertTrue(e.getMessage().contains("row 1, column 'x'") && e.getMessage().contains("non-finite"));
    }

    @Test
    void read_stringField_isNotNumeric() throws IOException {
        Path f = write(new Object[][] {{1.0, 2, 3L, 0.5f, 1.0, "a"}});
        TableFormatException e = assertThrows(TableFormatException.class, () -> new AvroTableReader().read(f, null));
        assertEquals("label", e.column());
    }

    @Test
    void read_noRecords_saysSo() throws IOException {
        Path f = write(new Object[0][]);
        TableFormatException e = assertThrows(TableFormatException.class,
                () -> new AvroTableReader().read(f, List.of("x")));
        assertTrue(e.getMessage().contains("no records"), e.getMessage());
    }

    @Test
    void read_notAvro_saysNotContainer() throws IOException {
        Path f = dir.resolve("text.avro");
        Files.writeString(f, "x,y\n1,2\n");
        TableFormatException e = assertThrows(TableFormatException.class, () -> new AvroTableReader().read(f, null));
        assertTrue(e.getMessage().contains("not an Avro object container file"), e.getMessage());
    }
}
