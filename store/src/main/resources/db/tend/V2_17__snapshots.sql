-- Engine snapshots: the engine's whole state after the input at journal seq `seq`, so that a
-- start replays only the journal after it. `format` is the version of the body's layout (a
-- tend refuses a format newer than it reads); `setup` fingerprints the policy and fleet it
-- was taken under; `body` is the state as gzip-compressed JSON.
CREATE TABLE snapshots (
    seq      BIGINT NOT NULL PRIMARY KEY,
    taken_ns BIGINT NOT NULL,
    format   INTEGER NOT NULL,
    setup    TEXT NOT NULL,
    body     ${blob_type} NOT NULL
);
