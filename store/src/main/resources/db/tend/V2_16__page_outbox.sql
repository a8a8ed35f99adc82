-- tend store: the page outbox. A page is written here in the transaction that ledgers it,
-- and stays until its channel accepts it or delivery is given up; the courier of any tend
-- started on this store picks up what is pending, so delivery survives restarts.
CREATE TABLE page_outbox (
    id          TEXT NOT NULL PRIMARY KEY,
    channel     TEXT NOT NULL,
    created_ns  BIGINT NOT NULL,
    payload     TEXT NOT NULL,
    state       TEXT NOT NULL,
    attempts    INTEGER NOT NULL,
    next_ns     BIGINT NOT NULL,
    last_answer TEXT,
    ended_ns    BIGINT
);
CREATE INDEX page_outbox_due ON page_outbox (state, next_ns);
CREATE INDEX page_outbox_created ON page_outbox (created_ns);
