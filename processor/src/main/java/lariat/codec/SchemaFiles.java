package lariat.codec;

import java.io.IOException;
import java.nio.file.Path;
import org.apache.avro.Schema;
import org.apache.avro.SchemaParseException;

/** Reads Avro schema files (.avsc); each file gets its own parser so versions of one record name can coexist. */
final class SchemaFiles {

    private SchemaFiles() {
    }

    /**
     * @param configKey the key that named the file, for the error message
     * @throws IllegalArgumentException naming the key and file when it cannot be read or parsed
     */
    static Schema read(String configKey, Path baseDir, String file) {
        Path p = baseDir.resolve(file);
        try {
            Schema s = new Schema.Parser().parse(p.toFile());
            if (s.getType() != Schema.Type.RECORD) {
                throw new IllegalArgumentException(configKey + ": schema in '" + file + "' must be a record, got "
                        + s.getType().getName());
            }
            return s;
        } catch (IOException e) {
            throw new IllegalArgumentException(configKey + ": cannot read '" + file + "': " + e, e);
        } catch (SchemaParseException e) {
            throw new IllegalArgumentException(configKey + ": '" + file + "' is not a valid Avro schema: "
                    + e.getMessage(), e);
        }
    }
}
