package lariat.cli;

import lariat.config.StageConfig;
import lariat.stage.Stage;
import lariat.stage.StageAssembly;
import lariat.stage.TopicSetup;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.concurrent.Callable;

/** The {@code run} command: runs the stage until SIGTERM or SIGINT. */
@Command(name = "run", mixinStandardHelpOptions = true,
        description = {
            "Runs the stage: consumes readings from input.topic, keeps per-key moments, refits the lasso "
                + "path on schedule and publishes each model version exactly once (one Kafka transaction "
                + "per cycle, with alerts, dead letters, state snapshots and the consumed offsets).",
            "",
            "Missing output topics are created; an existing topic that does not fit (e.g. a snapshot "
                + "topic whose partition count differs from the input's) stops the command with a message "
                + "naming it. On SIGTERM the current cycle is committed or aborted and the clients close "
                + "within shutdown.timeout.ms. A restart with the same stage.id and stage.instance resumes "
                + "from the last committed cycle.",
            "",
            "Example configuration (processor/src/main/resources/examples/stage.properties):",
            "  bootstrap.servers=localhost:9092",
            "  input.topic=station.readings",
            "  field.key=station",
            "  field.time=time",
            "  field.features.map=channels",
            "  field.target=motor_current_a",
            "  field.features=flow_m3h,suction_kpa,discharge_kpa,vibration_mm_s,bearing_temp_c",
            "  refit.every.records=500",
            "  select.rule=bic",
            "",
            "Exit status: 0 after a clean shutdown, 1 on a runtime failure, 2 on a configuration error."
        })
public final class RunCommand implements Callable<Integer> {

    @Spec
    CommandSpec spec;

    @Option(names = "--config", paramLabel = "FILE", required = true,
            description = "Stage configuration (.properties): Lariat keys and Kafka client properties.")
    Path config;

    @Override
    public Integer call() throws IOException, InterruptedException {
        if (!Files.isRegularFile(config)) {
            spec.commandLine().getErr().println("--config: no such file: " + config);
            return 2;
        }
        Stage stage;
        try {
            StageConfig c = StageConfig.load(config);
            Path base = config.toAbsolutePath().getParent();
            stage = StageAssembly.create(c, base);
        } catch (IllegalArgumentException e) {
            spec.commandLine().getErr().println("configuration " + config + ":\n" + e.getMessage());
            return 2;
        }
        Thread main = Thread.currentThread();
        Thread hook = new Thread(() -> {
            stage.shutdown();
            try {
                main.join(stage.closeTimeoutMs() + 5_000);
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
            }
        }, "lariat-shutdown");
        Runtime.getRuntime().addShutdownHook(hook);
        try {
            stage.run();
            return 0;
        } catch (TopicSetup.TopicMismatchException e) {
            spec.commandLine().getErr().println("topics: " + e.getMessage());
            return 1;
        }
    }
}
