package dev.tend.bench;

import com.fasterxml.jackson.databind.ObjectMapper;

import java.io.BufferedReader;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.sql.Connection;
import java.sql.DriverManager;
import java.sql.PreparedStatement;
import java.sql.Statement;

/**
 * The floor of the ingest benchmark: parses each line of a file of transitions into a
 * Jackson tree and appends it to SQLite (WAL, batched transactions of 2,000 rows), the least
 * a durable ingest of the file must do. {@link IngestBenchmark} runs it as a fresh
 * {@code java} with the JVM's defaults, like {@code bin/tend ingest}; arguments: the file
 * and the database to create. Prints the count of rows written.
 */
public final class IngestFloor {
    private IngestFloor() {
    }

    public static void main(String[] args) throws Exception {
        System.out.println(run(Path.of(args[0]), Path.of(args[1])) + " rows");
    }

    /** Reads {@code events} into a new table of {@code db}; returns the rows written. */
    static long run(Path events, Path db) throws Exception {
        ObjectMapper json = new ObjectMapper();
        long rows = 0;
        try (Connection c = DriverManager.getConnection("jdbc:sqlite:" + db)) {
            try (Statement s = c.createStatement()) {
                s.execute("PRAGMA journal_mode=WAL");
                s.execute("PRAGMA synchronous=NORMAL");
                s.execute("CREATE TABLE events (seq INTEGER PRIMARY KEY, at TEXT, cluster TEXT, payload TEXT)");
            }
            c.setAutoCommit(false);
            try (BufferedReader in = Files.newBufferedReader(events, StandardCharsets.UTF_8);
                 PreparedStatement ps = c.prepareStatement("INSERT INTO events (at, cluster, payload) VALUES (?, ?, ?)")) {
                String line;
                int batch = 0;
                while ((line = in.readLine()) != null) {
                    var node = json.readTree(line);
                    ps.setString(1, node.get("at").asText());
                    ps.setString(2, node.get("cluster").asText());
                    ps.setString(3, line);
                    ps.addBatch();
                    rows++;
                    if (++batch == 2000) {
                        ps.executeBatch();
                        c.commit();
                        batch = 0;
                    }
                }
                ps.executeBatch();
                c.commit();
            }
        }
        return rows;
    }
}
