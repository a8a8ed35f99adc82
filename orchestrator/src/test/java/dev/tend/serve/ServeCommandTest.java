package dev.tend.serve;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStreamReader;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.TimeUnit;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * {@code tend serve} as a separate process, as an operator starts it: it prints where it
 * listens, answers the CLI front ends (found through TEND_SERVER and TEND_TOKEN), stops on
 * SIGTERM, and resumes from the store when started again.
 */
class ServeCommandTest {
    private static final Pattern SERVING = Pattern.compile("tend: serving (http://127\\.0\\.0\\.1:\\d+)/api/v1");

    @TempDir
    Path dir;

    @Test
    void servesUntilSigtermAndResumesFromTheStoreWhenStartedAgain() throws Exception {
        new ServeFixture().start(dir).stop(); // writes the policy, fleet and tokens files, and a store
        Served first = serve();
        try {
            Cli engaged = cli(first.url, ServeFixture.OLGA, "brake", "engage", "--reason", "drill");
            assertThat(engaged.exit).as(engaged.err).isZero();
            assertThat(engaged.out).contains("fleet brake ENGAGED", "by olga");
        } finally {
            first.stop();
        }
        assertThat(first.process.exitValue()).as("stopped by SIGTERM").isIn(0, 143);
        assertThat(first.log).contains(", the console on " + first.url + "/").contains("stop with Ctrl-C or SIGTERM");

        Served second = serve();
        try {
            assertThat(second.log).contains("tend: resumed from ");
            Cli status = cli(second.url, ServeFixture.VERA, "brake", "status");
            assertThat(status.out).as("the brake engaged before the restart is still engaged").contains("fleet brake ENGAGED", "drill");
        } finally {
            second.stop();
        }
    }

    private record Served(Process process, String url, String log) {

        void stop() throws InterruptedException {
            process.destroy(); // SIGTERM
            if (!process.waitFor(30, TimeUnit.SECONDS)) process.destroyForcibly();
        }
    }

    private record Cli(int exit, String out, String err) {
    }

    private static List<String> java(String... args) {
        List<String> cmd = new ArrayList<>(List.of(Path.of(System.getProperty("java.home"), "bin", "java").toString(),
                "-Xmx256m", "-XX:TieredStopAtLevel=1", "-cp", System.getProperty("java.class.path"), "dev.tend.cli.TendMain"));
        cmd.addAll(List.of(args));
        return cmd;
    }

    private Served serve() throws IOException, InterruptedException, java.util.concurrent.ExecutionException,
            java.util.concurrent.TimeoutException {
        Process p = new ProcessBuilder(java("serve", "--playbooks", dir.resolve("playbooks").toString(),
                "--fleet", dir.resolve("fleet.yaml").toString(), "--db", dir.resolve("tend.db").toString(),
                "--tokens", dir.resolve("tokens.yaml").toString(), "--listen", "127.0.0.1:0"))
                .directory(dir.toFile()).redirectOutput(dir.resolve("serve.out").toFile()).start();
        StringBuilder log = new StringBuilder();
        CompletableFuture<String> url = new CompletableFuture<>();
        Thread reader = new Thread(() -> {
            try (BufferedReader r = new BufferedReader(new InputStreamReader(p.getErrorStream(), StandardCharsets.UTF_8))) {
                String line;
                while ((line = r.readLine()) != null) {
                    synchronized (log) {
                        log.append(line).append('\n');
                    }
                    Matcher m = SERVING.matcher(line);
                    if (m.find()) url.complete(m.group(1));
                }
                url.completeExceptionally(new AssertionError("tend serve ended without serving:\n" + log));
            } catch (IOException e) {
                url.completeExceptionally(e);
            }
        }, "serve-stderr");
        reader.setDaemon(true);
        reader.start();
        String u = url.get(60, TimeUnit.SECONDS);
        synchronized (log) {
            return new Served(p, u, log.toString());
        }
    }

    private Cli cli(String url, String token, String... args) throws IOException, InterruptedException {
        ProcessBuilder pb = new ProcessBuilder(java(args)).directory(dir.toFile())
                .redirectOutput(dir.resolve("cli.out").toFile()).redirectError(dir.resolve("cli.err").toFile());
        pb.environment().put("TEND_SERVER", url);
        pb.environment().put("TEND_TOKEN", token);
        Process p = pb.start();
        assertThat(p.waitFor(60, TimeUnit.SECONDS)).isTrue();
        return new Cli(p.exitValue(), Files.readString(dir.resolve("cli.out")), Files.readString(dir.resolve("cli.err")));
    }
}
