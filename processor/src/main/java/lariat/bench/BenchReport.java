package lariat.bench;

import java.util.Map;

/** What every benchmark result offers its command: a readable table and a JSON object. */
public interface BenchReport {

    /** The readable table, ending with a line break. */
    String table();

    /** The result as a JSON object (names and values as the command's --help describes). */
    Map<String, Object> toJson();
}
