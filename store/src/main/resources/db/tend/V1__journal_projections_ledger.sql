-- tend store, schema version 1. One script for SQLite and PostgreSQL.
-- ${seq_key} is INTEGER on SQLite (so the key is the rowid) and BIGINT on PostgreSQL.
-- Times are BIGINT nanoseconds since 1970-01-01T00:00:00Z (columns ending in _ns): exact
-- for every Instant the engine sees, and the same on both databases.
-- JSON is TEXT, kept byte for byte (the ledger's hashes depend on that).

-- The input journal: replaying it in seq order rebuilds the engine's state.
CREATE TABLE input_journal (
    seq         ${seq_key} NOT NULL PRIMARY KEY,
    kind        TEXT NOT NULL,
    now_ns      BIGINT NOT NULL,
    event_at_ns BIGINT,
    cluster     TEXT,
    payload     TEXT NOT NULL
);
CREATE INDEX input_journal_recording ON input_journal (event_at_ns)
    WHERE kind IN ('transition', 'topology');

-- The audit ledger: append-only, hash-chained; cluster, playbook and run are copies of the
-- entry's own fields, for filtering.
CREATE TABLE ledger (
    seq       ${seq_key} NOT NULL PRIMARY KEY,
    at_ns     BIGINT NOT NULL,
    kind      TEXT NOT NULL,
    cluster   TEXT,
    playbook  TEXT,
    run       TEXT,
    entry     TEXT NOT NULL,
    prev_hash TEXT NOT NULL,
    hash      TEXT NOT NULL
);
CREATE INDEX ledger_at ON ledger (at_ns);
CREATE INDEX ledger_cluster ON ledger (cluster, seq);
CREATE INDEX ledger_run ON ledger (run, seq);

-- The ledger's last seq and hash, updated in the transaction that appends.
CREATE TABLE ledger_head (
    id   INTEGER NOT NULL PRIMARY KEY CHECK (id = 1),
    seq  BIGINT NOT NULL,
    hash TEXT NOT NULL
);
INSERT INTO ledger_head (id, seq, hash)
VALUES (1, 0, '0000000000000000000000000000000000000000000000000000000000000000');

CREATE TABLE runs (
    run_id           TEXT NOT NULL PRIMARY KEY,
    playbook         TEXT NOT NULL,
    playbook_version INTEGER NOT NULL,
    cluster          TEXT NOT NULL,
    node             TEXT,
    state            TEXT NOT NULL,
    shadow           BOOLEAN NOT NULL,
    created_ns       BIGINT NOT NULL,
    started_ns       BIGINT,
    ended_ns         BIGINT,
    outcome          TEXT,
    current_step     TEXT,
    detail           TEXT
);
CREATE INDEX runs_created ON runs (created_ns);
CREATE INDEX runs_cluster ON runs (cluster, created_ns);
CREATE INDEX runs_active ON runs (created_ns) WHERE ended_ns IS NULL;

CREATE TABLE steps (
    run_id     TEXT NOT NULL,
    step_id    TEXT NOT NULL,
    ordinal    INTEGER NOT NULL,
    state      TEXT NOT NULL,
    attempt    INTEGER NOT NULL,
    started_ns BIGINT,
    ended_ns   BIGINT,
    outcome    TEXT,
    detail     TEXT,
    PRIMARY KEY (run_id, step_id)
);

CREATE TABLE timers (
    timer_key TEXT NOT NULL PRIMARY KEY,
    due_ns    BIGINT NOT NULL,
    payload   TEXT
);
CREATE INDEX timers_due ON timers (due_ns);

-- node is '' for an exclusion of the whole cluster (a primary key column cannot be NULL
-- on PostgreSQL, and '' is never a node id).
CREATE TABLE exclusions (
    cluster    TEXT NOT NULL,
    node       TEXT NOT NULL,
    reason     TEXT NOT NULL,
    owner      TEXT NOT NULL,
    created_ns BIGINT NOT NULL,
    until_ns   BIGINT,
    PRIMARY KEY (cluster, node)
);

CREATE TABLE approvals (
    run_id       TEXT NOT NULL PRIMARY KEY,
    playbook     TEXT NOT NULL,
    cluster      TEXT NOT NULL,
    node         TEXT,
    requested_by TEXT NOT NULL,
    requested_ns BIGINT NOT NULL,
    expires_ns   BIGINT NOT NULL,
    state        TEXT NOT NULL,
    decided_by   TEXT,
    decided_ns   BIGINT,
    reasons      TEXT
);
CREATE INDEX approvals_state ON approvals (state, requested_ns);

-- Fleet state the engine keeps under keys of its own (brake, budgets, ...), as JSON text.
CREATE TABLE fleet_state (
    state_key TEXT NOT NULL PRIMARY KEY,
    json      TEXT NOT NULL
);
