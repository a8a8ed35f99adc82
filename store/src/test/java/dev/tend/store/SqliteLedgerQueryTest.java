package dev.tend.store;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Path;
import java.sql.Connection;
import java.sql.ResultSet;
import java.sql.Statement;

import static org.assertj.core.api.Assertions.assertThat;

class SqliteLedgerQueryTest extends LedgerQueryContractTest {
    @TempDir
    Path dir;

    @Override
    TestDatabase createDatabase() {
        return new SqliteTestDatabase(dir.resolve("tend.db"));
    }

    /**
     * The plans SQLite chooses (EXPLAIN QUERY PLAN, sqlite.org/eqp.html) for the reads that must
     * not grow with the ledger: each walks an index, none scans the ledger table.
     */
    @Test
    void pagesAndPeriodReadsWalkAnIndexInsteadOfTheWholeLedger() throws Exception {
        assertThat(plan("SELECT seq FROM ledger WHERE seq < 9223372036854775807 AND kind = 'verdict' ORDER BY seq DESC LIMIT 501"))
                .contains("ledger_kind").doesNotContain("TEMP B-TREE");
        assertThat(plan("SELECT seq FROM ledger WHERE seq < 9223372036854775807 AND playbook = 'p' ORDER BY seq DESC LIMIT 501"))
                .contains("ledger_playbook").doesNotContain("TEMP B-TREE");
        // the indexes by cluster, run and playbook leave out the entries naming none (V2_22): a comparison implies it
        assertThat(plan("SELECT seq FROM ledger WHERE seq < 9223372036854775807 AND cluster = 'fares-3' AND kind || '' = 'verdict'"
                + " ORDER BY seq DESC LIMIT 501")).contains("INDEX ledger_cluster (cluster=? AND seq<?)").doesNotContain("TEMP B-TREE");
        assertThat(plan("SELECT seq FROM ledger WHERE seq < 9223372036854775807 AND run = 'r-1' ORDER BY seq DESC LIMIT 501"))
                .contains("INDEX ledger_run (run=? AND seq<?)").doesNotContain("TEMP B-TREE");
        assertThat(plan("SELECT seq FROM ledger WHERE at_ns >= 1 AND cluster = 'fares-3' ORDER BY seq"))
                .contains("INDEX ledger_cluster (cluster=?)").doesNotContain("TEMP B-TREE");
        assertThat(plan("SELECT seq FROM ledger WHERE run IN (SELECT run FROM ledger WHERE kind IN ('run-started') AND at_ns < 5"
                + " AND run IS NOT NULL EXCEPT SELECT run FROM ledger WHERE kind IN ('run-ended') AND at_ns < 5 AND run IS NOT NULL)"
                + " AND at_ns < 5")).contains("INDEX ledger_run (run=?)");
        assertThat(plan("SELECT run FROM ledger WHERE kind IN ('run-started', 'run-shadowed') AND at_ns < 5 AND run IS NOT NULL"
                + " EXCEPT SELECT run FROM ledger WHERE kind IN ('run-ended') AND at_ns < 5 AND run IS NOT NULL"))
                .contains("COVERING INDEX ledger_kind_time").doesNotContain("SCAN ledger\n");
        assertThat(plan("SELECT seq FROM ledger WHERE kind IN ('loop-stopped', 'loop-cleared') AND at_ns < 5"))
                .contains("ledger_kind_time (kind=? AND at_ns<?)").doesNotContain("SCAN ledger\n");
        assertThat(plan("SELECT MIN(seq), MAX(seq) FROM ledger WHERE at_ns >= 1 AND at_ns < 5")).contains("COVERING INDEX ledger_at");
        assertThat(plan("SELECT MIN(seq + 0) FROM ledger WHERE at_ns >= 1")).contains("COVERING INDEX ledger_at");
        assertThat(plan("SELECT seq FROM ledger WHERE seq < 9223372036854775807 AND seq IN (SELECT seq FROM ledger"
                + " WHERE seq < 9223372036854775807 AND at_ns >= 1 AND at_ns < 5 ORDER BY seq + 0 DESC LIMIT 501)"
                + " ORDER BY seq DESC LIMIT 501")).contains("COVERING INDEX ledger_at");
    }

    private String plan(String sql) throws Exception {
        StringBuilder out = new StringBuilder();
        try (Connection c = db.connect(); Statement s = c.createStatement(); ResultSet rs = s.executeQuery("EXPLAIN QUERY PLAN " + sql)) {
            while (rs.next()) out.append(rs.getString("detail")).append('\n');
        }
        return out.toString();
    }
}
