package dev.tend.cli;

import dev.tend.executor.ExecutorRegistry;
import dev.tend.playbooks.Playbook;
import dev.tend.playbooks.PlaybookSet;
import dev.tend.playbooks.lint.Finding;
import dev.tend.playbooks.lint.FindingsFormat;
import dev.tend.playbooks.lint.Lint;
import dev.tend.playbooks.load.PlaybookLoader;
import dev.tend.shared.InvalidInputException;
import dev.tend.shared.Problem;
import dev.tend.shared.fleet.Fleet;
import dev.tend.shared.fleet.FleetFile;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

import java.io.PrintWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.concurrent.Callable;

/** {@code tend check DIR}: load a playbook directory, report every mistake, lint it. */
@Command(name = "check", mixinStandardHelpOptions = true,
        description = "Load and lint a playbook directory: every mistake as FILE:LINE:COL: message.%n"
                + "Exit 0 clean, 1 findings, 2 usage or input error.")
public final class CheckCommand implements Callable<Integer> {
    @Spec
    CommandSpec spec;

    @Parameters(index = "0", paramLabel = "DIR", description = "directory of playbooks, with actions.yaml and optionally tend.yaml")
    Path dir;

    @Option(names = "--fleet", paramLabel = "FILE", description = "fleet file (YAML or JSON) to check limits against")
    Path fleetFile;

    @Option(names = "--config", paramLabel = "FILE", description = "fleet-wide policy (default: DIR/tend.yaml if present)")
    Path config;

    @Mixin
    TextOrJsonFormat format;

    @Override
    public Integer call() {
        PrintWriter out = spec.commandLine().getOut();
        PrintWriter err = spec.commandLine().getErr();
        if (!Files.isDirectory(dir)) {
            err.println(dir + ": not a directory of playbooks");
            return ExitCodes.USAGE;
        }
        PlaybookSet set;
        Fleet fleet = null;
        try {
            set = config == null ? PlaybookLoader.load(dir) : PlaybookLoader.load(dir, config);
            if (fleetFile != null) fleet = FleetFile.load(fleetFile);
        } catch (InvalidInputException e) {
            for (Problem p : e.problems()) err.println(p);
            err.println(e.problems().size() + (e.problems().size() == 1 ? " problem" : " problems") + "; nothing was checked further");
            return ExitCodes.USAGE;
        }
        List<Finding> findings = Lint.check(set, fleet, ExecutorRegistry.kinds());
        if (format.json()) {
            out.println(FindingsFormat.json(findings));
        } else {
            out.println(summary(set, fleet));
            out.print(FindingsFormat.text(findings)); // the findings, then one summary line
        }
        return findings.isEmpty() ? ExitCodes.OK : ExitCodes.FINDINGS;
    }

    private String summary(PlaybookSet set, Fleet fleet) {
        StringBuilder sb = new StringBuilder();
        sb.append("loaded ").append(set.size()).append(set.size() == 1 ? " playbook" : " playbooks").append(" and ")
                .append(set.actions().ids().size()).append(" actions from ").append(dir).append('\n');
        for (Playbook p : set.playbooks()) {
            sb.append("  ").append(p.id()).append(" v").append(p.version()).append(" (").append(p.mode().wireName())
                    .append("): ").append(p.trigger().signal()).append(' ').append(p.trigger().state().wireName())
                    .append(" on ").append(p.trigger().scope().wireName()).append(", ").append(p.steps().size())
                    .append(p.steps().size() == 1 ? " step" : " steps").append('\n');
        }
        if (fleet != null) {
            int nodes = fleet.clusters().stream().mapToInt(c -> c.size()).sum();
            sb.append("fleet ").append(fleet.name()).append(": ").append(fleet.size()).append(" clusters, ").append(nodes)
                    .append(" nodes in zones ").append(String.join(", ", fleet.zones()));
        } else {
            sb.append("no fleet file given: limits were not checked against a topology");
        }
        return sb.toString();
    }
}
