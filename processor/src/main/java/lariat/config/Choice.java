package lariat.config;

/** A configuration value chosen from a fixed set, spelled by {@link #id()} in a properties file. */
public interface Choice {

    /** The spelling of this choice in a properties file, e.g. {@code avro-single-object}. */
    String id();
}
