package dev.tend.cli;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.io.File;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.TimeUnit;
import java.util.stream.Stream;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * Every complete {@code bin/tend ...} command of the README runs verbatim and in order, in a
 * folder laid out like a fresh clone (the bundled library, the examples, the recordings), as
 * its own process: each exits 0 (a bare {@code tend COMMAND} may exit 2 with its usage).
 * {@code serve} is left out (it runs until stopped); the demo is stopped with SIGTERM once
 * it has printed its welcome, and must say that it stopped.
 */
class ReadmeTourTest {
    private static final long LIMIT_SECONDS = 300;

    @TempDir
    Path clone;

    @Test
    void everyReadmeCommandRunsVerbatimInOrder() throws Exception {
        Path root = CliRun.root();
        for (String d : List.of("playbooks/library", "examples", "simulator/recordings")) copyTree(root.resolve(d), clone.resolve(d));
        List<String> commands = ReadmeTour.commands(Files.readString(root.resolve("README.md")));
        assertThat(commands).as("the README's commands").anyMatch(c -> c.startsWith("bin/tend demo"))
                .anyMatch(c -> c.startsWith("bin/tend ingest")).anyMatch(c -> c.startsWith("bin/tend audit"))
                .anyMatch(c -> c.startsWith("bin/tend handover"));

        List<String> failed = new ArrayList<>();
        for (String command : commands) {
            List<String> words = ReadmeTour.words(command);
            if (words.contains("serve")) continue;
            String result = words.get(1).equals("demo") ? demo(words) : run(words);
            if (result != null) failed.add("$ " + command + "\n" + result);
        }
        assertThat(failed).as("README commands that failed").isEmpty();
    }

    /** Null when the command exited 0 (or showed its usage when given no arguments), else what it printed. */
    private String run(List<String> words) throws Exception {
        Path out = Files.createTempFile(clone, "out", ".txt");
        Process p = start(words, out);
        if (!p.waitFor(LIMIT_SECONDS, TimeUnit.SECONDS)) {
            p.destroyForcibly();
            return "still running after " + LIMIT_SECONDS + " s:\n" + Files.readString(out);
        }
        String text = Files.readString(out);
        boolean usage = p.exitValue() == ExitCodes.USAGE && words.size() <= 2 && text.contains("Usage:");
        return p.exitValue() == 0 || usage ? null : "exited " + p.exitValue() + ":\n" + text;
    }

    private String demo(List<String> words) throws Exception {
        Path out = Files.createTempFile(clone, "demo", ".txt");
        Process p = start(words, out);
        long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(90);
        while (!Files.readString(out).contains("with Ctrl-C.") && p.isAlive() && System.nanoTime() < deadline) Thread.sleep(200);
        if (!p.isAlive()) return "the demo ended by itself, exit " + p.exitValue() + ":\n" + Files.readString(out);
        p.destroy(); // SIGTERM, as Ctrl-C or a service manager would stop it
        if (!p.waitFor(60, TimeUnit.SECONDS)) {
            p.destroyForcibly();
            return "the demo did not stop on SIGTERM:\n" + Files.readString(out);
        }
        String text = Files.readString(out);
        return text.contains("console   http://127.0.0.1:") && text.contains("tend demo: stopped; the store stays at ") ? null
                : "the demo printed no console URL or no stop line:\n" + text;
    }

    /** {@code bin/tend ARGS} as the launcher runs it: the CLI's main class in a JVM of its own, in the clone. */
    private Process start(List<String> words, Path out) throws IOException {
        List<String> cmd = new ArrayList<>(List.of(Path.of(System.getProperty("java.home"), "bin", "java").toString(),
                "-cp", System.getProperty("java.class.path"), TendMain.class.getName()));
        cmd.addAll(words.subList(1, words.size()));
        ProcessBuilder pb = new ProcessBuilder(cmd).directory(clone.toFile()).redirectErrorStream(true)
                .redirectOutput(out.toFile()).redirectInput(ProcessBuilder.Redirect.from(new File("/dev/null")));
        pb.environment().remove("TEND_DB");
        pb.environment().remove("TEND_SERVER");
        pb.environment().remove("TEND_TOKEN");
        return pb.start();
    }

    private static void copyTree(Path from, Path to) throws IOException {
        try (Stream<Path> all = Files.walk(from)) {
            for (Path p : all.toList()) {
                Path target = to.resolve(from.relativize(p).toString());
                if (Files.isDirectory(p)) Files.createDirectories(target);
                else Files.copy(p, target);
            }
        }
    }
}
