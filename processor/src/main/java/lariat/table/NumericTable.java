package lariat.table;

import java.util.ArrayList;
import java.util.Collections;
import java.util.List;

/**
 * An immutable table of finite doubles read from a file: named columns, rows stored row-major.
 * Arrays are copied in and out.
 */
public final class NumericTable {

    private final String source;
    private final List<String> columns;
    private final double[] cells;
    private final int rows;

    private NumericTable(String source, List<String> columns, double[] cells, int rows) {
        this.source = source;
        this.columns = columns;
        this.cells = cells;
        this.rows = rows;
    }

    /**
     * @param source   the file name, for messages
     * @param columns  distinct column names
     * @param rowMajor {@code rows * columns.size()} finite values, row after row
     * @param rows     number of rows
     */
    public static NumericTable of(String source, List<String> columns, double[] rowMajor, int rows) {
        if (source == null) {
            throw new IllegalArgumentException("source must not be null");
        }
        List<String> names = List.copyOf(columns);
        if (names.isEmpty()) {
            throw new IllegalArgumentException("columns must not be empty");
        }
        if (new java.util.HashSet<>(names).size() != names.size()) {
            throw new IllegalArgumentException("columns must be distinct: " + names);
        }
        if (rows < 0 || rowMajor.length != (long) rows * names.size()) {
            throw new IllegalArgumentException("rowMajor length " + rowMajor.length + " != rows " + rows
                    + " x columns " + names.size());
        }
        for (int i = 0; i < rowMajor.length; i++) {
            if (!Double.isFinite(rowMajor[i])) {
                throw new IllegalArgumentException("rowMajor[" + i + "] is not finite: " + rowMajor[i]);
            }
        }
        return new NumericTable(source, names, rowMajor.clone(), rows);
    }

    public String source() {
        return source;
    }

    public List<String> columns() {
        return columns;
    }

    public int rows() {
        return rows;
    }

    public int width() {
        return columns.size();
    }

    /** Index of a column, or -1 when absent. */
    public int indexOf(String column) {
        return columns.indexOf(column);
    }

    public double get(int row, int column) {
        if (row < 0 || row >= rows) {
            throw new IllegalArgumentException("row out of range: " + row);
        }
        if (column < 0 || column >= columns.size()) {
            throw new IllegalArgumentException("column out of range: " + column);
        }
        return cells[row * columns.size() + column];
    }

    /** A copy of one column. */
    public double[] column(int column) {
        if (column < 0 || column >= columns.size()) {
            throw new IllegalArgumentException("column out of range: " + column);
        }
        double[] out = new double[rows];
        for (int r = 0; r < rows; r++) {
            out[r] = cells[r * columns.size() + column];
        }
        return out;
    }

    /** A copy of the named columns in the given order. */
    public NumericTable select(List<String> wanted) {
        int[] idx = new int[wanted.size()];
        for (int j = 0; j < idx.length; j++) {
            idx[j] = indexOf(wanted.get(j));
            if (idx[j] < 0) {
                throw TableFormatException.ofColumn(source, wanted.get(j), "no such column; columns are "
                        + columns);
            }
        }
        double[] out = new double[rows * idx.length];
        for (int r = 0; r < rows; r++) {
            for (int j = 0; j < idx.length; j++) {
                out[r * idx.length + j] = cells[r * columns.size() + idx[j]];
            }
        }
        return new NumericTable(source, List.copyOf(wanted), out, rows);
    }

    /** Column names other than the excluded ones, in table order. */
    public List<String> columnsExcept(List<String> excluded) {
        List<String> out = new ArrayList<>(columns);
        out.removeAll(excluded);
        return Collections.unmodifiableList(out);
    }
}
