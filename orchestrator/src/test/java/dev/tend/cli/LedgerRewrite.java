package dev.tend.cli;

import dev.tend.shared.json.Sha256;

import java.nio.file.Path;
import java.sql.Connection;
import java.sql.DriverManager;
import java.sql.PreparedStatement;
import java.sql.ResultSet;
import java.sql.Statement;
import java.util.ArrayList;
import java.util.List;

/** What someone who can write the store does to hide an edit: recompute every later hash and the head. */
final class LedgerRewrite {
    private LedgerRewrite() {
    }

    static void rechain(Path db, long from) throws Exception {
        try (Connection c = DriverManager.getConnection("jdbc:sqlite:" + db)) {
            c.setAutoCommit(false);
            List<long[]> seqs = new ArrayList<>();
            List<String> entries = new ArrayList<>();
            String prev = null;
            try (Statement s = c.createStatement(); ResultSet r = s.executeQuery("SELECT seq, entry, prev_hash FROM ledger ORDER BY seq")) {
                while (r.next()) {
                    seqs.add(new long[]{r.getLong(1)});
                    entries.add(r.getString(2));
                    if (r.getLong(1) == from) prev = r.getString(3);
                }
            }
            try (PreparedStatement up = c.prepareStatement("UPDATE ledger SET prev_hash = ?, hash = ? WHERE seq = ?")) {
                for (int i = 0; i < seqs.size(); i++) {
                    if (seqs.get(i)[0] < from) continue;
                    String h = Sha256.hexOf(prev, entries.get(i));
                    up.setString(1, prev);
                    up.setString(2, h);
                    up.setLong(3, seqs.get(i)[0]);
                    up.executeUpdate();
                    prev = h;
                }
            }
            try (PreparedStatement head = c.prepareStatement("UPDATE ledger_head SET hash = ? WHERE id = 1")) {
                head.setString(1, prev);
                head.executeUpdate();
            }
            c.commit();
        }
    }
}
