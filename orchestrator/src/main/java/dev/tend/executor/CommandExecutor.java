package dev.tend.executor;

import dev.tend.engine.Effect;
import dev.tend.engine.Input;
import dev.tend.playbooks.CommandAction;

import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.InputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.time.Duration;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.TimeUnit;
import java.util.function.Consumer;

/**
 * Runs a program with an argument list, never through a shell. Records the exit code and
 * the first {@code output-limit} bytes of its combined output; kills it at the timeout.
 */
public final class CommandExecutor implements Executor {
    private final ExecutorService pool = Executors.newCachedThreadPool(r -> {
        Thread t = new Thread(r, "tend-command");
        t.setDaemon(true);
        return t;
    });
    private final Path workDir;

    public CommandExecutor(Path workDir) {
        this.workDir = workDir;
    }

    @Override
    public String kind() {
        return "command";
    }

    @Override
    public boolean canAskAgain(Effect.CallExecutor call) {
        return ((CommandAction) call.action()).idempotent();
    }

    @Override
    public void execute(Effect.CallExecutor call, Consumer<Input.ExecutorResult> done) {
        pool.execute(() -> done.accept(run(call)));
    }

    private Input.ExecutorResult run(Effect.CallExecutor call) {
        CommandAction action = (CommandAction) call.action();
        List<String> argv = action.render(Placeholders.of(call));
        Duration timeout = call.timeout();
        Map<String, Object> detail = new LinkedHashMap<>();
        detail.put("argv0", argv.get(0));
        Process p;
        try {
            p = new ProcessBuilder(argv).directory(workDir.toFile()).redirectErrorStream(true).start();
        } catch (IOException e) {
            return result(call, false, "could not start " + argv.get(0) + ": " + e.getMessage(), detail);
        }
        try {
            p.getOutputStream().close();
        } catch (IOException ignored) {
            // the program does not read its input
        }
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        Thread reader = new Thread(() -> drain(p.getInputStream(), out, action.outputLimit()), "tend-command-output");
        reader.setDaemon(true);
        reader.start();
        try {
            if (!p.waitFor(timeout.toMillis(), TimeUnit.MILLISECONDS)) {
                p.descendants().forEach(ProcessHandle::destroyForcibly);
                p.destroyForcibly();
                reader.join(1000);
                detail.put("output", text(out));
                return result(call, false, "killed after the timeout of " + timeout.toSeconds() + "s", detail);
            }
            reader.join(2000);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            p.destroyForcibly();
            return result(call, false, "interrupted", detail);
        }
        int code = p.exitValue();
        detail.put("exit_code", code);
        detail.put("output", text(out));
        return result(call, code == 0, code == 0 ? "exit 0" : "exit " + code, detail);
    }

    private static void drain(InputStream in, ByteArrayOutputStream out, int limit) {
        byte[] buf = new byte[8192];
        try (in) {
            int n;
            while ((n = in.read(buf)) > 0) {
                synchronized (out) {
                    int room = limit - out.size();
                    if (room > 0) out.write(buf, 0, Math.min(room, n));
                }
            }
        } catch (IOException ignored) {
            // the process went away; what was read is kept
        }
    }

    private static String text(ByteArrayOutputStream out) {
        synchronized (out) {
            return out.toString(StandardCharsets.UTF_8);
        }
    }

    private static Input.ExecutorResult result(Effect.CallExecutor c, boolean ok, String msg, Map<String, Object> detail) {
        return new Input.ExecutorResult(c.runId(), c.stepId(), c.attempt(), ok, msg, List.of(), detail);
    }

    @Override
    public void close() {
        pool.shutdownNow();
    }
}
