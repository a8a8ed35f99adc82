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
                .anySatisfy(d -> assertThat(d).contains("ledger_kind_time ON").contains("(kind, at_ns, run)"));
    }
}
