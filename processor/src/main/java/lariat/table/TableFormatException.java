package lariat.table;

/**
 * Bad offline input: a file that cannot be read as a numeric table. The message is one line that
 * names the file and, where they apply, the data row (1-based, the header is not counted) and the
 * column; {@link #row()} is 0 and {@link #column()} is {@code null} when they do not apply.
 */
public final class TableFormatException extends IllegalArgumentException {

    private final String file;
    private final long row;
    private final String column;

    private TableFormatException(String file, long row, String column, String message) {
        super(message);
        this.file = file;
        this.row = row;
        this.column = column;
    }

    /** A problem with the file as a whole (missing, empty, too few rows). */
    public static TableFormatException ofFile(String file, String problem) {
        return new TableFormatException(file, 0, null, file + ": " + problem);
    }

    /** A problem with a column as a whole (absent from the header, wrong type). */
    public static TableFormatException ofColumn(String file, String column, String problem) {
        return new TableFormatException(file, 0, column, file + ": column '" + column + "': " + problem);
    }

    /** A problem with one row as a whole (wrong field count). */
    public static TableFormatException ofRow(String file, long row, String problem) {
        return new TableFormatException(file, row, null, file + ": row " + row + ": " + problem);
    }

    /** A problem with one cell. */
    public static TableFormatException ofCell(String file, long row, String column, String problem) {
        return new TableFormatException(file, row, column,
                file + ": row " + row + ", column '" + column + "': " + problem);
    }

    /** The file as given by the caller. */
    public String file() {
        return file;
    }

    /** The 1-based data row, or 0 when the problem is not tied to one row. */
    public long row() {
        return row;
    }

    /** The column name, or {@code null} when the problem is not tied to one column. */
    public String column() {
        return column;
    }
}
