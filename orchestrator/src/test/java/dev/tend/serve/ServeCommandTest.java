package dev.tend.serve;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
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
        assertThat(first.logNow()).as("a line when it stops (exit %d, standard output: %s)", first.process.exitValue(),
                Files.readString(dir.resolve("serve.out"))).contains("tend: stopped; everything resumes from ");

        Served second = serve();
        try {
            assertThat(second.log).contains("tend: resumed from ");
            Cli status = cli(second.url, ServeFixture.VERA, "brake", "status");
            assertThat(status.out).as("the brake engaged before the restart is still engaged").contains("fleet brake ENGAGED", "drill");
        } finally {
            second.stop();
        }
    }

    /** A serve process; its standard error goes to a file (a pipe read after the process ended could lose its last lines). */
    private record Served(Process process, String url, String log, Path err) {

        void stop() throws InterruptedException {
            process.destroy(); // SIGTERM
            if (!process.waitFor(30, TimeUnit.SECONDS)) process.destroyForcibly();
        }

        /** Everything it wrote to standard error so far. */
        String logNow() throws IOException {
            return Files.readString(err);
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

    private Served serve() throws IOException, InterruptedException {
        Path err = Files.createTempFile(dir, "serve", ".err");
        Process p = new ProcessBuilder(java("serve", "--playbooks", dir.resolve("playbooks").toString(),
                "--fleet", dir.resolve("fleet.yaml").toString(), "--db", dir.resolve("tend.db").toString(),
                "--tokens", dir.resolve("tokens.yaml").toString(), "--listen", "127.0.0.1:0"))
                .directory(dir.toFile()).redirectOutput(dir.resolve("serve.out").toFile()).redirectError(err.toFile()).start();
        long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(60);
        while (System.nanoTime() < deadline) {
            String log = Files.readString(err);
            Matcher m = SERVING.matcher(log);
            if (m.find()) return new Served(p, m.group(1), log, err);
            if (!p.isAlive()) throw new AssertionError("tend serve ended without serving:\n" + log);
            Thread.sleep(50);
        }
        p.destroyForcibly();
        throw new AssertionError("tend serve did not serve within 60 s:\n" + Files.readString(err));
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
