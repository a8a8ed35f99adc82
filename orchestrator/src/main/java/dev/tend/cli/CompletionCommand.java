package dev.tend.cli;

import picocli.AutoComplete;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

import java.util.concurrent.Callable;

/**
 * {@code tend completion bash|zsh}: a completion script for the shell, generated from the
 * command definitions by picocli's {@link AutoComplete} (the zsh form loads zsh's bash
 * completion compatibility first).
 */
@Command(name = "completion", mixinStandardHelpOptions = true,
        description = "Print a shell completion script for tend's commands and options.%n"
                + "bash: source <(tend completion bash)    zsh: source <(tend completion zsh)")
public final class CompletionCommand implements Callable<Integer> {
    @Spec
    CommandSpec spec;

    @Parameters(index = "0", paramLabel = "SHELL", description = "bash or zsh")
    Shell shell;

    enum Shell { bash, zsh }

    @Override
    public Integer call() {
        String script = AutoComplete.bash("tend", spec.root().commandLine());
        if (shell == Shell.zsh) {
            script = "autoload -U +X compinit && compinit\nautoload -U +X bashcompinit && bashcompinit\n" + script;
        }
        spec.commandLine().getOut().print(script);
        spec.commandLine().getOut().flush();
        return ExitCodes.OK;
    }
}
