package dev.tend.cli;

import dev.tend.store.LedgerEntry;
import dev.tend.store.LedgerFilter;
import dev.tend.store.LedgerVerification;
import dev.tend.store.RunRow;
import dev.tend.store.Store;
import picocli.CommandLine;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;
import picocli.CommandLine.Model.CommandSpec;

import java.io.PrintWriter;
import java.time.Clock;
import java.util.HashMap;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import java.util.concurrent.Callable;

/** {@code tend audit}: read the ledger; {@code tend audit verify}: check its hash chain. */
@Command(name = "audit", mixinStandardHelpOptions = true, subcommands = AuditCommand.Verify.class,
        description = "Show ledger entries (every verdict, run and step change, executor call, approval, exclusion,"
                + " brake change, policy load and operator command), oldest first.")
public final class AuditCommand implements Callable<Integer> {
    @Spec
    CommandSpec spec;

    @Mixin
    DbOption db;

    @Option(names = "--since", paramLabel = "T", description = "RFC 3339 time, clock time (22:00) or duration ago (8h)")
    String since;

    @Option(names = "--until", paramLabel = "T")
    String until;

    @Option(names = "--cluster", paramLabel = "C")
    String cluster;

    @Option(names = "--playbook", paramLabel = "P")
    String playbook;

    @Option(names = "--kind", paramLabel = "K", description = "entry kind, e.g. verdict, run-started, executor-call")
    String kind;

    @Option(names = "--run", paramLabel = "RUN")
    String run;

    @Option(names = "--format", defaultValue = "text", description = "text, json (JSON Lines) or csv (default: ${DEFAULT-VALUE})")
    Format format;

    enum Format { text, json, csv }

    @Override
    public Integer call() throws Exception {
        PrintWriter out = spec.commandLine().getOut();
        Clock clock = Clock.systemDefaultZone();
        LedgerFilter f = LedgerFilter.all();
        if (since != null) f = f.withSince(TimeArg.parse(since, clock));
        if (until != null) f = f.withUntil(TimeArg.parse(until, clock));
        if (cluster != null) f = f.withCluster(cluster);
        if (playbook != null) f = f.withPlaybook(playbook);
        if (kind != null) f = f.withKind(kind);
        if (run != null) f = f.withRun(run);
        LedgerFilter filter = f;
        try (Store store = db.openExisting()) {
            if (kind != null) checkKind(store.read(r -> r.ledgerKinds()));
            if (format == Format.csv) out.println("seq,at,kind,cluster,playbook,run,hash,entry");
            store.read(r -> {
                Map<String, Optional<String>> nodes = new HashMap<>();
                LedgerText text = new LedgerText(run -> nodes.computeIfAbsent(run, id -> r.run(id).map(RunRow::node)).orElse(null));
                r.forEachLedger(filter, e -> out.println(render(e, text)));
                return null;
            });
        }
        out.flush();
        return ExitCodes.OK;
    }

    /** A kind no tend writes and this ledger does not hold is a mistake: say so, with the nearest kind (exit 2). */
    private void checkKind(Set<String> present) {
        Set<String> known = LedgerKinds.known(present);
        if (known.contains(kind)) return;
        String near = LedgerKinds.nearest(kind, known).map(k -> " (did you mean '" + k + "'?)").orElse("");
        throw new CommandLine.ParameterException(spec.commandLine(), "--kind: no ledger entry kind '" + kind + "'" + near
                + "; the kinds are: " + String.join(", ", known));
    }

    private String render(LedgerEntry e, LedgerText text) {
        return switch (format) {
            case json -> e.entry();
            case csv -> e.seq() + "," + e.at() + "," + e.kind() + "," + nz(e.cluster()) + "," + nz(e.playbook()) + ","
                    + nz(e.run()) + "," + e.hash() + "," + csv(e.entry());
            default -> text.line(e);
        };
    }

    private static String nz(String s) {
        return s == null ? "" : s;
    }

    private static String csv(String s) {
        return "\"" + s.replace("\"", "\"\"") + "\"";
    }

    /** {@code tend audit verify}: exit 0 when the chain is whole, 1 naming the first broken entry. */
    @Command(name = "verify", mixinStandardHelpOptions = true,
            description = "Recompute the ledger's hash chain; exit 1 naming the first edited, dropped or reordered entry.")
    public static final class Verify implements Callable<Integer> {
        @Spec
        CommandSpec spec;

        @Mixin
        DbOption db;

        @Override
        public Integer call() throws Exception {
            try (Store store = db.openExisting()) {
                LedgerVerification v = store.read(r -> r.verifyLedger());
                if (v.ok()) {
                    spec.commandLine().getOut().println("ledger ok: " + v.entries() + " entries, head " + v.headHash());
                    return ExitCodes.OK;
                }
                spec.commandLine().getOut().println("ledger broken: " + v.reason());
                return ExitCodes.FINDINGS;
            }
        }
    }
}
