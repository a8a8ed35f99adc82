package dev.tend.cli;

import dev.tend.audit.Anchor;
import dev.tend.audit.AnchorVerifier;
import dev.tend.audit.LedgerKey;
import dev.tend.store.LedgerEntry;
import dev.tend.store.LedgerFilter;
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
@Command(name = "audit", mixinStandardHelpOptions = true, subcommands = {AuditCommand.Verify.class, AuditCommand.AnchorCommand.class},
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

    @Option(names = "--format", defaultValue = "text", converter = OutputFormat.TextJsonOrCsv.class,
            completionCandidates = OutputFormat.TextJsonOrCsv.class, description = "text, json (JSON Lines) or csv (default: ${DEFAULT-VALUE})")
    OutputFormat format;

    @Override
    public Integer call() throws Exception {
        PrintWriter out = spec.commandLine().getOut();
        Clock clock = Clock.systemDefaultZone();
        LedgerFilter f = LedgerFilter.all();
        if (since != null) f = f.withSince(TimeArg.parse("--since", since, clock));
        if (until != null) f = f.withUntil(TimeArg.parse("--until", until, clock));
        if (cluster != null) f = f.withCluster(cluster);
        if (playbook != null) f = f.withPlaybook(playbook);
        if (kind != null) f = f.withKind(kind);
        if (run != null) f = f.withRun(run);
        LedgerFilter filter = f;
        try (Store store = db.openExisting()) {
            if (kind != null) checkKind(store.read(r -> r.ledgerKinds()));
            if (format == OutputFormat.csv) out.println("seq,at,kind,cluster,playbook,run,hash,entry");
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

    /** {@code tend audit verify}: exit 0 when the chain (and the checkpoints, and the anchor) hold, 1 naming the first entry at fault. */
    @Command(name = "verify", mixinStandardHelpOptions = true,
            description = "Recompute the ledger's hash chain; with --ledger-key also check every checkpoint, with --anchor"
                    + " also check an anchor kept elsewhere. Exit 1 naming the first entry at fault: edited, dropped,"
                    + " reordered, rewritten with every hash recomputed, cut off, or checkpointed with another key.")
    public static final class Verify implements Callable<Integer> {
        @Spec
        CommandSpec spec;

        @Mixin
        DbOption db;

        @Mixin
        LedgerKeyOption ledgerKey;

        @Option(names = "--anchor", paramLabel = "SEQ:HASH", description = "a head printed earlier by tend audit anchor")
        String anchor;

        @Override
        public Integer call() throws Exception {
            LedgerKey key = ledgerKey.load();
            Anchor a = anchor == null ? null : Anchor.parse("--anchor", anchor);
            PrintWriter out = spec.commandLine().getOut();
            try (Store store = db.openExisting()) {
                AnchorVerifier.Result v = store.read(r -> AnchorVerifier.verify(r, key, a));
                if (v.ok()) {
                    out.println("ledger ok: " + v.entries() + " entries, head " + v.headHash() + "; " + v.message());
                    for (String n : v.notes()) out.println("note: " + n);
                    return ExitCodes.OK;
                }
                out.println("ledger broken at entry " + v.firstAtFault() + ": " + v.message());
                return ExitCodes.FINDINGS;
            }
        }
    }

    /** {@code tend audit anchor}: the head as {@code seq:hash}, to keep outside tend. */
    @Command(name = "anchor", mixinStandardHelpOptions = true,
            description = "Print the ledger's head as SEQ:HASH, to keep elsewhere (a ticket, a chat message, another"
                    + " system); tend audit verify --anchor SEQ:HASH later proves that nothing up to it was rewritten or cut off.")
    public static final class AnchorCommand implements Callable<Integer> {
        @Spec
        CommandSpec spec;

        @Mixin
        DbOption db;

        @Override
        public Integer call() throws Exception {
            try (Store store = db.openExisting()) {
                var head = store.read(r -> r.ledgerHead());
                if (head.isEmpty()) throw new dev.tend.shared.TendException(db.db + ": the ledger is empty; there is nothing to anchor");
                spec.commandLine().getOut().println(head.get().seq() + ":" + head.get().hash());
                return ExitCodes.OK;
            }
        }
    }
}
