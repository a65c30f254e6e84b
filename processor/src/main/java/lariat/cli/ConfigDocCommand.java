package lariat.cli;

import java.util.concurrent.Callable;

import lariat.config.StageConfig;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Spec;

/** The {@code config-doc} command: prints the configuration reference from the key definitions. */
@Command(name = "config-doc", mixinStandardHelpOptions = true,
        description = {
            "Prints the reference of every stage configuration key (type, default, valid values, "
                    + "whether it enters the configuration hash, and what it does) as a Markdown "
                    + "table, generated from the definitions the stage itself validates against.",
            "The README's configuration section is this output; a test keeps the two equal."},
        footer = {"", "Example:", "  lariat config-doc > config-reference.md"})
public final class ConfigDocCommand implements Callable<Integer> {

    @Spec
    CommandSpec spec;

    @Override
    public Integer call() {
        spec.commandLine().getOut().print(StageConfig.referenceMarkdown());
        spec.commandLine().getOut().flush();
        return 0;
    }
}
