package lariat.cli;

import picocli.CommandLine;
import picocli.CommandLine.Command;

/** Entry point of the {@code lariat} command line. */
@Command(name = "lariat", mixinStandardHelpOptions = true,
        subcommands = {
            AuditCommand.class,
            BenchCommand.class,
            BrokerCommand.class,
            ConfigDocCommand.class,
            DemoCommand.class,
            FitCommand.class,
            HistoryCommand.class,
            ProduceCommand.class,
            RecomputeCommand.class,
            RunCommand.class,
        },
        description = "Streaming lasso-path feature selection for Kafka pipelines.")
public final class Main implements Runnable {

    @CommandLine.Spec
    CommandLine.Model.CommandSpec spec;

    /** Avro 1.12 decodes into generated classes only from packages named in this system property. */
    static final String AVRO_TRUSTED_PACKAGES = "org.apache.avro.SERIALIZABLE_PACKAGES";

    public static void main(String[] args) {
        trustGeneratedSchemaClasses();
        System.exit(new CommandLine(new Main()).execute(args));
    }

    /** Adds {@code lariat.schema} to Avro's trusted packages unless the user set the property. */
    static void trustGeneratedSchemaClasses() {
        if (System.getProperty(AVRO_TRUSTED_PACKAGES) == null) {
            System.setProperty(AVRO_TRUSTED_PACKAGES, "lariat.schema");
        }
    }

    @Override
    public void run() {
        spec.commandLine().usage(System.out);
    }
}
