package lariat.table;

import java.util.Locale;
import java.util.regex.Pattern;

/**
 * Strict parsing of one text cell as a finite decimal number: optional sign, digits with an optional
 * fraction, optional exponent. Java's suffixes ({@code 1d}, {@code 2f}), hexadecimal forms and
 * thousands separators are refused, so a cell means the same in every reader.
 */
final class NumericCell {

    private static final Pattern DECIMAL = Pattern.compile("[+-]?(\\d+\\.?\\d*|\\.\\d+)([eE][+-]?\\d+)?");
    private static final Pattern NON_FINITE = Pattern.compile("[+-]?(nan|inf|infinity)");

    private NumericCell() {
    }

    /**
     * @return the value
     * @throws TableFormatException naming file, row and column when the cell is empty, not a number,
     *                              or not finite
     */
    static double parse(String text, String file, long row, String column) {
        String t = text.strip();
        if (t.isEmpty()) {
            throw TableFormatException.ofCell(file, row, column, "empty cell (missing value)");
        }
        if (NON_FINITE.matcher(t.toLowerCase(Locale.ROOT)).matches()) {
            throw TableFormatException.ofCell(file, row, column, "non-finite value '" + t + "'");
        }
        if (!DECIMAL.matcher(t).matches()) {
            throw TableFormatException.ofCell(file, row, column, "not a number: '" + shorten(t) + "'");
        }
        double v = Double.parseDouble(t);
        if (!Double.isFinite(v)) {
            throw TableFormatException.ofCell(file, row, column, "non-finite value '" + t + "' (overflow)");
        }
        return v;
    }

    static String shorten(String t) {
        return t.length() <= 40 ? t : t.substring(0, 37) + "...";
    }
}
