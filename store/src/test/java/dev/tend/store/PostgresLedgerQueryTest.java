package dev.tend.store;

import org.junit.jupiter.api.Test;

import java.sql.Connection;
import java.sql.ResultSet;
import java.sql.Statement;
import java.util.ArrayList;
import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;

/** Skipped, with the reason, when no PostgreSQL server can be had (see PostgresServer). */
class PostgresLedgerQueryTest extends LedgerQueryContractTest {
    @Override
    TestDatabase createDatabase() {
        return PostgresTestDatabase.create();
    }

    @Test
    void theLedgerQueryIndexesOfTheMigrationExist() throws Exception {
        List<String> defs = new ArrayList<>();
        try (Connection c = db.connect(); Statement s = c.createStatement();
             ResultSet rs = s.executeQuery("SELECT indexdef FROM pg_indexes WHERE tablename = 'ledger' ORDER BY indexname")) {
            while (rs.next()) defs.add(rs.getString(1));
        }
        assertThat(defs).anySatisfy(d -> assertThat(d).contains("ledger_kind ON").contains("(kind, seq)"))
                .anySatisfy(d -> assertThat(d).contains("ledger_playbook ON").contains("(playbook, seq)"))
                .anySatisfy(d -> assertThat(d).contains("ledger_kind_time ON").contains("(kind, at_ns, run)"))
                .anySatisfy(d -> assertThat(d).contains("ledger_playbook ON").contains("(playbook, seq)").contains("playbook IS NOT NULL"))
                .anySatisfy(d -> assertThat(d).contains("ledger_cluster ON").contains("(cluster, seq)").contains("cluster IS NOT NULL"))
                .anySatisfy(d -> assertThat(d).contains("ledger_run ON").contains("(run, seq)").contains("run IS NOT NULL"));
    }

    /**
     * The indexes by cluster, run and playbook hold only the entries that name one (V2_22); a
     * filter comparing the column with a value implies that, so the planner still uses them
     * (shown with sequential scans switched off, since the test's ledger is empty).
     */
    @Test
    void aFilterOnClusterRunOrPlaybookIsServedByItsIndexThatLeavesOutTheEntriesNamingNone() throws Exception {
        assertThat(plan("SELECT seq FROM ledger WHERE seq < 9223372036854775807 AND cluster = 'fares-3' ORDER BY seq DESC LIMIT 501"))
                .contains("ledger_cluster");
        assertThat(plan("SELECT seq FROM ledger WHERE seq < 9223372036854775807 AND run = 'r-1' ORDER BY seq DESC LIMIT 501"))
                .contains("ledger_run");
        assertThat(plan("SELECT seq FROM ledger WHERE seq < 9223372036854775807 AND playbook = 'p' ORDER BY seq DESC LIMIT 501"))
                .contains("ledger_playbook");
    }

    private String plan(String sql) throws Exception {
        StringBuilder out = new StringBuilder();
        try (Connection c = db.connect(); Statement s = c.createStatement()) {
            s.execute("SET enable_seqscan = off");
            try (ResultSet rs = s.executeQuery("EXPLAIN " + sql)) {
                while (rs.next()) out.append(rs.getString(1)).append('\n');
            }
        }
        return out.toString();
    }
}
