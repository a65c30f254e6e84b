package lariat.scenario;

import java.io.BufferedWriter;
import java.io.Closeable;
import java.io.IOException;
import java.io.Writer;
import java.util.List;

/**
 * Writes rows as CSV (RFC 4180): a header {@code station,time,<columns…>,weight}, then one line
 * per row. Time is the event time in ms since the epoch; numbers use {@link Double#toString},
 * which reads back to the same double, so the file holds exactly the values sent.
 */
public final class CsvCopy implements Closeable {

    private final BufferedWriter out;
    private final int width;
    private final StringBuilder line = new StringBuilder(512);

    private CsvCopy(Writer out, List<String> columns) throws IOException {
        this.out = out instanceof BufferedWriter ? (BufferedWriter) out : new BufferedWriter(out);
        this.width = columns.size();
        line.append("station,time");
        for (String c : columns) {
            line.append(',').append(c);
        }
        line.append(",weight\n");
        this.out.write(line.toString());
    }

    /** Writes the header for {@code scenario}'s columns to {@code out}, which this object then owns. */
    public static CsvCopy open(Writer out, Scenario scenario) throws IOException {
        return new CsvCopy(out, scenario.columns());
    }

    /** Appends one row. */
    public void write(StationRow row) throws IOException {
        if (row.width() != width) {
            throw new IllegalArgumentException("row width must be " + width + ", got " + row.width());
        }
        line.setLength(0);
        line.append(row.station()).append(',').append(row.timeMs());
        for (int i = 0; i < width; i++) {
            line.append(',').append(row.value(i));
        }
        line.append(',').append(row.weight()).append('\n');
        out.write(line.toString());
    }

    @Override
    public void close() throws IOException {
        out.close();
    }
}
