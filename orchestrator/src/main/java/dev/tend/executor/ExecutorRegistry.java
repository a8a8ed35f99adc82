package dev.tend.executor;

import dev.tend.http.OutgoingHttp;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.function.Function;

/**
 * The executors this build has, by the action kind each serves: the one list {@code serve}
 * and {@code ingest} build their executors from and {@code check} lints action kinds against.
 * To add an executor, add it here (and its action kind to the playbook loader's
 * {@code actions.yaml} reader).
 */
public final class ExecutorRegistry {
    /** What the executors are built from: the command executor's working folder, the simulated one's seed and time scale, outgoing HTTP. */
    public record Settings(Path workDir, long seed, double speedup, OutgoingHttp http) {
    }

    private static final Map<String, Function<Settings, Executor>> MAKERS = makers();

    private ExecutorRegistry() {
    }

    private static Map<String, Function<Settings, Executor>> makers() {
        Map<String, Function<Settings, Executor>> m = new LinkedHashMap<>();
        m.put("command", s -> new CommandExecutor(s.workDir()));
        m.put("simulated", s -> new SimulatedExecutor(s.seed(), s.speedup()));
        m.put("http", s -> HttpExecutor.withDefaults(s.http()));
        return Collections.unmodifiableMap(m);
    }

    /** The action kinds this build has an executor for. */
    public static Set<String> kinds() {
        return MAKERS.keySet();
    }

    /** One new executor per kind, in the order of {@link #kinds()}; each serves the kind it is registered under. */
    public static List<Executor> build(Settings settings) {
        List<Executor> out = new ArrayList<>();
        for (Map.Entry<String, Function<Settings, Executor>> e : MAKERS.entrySet()) {
            Executor x = e.getValue().apply(settings);
            if (!x.kind().equals(e.getKey())) {
                throw new IllegalStateException("the executor registered for '" + e.getKey() + "' serves '" + x.kind() + "'");
            }
            out.add(x);
        }
        return out;
    }

    /** {@link #build} as one resource: closing it closes every executor. */
    public static Built open(Settings settings) {
        return new Built(build(settings));
    }

    /** Executors built together, closed together. */
    public record Built(List<Executor> all) implements AutoCloseable {
        public Built {
            all = List.copyOf(all);
        }

        public Map<String, Executor> byKind() {
            return ExecutorRegistry.byKind(all);
        }

        @Override
        public void close() {
            for (Executor e : all) e.close();
        }
    }

    /** {@code executors} by the kind each serves. */
    public static Map<String, Executor> byKind(List<? extends Executor> executors) {
        Map<String, Executor> m = new LinkedHashMap<>();
        for (Executor e : executors) m.put(e.kind(), e);
        return m;
    }
}
