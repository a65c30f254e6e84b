package lariat.cli;

import lariat.codec.SchemaTrust;
import picocli.CommandLine;
import picocli.CommandLine.Command;

/** Entry point of the {@code lariat} command line. */
@Command(name = "lariat", mixinStandardHelpOptions = true,
        subcommands = {
            AuditCommand.class,
            BenchCommand.class,
            BrokerCommand.class,
            ClaimsCommand.class,
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

    public static void main(String[] args) {
        SchemaTrust.ensure();
        System.exit(new CommandLine(new Main()).execute(args));
    }

    @Override
    public void run() {
        spec.commandLine().usage(System.out);
    }
}
