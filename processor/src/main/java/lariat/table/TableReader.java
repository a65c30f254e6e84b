package lariat.table;

import java.nio.file.Path;
import java.util.List;
import java.util.Locale;

/** Reads a file into a {@link NumericTable}, refusing bad input with a {@link TableFormatException}. */
public interface TableReader {

    /**
     * @param file   the file to read
     * @param wanted the columns to keep, in this order, or {@code null} for every column in file order
     * @return the table; it has at least one data row
     * @throws TableFormatException naming file, row and column on any bad input
     */
    NumericTable read(Path file, List<String> wanted);

    /** The Avro object container reader for names ending in {@code .avro}, otherwise the CSV reader. */
    static TableReader forFile(Path file) {
        String name = file.getFileName() == null ? "" : file.getFileName().toString().toLowerCase(Locale.ROOT);
        return name.endsWith(".avro") ? new AvroTableReader() : new CsvTableReader();
    }
}
