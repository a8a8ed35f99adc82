package dev.tend.runtime;

import dev.tend.engine.Input;
import dev.tend.shared.InvalidInputException;
import dev.tend.shared.Problem;
import dev.tend.shared.wire.Rfc3339;
import dev.tend.store.StoreException;
import org.sqlite.SQLiteErrorCode;
import org.sqlite.SQLiteException;

import java.sql.SQLException;
import java.util.LinkedHashMap;
import java.util.Map;

/**
 * Tells a failure caused by what one input carries (a value the store or the engine cannot
 * hold) from a failure of the database itself, and describes a refused input for the ledger.
 */
final class InputRefusal {
    private InputRefusal() {
    }

    /**
     * True when the database itself failed (it cannot be reached, written, is locked or full):
     * then tend must stop. A constraint or data error of one row (SQLSTATE classes 22 and 23,
     * SQLite's CONSTRAINT, TOOBIG and MISMATCH) and every failure that is no database error at
     * all are the input's.
     */
    static boolean isDatabaseFailure(Throwable e) {
        if (!(e instanceof StoreException)) return false;
        for (Throwable t = e; t != null; t = t.getCause()) {
            if (t instanceof SQLiteException s) {
                SQLiteErrorCode code = s.getResultCode();
                String name = code == null ? "" : code.name();
                return !(name.startsWith("SQLITE_CONSTRAINT") || name.startsWith("SQLITE_TOOBIG") || name.startsWith("SQLITE_MISMATCH"));
            }
            if (t instanceof SQLException s && s.getSQLState() != null) {
                String state = s.getSQLState();
                return !(state.startsWith("22") || state.startsWith("23"));
            }
        }
        return true;
    }

    /** One sentence on why, without the class of the failure. */
    static String reason(Throwable e) {
        String m = e.getMessage();
        return m == null || m.isBlank() ? "it could not be decided or kept (" + e.getClass().getSimpleName() + ")" : m;
    }

    /** What the ledger entry {@code input-refused} says about {@code in}. */
    static Map<String, Object> fields(Input in, String reason) {
        Map<String, Object> f = new LinkedHashMap<>();
        f.put("input", in.kind());
        f.put("cluster", in.cluster() == null ? null : in.cluster().value());
        if (in instanceof Input.Transition t) {
            f.put("node", t.transition().node() == null ? null : t.transition().node().value());
            f.put("signal", t.transition().signal().value());
            f.put("event_at", Rfc3339.format(t.transition().at()));
        } else if (in instanceof Input.Topology t) {
            f.put("node", t.event().node().value());
            f.put("event_at", Rfc3339.format(t.event().at()));
        } else if (in instanceof Input.Command c) {
            f.put("by", c.by());
            f.put("from", c.from());
        }
        f.put("reason", reason);
        return f;
    }

    /** The exception a caller waiting for {@code in} receives. */
    static InvalidInputException asInvalidInput(Input in, String reason) {
        return new InvalidInputException(Problem.at("request", 0, 0, "", "tend refused this " + in.kind() + ": " + reason));
    }
}
