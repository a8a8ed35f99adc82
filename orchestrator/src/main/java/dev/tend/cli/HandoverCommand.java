package dev.tend.cli;

import dev.tend.handover.HandoverCsv;
import dev.tend.handover.HandoverHtml;
import dev.tend.handover.HandoverReport;
import dev.tend.handover.HandoverText;
import dev.tend.handover.ReportPeriod;
import dev.tend.store.Store;
import dev.tend.store.StoreReader;
import picocli.CommandLine;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;
import picocli.CommandLine.Model.CommandSpec;

import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Clock;
import java.time.Instant;
import java.util.concurrent.Callable;

/**
 * {@code tend handover}: what automation did in a period, from the ledger. Exit 0, or 1 when
 * the ledger fails verify (the report is still written, and says so first).
 */
@Command(name = "handover", mixinStandardHelpOptions = true,
        description = "What automation did from --since until --until (default: now), computed from the ledger: runs started,"
                + " succeeded, failed, held and denied by playbook and reason code, nodes remediated, approvals pending and"
                + " lapsed, fleet brake periods, runs that need a person, and whether the ledger verifies (exit 1 if not).")
public final class HandoverCommand implements Callable<Integer> {
    @Spec
    CommandSpec spec;

    @Mixin
    DbOption db;

    @Option(names = "--since", required = true, paramLabel = "T",
            description = "RFC 3339 time, clock time (22:00: its latest past occurrence, local zone) or duration ago (8h)")
    String since;

    @Option(names = "--until", paramLabel = "T", description = "end of the period, not included (default: now, or just after the ledger's last entry when that is later)")
    String until;

    @Option(names = "--format", defaultValue = "text", converter = OutputFormat.TextCsvOrHtml.class,
            completionCandidates = OutputFormat.TextCsvOrHtml.class,
            description = "text (one screen), csv (one table, see --table) or html (one self-contained page with a timeline); default: ${DEFAULT-VALUE}")
    OutputFormat format;

    @Option(names = "--out", paramLabel = "FILE", description = "write the report to FILE instead of standard output")
    Path out;

    @Option(names = "--table", defaultValue = "runs", paramLabel = "T",
            description = "with --format csv, the one table to write: runs (one row per run) or summary (one metric per row);"
                    + " default: ${DEFAULT-VALUE}")
    Table table;

    enum Table { runs, summary }

    /**
     * The end of a period that lasts "until now": now, or just after the ledger's last entry
     * when that is later (the demo's accelerated time runs ahead of the wall clock, and an
     * approval settled there must not show as pending).
     */
    static Instant endOfNow(StoreReader r, Clock clock) {
        Instant now = clock.instant();
        return r.ledgerHead().map(h -> h.at().plusNanos(1)).filter(t -> t.isAfter(now)).orElse(now);
    }

    @Override
    public Integer call() throws Exception {
        Clock clock = Clock.systemDefaultZone();
        Instant from = TimeArg.parse("--since", since, clock);
        HandoverReport report;
        try (Store store = db.openExisting()) {
            Instant to = until != null ? TimeArg.parse("--until", until, clock) : store.read(r -> endOfNow(r, clock));
            if (!to.isAfter(from)) {
                throw new CommandLine.ParameterException(spec.commandLine(),
                        "--until (" + to + ") must be after --since (" + from + ")");
            }
            ReportPeriod period = ReportPeriod.of(from, to);
            report = store.read(r -> HandoverReport.from(r, period));
        }
        String text = switch (format) {
            case csv -> table == Table.summary ? HandoverCsv.summary(report) : HandoverCsv.runs(report);
            case html -> HandoverHtml.render(report);
            default -> HandoverText.render(report);
        };
        if (out == null) {
            spec.commandLine().getOut().print(text);
            spec.commandLine().getOut().flush();
        } else {
            Path parent = out.toAbsolutePath().getParent();
            if (parent != null) Files.createDirectories(parent);
            Files.writeString(out, text, StandardCharsets.UTF_8);
        }
        if (!report.ledger().verified()) {
            spec.commandLine().getErr().println("tend: the ledger failed verify at entry " + report.ledger().firstBrokenSeq()
                    + ": " + report.ledger().verifyMessage());
            return ExitCodes.FINDINGS;
        }
        return ExitCodes.OK;
    }
}
