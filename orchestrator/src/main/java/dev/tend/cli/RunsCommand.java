package dev.tend.cli;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import dev.tend.store.RunFilter;
import dev.tend.store.RunRow;
import dev.tend.store.StepRow;
import dev.tend.store.Store;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;
import picocli.CommandLine.Model.CommandSpec;

import java.io.PrintWriter;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.concurrent.Callable;

/** {@code tend runs}: the runs in the store, newest first. */
@Command(name = "runs", mixinStandardHelpOptions = true, description = "List runs, newest first.")
public final class RunsCommand implements Callable<Integer> {
    @Spec
    CommandSpec spec;

    @Mixin
    DbOption db;

    @Option(names = "--active", description = "only runs that are executing, paused, or waiting for a person")
    boolean active;

    @Option(names = "--cluster", paramLabel = "C")
    String cluster;

    @Option(names = "--playbook", paramLabel = "P")
    String playbook;

    @Mixin
    TextOrJsonFormat format;

    @Override
    public Integer call() throws Exception {
        PrintWriter out = spec.commandLine().getOut();
        try (Store store = db.openExisting()) {
            RunFilter f = RunFilter.all().withActiveOnly(active);
            if (cluster != null) f = f.withCluster(cluster);
            if (playbook != null) f = f.withPlaybook(playbook);
            RunFilter filter = f;
            List<Map<String, Object>> runs = store.read(r -> {
                List<Map<String, Object>> list = new ArrayList<>();
                for (RunRow row : r.runs(filter)) list.add(toMap(row, r.steps(row.runId())));
                return list;
            });
            if (format.json()) {
                out.println(new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT).writeValueAsString(runs));
            } else if (runs.isEmpty()) {
                out.println("no runs");
            } else {
                out.printf("%-8s %-32s %-14s %-6s %-18s %-21s %s%n", "RUN", "PLAYBOOK", "CLUSTER", "NODE", "STATE", "STARTED", "OUTCOME");
                for (Map<String, Object> m : runs) {
                    out.printf("%-8s %-32s %-14s %-6s %-18s %-21s %s%n", m.get("run"), m.get("playbook"), m.get("cluster"),
                            m.get("node") == null ? "-" : m.get("node"), m.get("state"), startedText(m),
                            m.get("outcome") == null ? "" : m.get("outcome"));
                }
            }
        }
        return ExitCodes.OK;
    }

    private static String startedText(Map<String, Object> run) {
        Object at = run.get("started_at");
        return at == null ? "-" : Render.time(java.time.Instant.parse((String) at));
    }

    static Map<String, Object> toMap(RunRow r, List<StepRow> steps) {
        Map<String, Object> m = new LinkedHashMap<>();
        m.put("run", r.runId());
        m.put("playbook", r.playbook());
        m.put("version", r.playbookVersion());
        m.put("cluster", r.cluster());
        m.put("node", r.node());
        m.put("state", r.state().wireName());
        m.put("shadow", r.shadow());
        m.put("created_at", str(r.createdAt()));
        m.put("started_at", str(r.startedAt()));
        m.put("ended_at", str(r.endedAt()));
        m.put("outcome", r.outcome());
        List<Map<String, Object>> s = new ArrayList<>();
        for (StepRow st : steps) {
            Map<String, Object> sm = new LinkedHashMap<>();
            sm.put("step", st.stepId());
            sm.put("state", st.state().wireName());
            sm.put("attempt", st.attempt());
            sm.put("started_at", str(st.startedAt()));
            sm.put("ended_at", str(st.endedAt()));
            sm.put("outcome", st.outcome());
            s.add(sm);
        }
        m.put("steps", s);
        return m;
    }

    private static String str(Object o) {
        return o == null ? null : o.toString();
    }
}
