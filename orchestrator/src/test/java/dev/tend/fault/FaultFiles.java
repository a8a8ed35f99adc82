package dev.tend.fault;

import dev.tend.api.auth.Tokens;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.attribute.PosixFilePermissions;
import java.util.HashMap;
import java.util.Map;
import java.util.Random;

/**
 * The files the crash, storm and failover tests give tend: an invented fleet, a tokens file,
 * a ledger key, and a command that claims each idempotency key once and logs what it ran.
 */
public final class FaultFiles {
    /**
     * A tend.yaml that holds nothing back for a storm of 16 clusters at a time: fleet and zone
     * caps of 16, 1000 starts an hour, a brake that never engages below 1000 clusters.
     */
    public static final String WIDE_OPEN_POLICY = """
            defaults:
              fleet: 16
              per-zone: 16
              rate: 1000/1h
            rate: 1000/1h
            brake:
              engage-at: { clusters: 1000 }
              release-below: { clusters: 500 }
            """;

    private FaultFiles() {
    }

    /** A fleet file: clusters {@code PREFIX-1} to {@code PREFIX-N}, each with nodes n1, n2, n3 in zones z-a, z-b, z-c. */
    public static String fleet(String name, String prefix, int clusters) {
        StringBuilder fleet = new StringBuilder("fleet: " + name + "   # invented\nclusters:\n");
        for (int c = 1; c <= clusters; c++) {
            fleet.append("  - id: ").append(prefix).append('-').append(c).append("\n    nodes:\n");
            for (int n = 1; n <= 3; n++) fleet.append("      - { id: n").append(n).append(", zone: z-").append((char) ('a' + n - 1)).append(" }\n");
        }
        return fleet.toString();
    }

    /**
     * A policy folder with one playbook, {@code replace-silent-node} (a node's heartbeat silent,
     * confirmed for {@code confirmFor}; one step, {@code replace-node}, within {@code timeout}),
     * its simulated action (succeeds after {@code duration} and clears the heartbeat) and
     * {@code tendYaml} as its tend.yaml.
     */
    public static void writeReplacePolicy(Path folder, String tendYaml, String duration, String confirmFor, String timeout)
            throws IOException {
        Files.createDirectories(folder);
        Files.writeString(folder.resolve("actions.yaml"), """
                actions:
                  replace-node: { simulated: { duration: %s, success: 1.0, clears: [heartbeat] } }
                """.formatted(duration));
        Files.writeString(folder.resolve("tend.yaml"), tendYaml);
        Files.writeString(folder.resolve("replace-silent-node.yaml"), """
                playbook: replace-silent-node
                version: 1
                trigger: { signal: heartbeat, state: silent, scope: node, confirm-for: %s }
                steps:
                  - { id: replace, action: replace-node, timeout: %s }
                """.formatted(confirmFor, timeout));
    }

    /** A tokens file with one token {@code token} named {@code name}, with the operator and viewer roles. */
    public static void writeTokens(Path file, String name, String token) throws IOException {
        Files.writeString(file, "tokens:\n  - { name: " + name + ", roles: [operator, viewer], sha256: " + Tokens.hash(token) + " }\n");
    }

    /** A ledger key of 32 bytes drawn from {@code seed}, readable by its owner only. */
    public static void writeLedgerKey(Path file, long seed) throws IOException {
        byte[] key = new byte[32];
        new Random(seed).nextBytes(key);
        Files.write(file, key);
        Files.setPosixFilePermissions(file, PosixFilePermissions.fromString("rw-------"));
    }

    /**
     * A shell command {@code sh FILE KEY LOG CLAIMS} that runs each key once: the first call
     * for a key claims it (a directory under CLAIMS) and logs {@code start KEY} and, 0.3 s
     * later, {@code done KEY}; a later call for the same key waits for that {@code done}.
     */
    public static void writeIdempotentScript(Path file) throws IOException {
        Files.writeString(file, """
                key="$1"; log="$2"; claims="$3"
                claim="$claims/$(printf '%s' "$key" | tr '/' '_')"
                if mkdir "$claim" 2>/dev/null; then
                  echo "start $key" >> "$log"
                  sleep 0.3
                  echo "done $key" >> "$log"
                else
                  i=0
                  while ! grep -qxF "done $key" "$log" && [ $i -lt 1000 ]; do sleep 0.01; i=$((i+1)); done
                fi
                """);
    }

    /** How many times each key was done, by the {@code done KEY} lines of {@code log}. */
    public static Map<String, Integer> doneKeys(Path log) throws IOException {
        Map<String, Integer> done = new HashMap<>();
        for (String line : Files.readAllLines(log, StandardCharsets.UTF_8)) {
            if (line.startsWith("done ")) done.merge(line.substring(5), 1, Integer::sum);
        }
        return done;
    }
}
