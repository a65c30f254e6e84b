package lariat.table;

import java.io.BufferedReader;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;

/**
 * Comma-separated values with a header line, quoted as in RFC 4180 (Shafranovich 2005): a field in
 * double quotes may hold commas, line breaks and doubled quotes. Blank lines are skipped. Only the
 * wanted columns must be numeric; the others are not parsed. Every data row must have as many fields
 * as the header.
 */
public final class CsvTableReader implements TableReader {

    @Override
    public NumericTable read(Path file, List<String> wanted) {
        String name = file.toString();
        if (!Files.isRegularFile(file)) {
            throw TableFormatException.ofFile(name, Files.exists(file) ? "not a regular file" : "no such file");
        }
        try (BufferedReader in = Files.newBufferedReader(file, StandardCharsets.UTF_8)) {
            return read(new CsvRecords(in), name, wanted);
        } catch (NoSuchFileException e) {
            throw TableFormatException.ofFile(name, "no such file");
        } catch (java.nio.charset.CharacterCodingException e) {
            throw TableFormatException.ofFile(name, "not UTF-8 text");
        } catch (IOException e) {
            throw TableFormatException.ofFile(name, "cannot read: " + e.getMessage());
        }
    }

    private static NumericTable read(CsvRecords records, String name, List<String> wanted) throws IOException {
        List<String> header = records.next();
        if (header == null) {
            throw TableFormatException.ofFile(name, "empty file (no header line)");
        }
        if (!header.isEmpty() && header.get(0).startsWith("\uFEFF")) {
            header.set(0, header.get(0).substring(1));
        }
        Map<String, Integer> position = positions(header, name);
        List<String> keep = wanted == null ? header : List.copyOf(wanted);
        int[] idx = new int[keep.size()];
        for (int j = 0; j < idx.length; j++) {
            Integer at = position.get(keep.get(j));
            if (at == null) {
                throw TableFormatException.ofColumn(name, keep.get(j), "no such column in the header; columns are "
                        + header);
            }
            idx[j] = at;
        }
        double[] cells = new double[Math.max(16, 64 * idx.length)];
        int rows = 0;
        for (List<String> fields = records.next(); fields != null; fields = records.next()) {
            long row = rows + 1L;
            if (fields.size() != header.size()) {
                throw TableFormatException.ofRow(name, row, fields.size() + " fields, but the header has "
                        + header.size() + " (line " + records.lineOfLastRecord() + ")");
            }
            if ((long) (rows + 1) * idx.length > cells.length) {
                cells = java.util.Arrays.copyOf(cells, Math.max(cells.length * 2, (rows + 1) * idx.length));
            }
            for (int j = 0; j < idx.length; j++) {
                cells[rows * idx.length + j] = NumericCell.parse(fields.get(idx[j]), name, row, keep.get(j));
            }
            rows++;
        }
        if (rows == 0) {
            throw TableFormatException.ofFile(name, "no data rows after the header");
        }
        return NumericTable.of(name, keep, java.util.Arrays.copyOf(cells, rows * idx.length), rows);
    }

    private static Map<String, Integer> positions(List<String> header, String name) {
        Map<String, Integer> position = new HashMap<>();
        for (int i = 0; i < header.size(); i++) {
            String column = header.get(i).strip();
            header.set(i, column);
            if (position.put(column, i) != null) {
                throw TableFormatException.ofColumn(name, column, "appears twice in the header");
            }
        }
        return position;
    }

    /** Splits a character stream into records of fields. */
    private static final class CsvRecords {
        private final BufferedReader in;
        private long line = 1;
        private long recordLine;

        CsvRecords(BufferedReader in) {
            this.in = in;
        }

        long lineOfLastRecord() {
            return recordLine;
        }

        /** The next non-blank record, or {@code null} at the end of input. */
        List<String> next() throws IOException {
            while (true) {
                recordLine = line;
                List<String> fields = new ArrayList<>();
                StringBuilder field = new StringBuilder();
                boolean quoted = false;
                boolean any = false;
                int c;
                while ((c = in.read()) >= 0) {
                    any = true;
                    if (quoted) {
                        if (c == '"') {
                            in.mark(1);
                            int d = in.read();
                            if (d == '"') {
                                field.append('"');
                            } else {
                                quoted = false;
                                if (d >= 0) {
                                    in.reset();
                                }
                            }
                        } else {
                            if (c == '\n') {
                                line++;
                            }
                            field.append((char) c);
                        }
                    } else if (c == '"' && field.length() == 0) {
                        quoted = true;
                    } else if (c == ',') {
                        fields.add(field.toString());
                        field.setLength(0);
                    } else if (c == '\n') {
                        line++;
                        break;
                    } else if (c != '\r') {
                        field.append((char) c);
                    }
                }
                if (!any) {
                    return null;
                }
                fields.add(field.toString());
                if (fields.size() == 1 && fields.get(0).isBlank()) {
                    continue;
                }
                return fields;
            }
        }
    }
}
