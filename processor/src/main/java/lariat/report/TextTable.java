package lariat.report;

import java.util.ArrayList;
import java.util.List;

/**
 * A plain-text table for the console: a header row, a rule, then rows; each column padded to its
 * widest cell, text columns left-aligned and numeric columns right-aligned.
 */
public final class TextTable {

    /** Alignment of one column. */
    public enum Align { LEFT, RIGHT }

    private final List<String> headers;
    private final List<Align> aligns;
    private final List<List<String>> rows = new ArrayList<>();

    /** A table with the given header names and one alignment per column. */
    public TextTable(List<String> headers, List<Align> aligns) {
        if (headers.isEmpty() || headers.size() != aligns.size()) {
            throw new IllegalArgumentException("headers (" + headers.size() + ") and aligns (" + aligns.size()
                    + ") must be non-empty and of equal length");
        }
        this.headers = List.copyOf(headers);
        this.aligns = List.copyOf(aligns);
    }

    /** Appends a row with one cell per column. */
    public TextTable row(String... cells) {
        if (cells.length != headers.size()) {
            throw new IllegalArgumentException("row has " + cells.length + " cells, table has " + headers.size()
                    + " columns");
        }
        rows.add(List.of(cells));
        return this;
    }

    public int rowCount() {
        return rows.size();
    }

    /** The table, lines separated by {@code \n}, ending with a line break. */
    public String render() {
        int[] width = new int[headers.size()];
        for (int j = 0; j < width.length; j++) {
            width[j] = headers.get(j).length();
            for (List<String> r : rows) {
                width[j] = Math.max(width[j], r.get(j).length());
            }
        }
        StringBuilder b = new StringBuilder();
        line(b, headers, width);
        for (int j = 0; j < width.length; j++) {
            b.append(j == 0 ? "" : "  ").append("-".repeat(width[j]));
        }
        b.append('\n');
        for (List<String> r : rows) {
            line(b, r, width);
        }
        return b.toString();
    }

    private void line(StringBuilder b, List<String> cells, int[] width) {
        StringBuilder l = new StringBuilder();
        for (int j = 0; j < width.length; j++) {
            String c = cells.get(j);
            String pad = " ".repeat(width[j] - c.length());
            l.append(j == 0 ? "" : "  ").append(aligns.get(j) == Align.LEFT ? c + pad : pad + c);
        }
        b.append(l.toString().stripTrailing()).append('\n');
    }
}
