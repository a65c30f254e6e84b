package lariat.table;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import org.apache.avro.Schema;
import org.apache.avro.file.DataFileReader;
import org.apache.avro.generic.GenericDatumReader;
import org.apache.avro.generic.GenericRecord;

/**
 * Avro object container files (Apache Avro 1.12 specification, "Object Container Files") whose
 * records have numeric fields: {@code int}, {@code long}, {@code float}, {@code double}, or a union
 * of {@code null} with one of these. A null or non-finite value is refused naming its row and field.
 */
public final class AvroTableReader implements TableReader {

    @Override
    public NumericTable read(Path file, List<String> wanted) {
        String name = file.toString();
        if (!Files.isRegularFile(file)) {
            throw TableFormatException.ofFile(name, Files.exists(file) ? "not a regular file" : "no such file");
        }
        try {
            if (Files.size(file) == 0) {
                throw TableFormatException.ofFile(name, "empty file (no Avro header)");
            }
        } catch (IOException e) {
            throw TableFormatException.ofFile(name, "cannot read: " + e.getMessage());
        }
        DataFileReader<GenericRecord> reader;
        try {
            reader = new DataFileReader<>(file.toFile(), new GenericDatumReader<>());
        } catch (IOException e) {
            throw TableFormatException.ofFile(name, "not an Avro object container file (" + e.getMessage() + ")");
        }
        try (reader) {
            return read(reader, name, wanted);
        } catch (IOException e) {
            throw TableFormatException.ofFile(name, "cannot read: " + e.getMessage());
        } catch (org.apache.avro.AvroRuntimeException e) {
            throw TableFormatException.ofFile(name, "corrupt Avro data (" + e.getMessage() + ")");
        }
    }

    private static NumericTable read(DataFileReader<GenericRecord> reader, String name, List<String> wanted)
            throws IOException {
        Schema schema = reader.getSchema();
        if (schema.getType() != Schema.Type.RECORD) {
            throw TableFormatException.ofFile(name, "the writer schema is " + schema.getType() + ", not a record");
        }
        List<String> keep = new ArrayList<>();
        if (wanted == null) {
            schema.getFields().forEach(f -> keep.add(f.name()));
        } else {
            keep.addAll(wanted);
        }
        int[] pos = new int[keep.size()];
        for (int j = 0; j < pos.length; j++) {
            Schema.Field field = schema.getField(keep.get(j));
            if (field == null) {
                throw TableFormatException.ofColumn(name, keep.get(j), "no such field in the writer schema; fields are "
                        + schema.getFields().stream().map(Schema.Field::name).toList());
            }
            if (!isNumeric(field.schema())) {
                throw TableFormatException.ofColumn(name, keep.get(j), "field type " + field.schema()
                        + " is not numeric");
            }
            pos[j] = field.pos();
        }
        double[] cells = new double[Math.max(16, 64 * pos.length)];
        int rows = 0;
        GenericRecord record = null;
        while (reader.hasNext()) {
            record = reader.next(record);
            long row = rows + 1L;
            if ((long) (rows + 1) * pos.length > cells.length) {
                cells = Arrays.copyOf(cells, Math.max(cells.length * 2, (rows + 1) * pos.length));
            }
            for (int j = 0; j < pos.length; j++) {
                cells[rows * pos.length + j] = value(record.get(pos[j]), name, row, keep.get(j));
            }
            rows++;
        }
        if (rows == 0) {
            throw TableFormatException.ofFile(name, "no records after the header");
        }
        return NumericTable.of(name, keep, Arrays.copyOf(cells, rows * pos.length), rows);
    }

    private static double value(Object v, String name, long row, String column) {
        if (v == null) {
            throw TableFormatException.ofCell(name, row, column, "null (missing value)");
        }
        double d = ((Number) v).doubleValue();
        if (!Double.isFinite(d)) {
            throw TableFormatException.ofCell(name, row, column, "non-finite value " + d);
        }
        return d;
    }

    private static boolean isNumeric(Schema s) {
        switch (s.getType()) {
            case INT:
            case LONG:
            case FLOAT:
            case DOUBLE:
                return true;
            case UNION:
                List<Schema> branches = s.getTypes();
                long numeric = branches.stream().filter(AvroTableReader::isNumeric).count();
                long nulls = branches.stream().filter(b -> b.getType() == Schema.Type.NULL).count();
                return numeric == 1 && numeric + nulls == branches.size();
            default:
                return false;
        }
    }
}
