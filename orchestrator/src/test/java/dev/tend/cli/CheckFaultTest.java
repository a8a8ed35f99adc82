package dev.tend.cli;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Random;
import java.util.regex.Pattern;
import java.util.stream.Stream;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * The fault suite's file part: the bundled library's playbooks, actions.yaml, tend.yaml and
 * fleet.yaml, each run mutated once more through {@code tend check}; no stack trace, every
 * problem located as FILE:LINE[:COL], exit 0, 1 or 2 as documented (the slowest check is printed,
 * not asserted: speed belongs to benchmarks).
 * Runs: the system property {@code tend.fault.files} (120 in the default build, 1,000 with
 * {@code -Pfault}). Prints its figures.
 */
class CheckFaultTest {
    static final int RUNS = Integer.getInteger("tend.fault.files", 120);
    private static final Pattern LOCATED = Pattern.compile("^.+?:\\d+(:\\d+)?: .+");
    private static final String[] VALUES = {"100000d", "-5m", "0s", "9999-12-31T00:00:00Z", "&a [1, *a]", "*nope", "{", "]",
            "\"unterminated", "~", "", "1e999", "x".repeat(3000), "[a, b", "!!binary AAAA", "!!java.io.File x",
            "0x7fffffffffffffffffff", "true", "[]", "{}", "-1", "2147483648", "NaN", "'", "|", ">", "? x", "@x", "`x`", "%YAML 1.1"};

    @TempDir
    Path dir;

    @Test
    void mutatedPolicyAndFleetFilesAreCheckedWithoutATraceAndEveryProblemLocated() throws Exception {
        Path library = CliRun.root().resolve("playbooks/library");
        Random rnd = new Random(20271202L);
        int clean = 0, findings = 0, refused = 0, problems = 0;
        long slowestMs = 0;
        List<String> unlocated = new ArrayList<>();
        List<String> traces = new ArrayList<>();
        for (int i = 0; i < RUNS; i++) {
            Path copy = dir.resolve("run-" + i);
            copyDir(library, copy);
            List<Path> files;
            try (Stream<Path> s = Files.list(copy)) {
                files = s.filter(p -> p.toString().endsWith(".yaml")).sorted().toList();
            }
            Path target = files.get(rnd.nextInt(files.size()));
            String what = mutate(target, rnd);
            long start = System.nanoTime();
            CliRun r = CliRun.of("check", copy.toString(), "--fleet", copy.resolve("fleet.yaml").toString());
            slowestMs = Math.max(slowestMs, (System.nanoTime() - start) / 1_000_000);
            String label = target.getFileName() + " " + what;
            if (r.err().contains("\tat ") || r.err().contains("Exception") || r.out().contains("\tat ")) traces.add(label + ": " + r.err());
            assertThat(r.exit()).as(label + "\n" + r.err()).isIn(ExitCodes.OK, ExitCodes.FINDINGS, ExitCodes.USAGE);
            switch (r.exit()) {
                case ExitCodes.OK -> clean++;
                case ExitCodes.FINDINGS -> findings++;
                default -> {
                    refused++;
                    for (String line : r.err().lines().toList()) {
                        if (line.endsWith("nothing was checked further")) continue;
                        problems++;
                        if (!LOCATED.matcher(line).matches()) unlocated.add(label + ": " + line);
                    }
                }
            }
            deleteDir(copy);
        }
        System.out.printf("fault suite, check: %d mutated library copies: %d clean, %d with findings, %d refused with %d"
                + " problems, %d problems without a location, %d stack traces; slowest check %d ms%n", RUNS, clean, findings,
                refused, problems, unlocated.size(), traces.size(), slowestMs);
        assertThat(traces).isEmpty();
        assertThat(unlocated).isEmpty();
    }

    /** Breaks {@code file} one way, chosen by {@code rnd}; returns how. */
    private static String mutate(Path file, Random rnd) throws IOException {
        List<String> lines = new ArrayList<>(Files.readAllLines(file, StandardCharsets.UTF_8));
        if (lines.isEmpty()) lines.add("");
        int at = rnd.nextInt(lines.size());
        String how;
        switch (rnd.nextInt(12)) {
            case 0 -> {
                lines.remove(at);
                how = "line " + (at + 1) + " deleted";
            }
            case 1 -> {
                lines.add(at, lines.get(at));
                how = "line " + (at + 1) + " doubled";
            }
            case 2 -> {
                lines.set(at, " ".repeat(1 + rnd.nextInt(3)) + lines.get(at));
                how = "line " + (at + 1) + " indented";
            }
            case 3 -> {
                lines.set(at, lines.get(at).stripLeading());
                how = "line " + (at + 1) + " dedented";
            }
            case 4, 5, 6 -> {
                String v = VALUES[rnd.nextInt(VALUES.length)];
                String line = lines.get(at);
                int colon = line.indexOf(": ");
                lines.set(at, colon >= 0 ? line.substring(0, colon + 2) + v : line + " " + v);
                how = "line " + (at + 1) + " valued '" + (v.length() > 20 ? v.substring(0, 20) + "..." : v) + "'";
            }
            case 7 -> {
                String all = String.join("\n", lines);
                Files.writeString(file, all.substring(0, rnd.nextInt(all.length() + 1)), StandardCharsets.UTF_8);
                return "cut short";
            }
            case 8 -> {
                lines.set(at, "\t" + lines.get(at));
                how = "tab before line " + (at + 1);
            }
            case 9 -> {
                StringBuilder bomb = new StringBuilder("bomb0: &b0 [x, x]\n");
                for (int i = 1; i < 40; i++) bomb.append("bomb").append(i).append(": &b").append(i).append(" [*b").append(i - 1)
                        .append(", *b").append(i - 1).append("]\n");
                lines.add(bomb.toString());
                how = "alias bomb appended";
            }
            case 10 -> {
                byte[] b = Files.readAllBytes(file);
                if (b.length > 0) b[rnd.nextInt(b.length)] = (byte) 0xFF;
                Files.write(file, b);
                return "a byte that is not UTF-8";
            }
            default -> {
                int other = rnd.nextInt(lines.size());
                String t = lines.get(at);
                lines.set(at, lines.get(other));
                lines.set(other, t);
                how = "lines " + (at + 1) + " and " + (other + 1) + " swapped";
            }
        }
        Files.write(file, lines, StandardCharsets.UTF_8);
        return how;
    }

    private static void copyDir(Path from, Path to) throws IOException {
        Files.createDirectories(to);
        try (Stream<Path> s = Files.list(from)) {
            for (Path p : s.toList()) if (Files.isRegularFile(p)) Files.copy(p, to.resolve(p.getFileName()));
        }
    }

    private static void deleteDir(Path d) throws IOException {
        try (Stream<Path> s = Files.list(d)) {
            for (Path p : s.toList()) Files.delete(p);
        }
        Files.delete(d);
    }
}
