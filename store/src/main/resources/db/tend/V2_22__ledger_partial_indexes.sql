-- The ledger's indexes by cluster, run and playbook hold only the entries that name one, after
-- V2_21 (the kind-and-time index): Flyway applies versions in order.
-- Most entries of a live server name none of the three (the receipt of every
-- POST /api/v1/transitions, transitions-received, is one entry per request), yet each such
-- entry went into all three indexes under NULL, so every commit wrote a page of each to the
-- log for nothing. A filter on one of these columns (GET /api/v1/ledger?cluster=...,
-- ?run=..., ?playbook=..., the handover's open runs) compares it with a value, which implies
-- that it is not null, so SQLite and PostgreSQL still answer it from the index (checked by
-- SqliteLedgerQueryTest and PostgresLedgerQueryTest). On a ledger of 10,000,000 entries
-- the three take a while to build again (DEVELOPERS.md, "Live path").
DROP INDEX ledger_cluster;
CREATE INDEX ledger_cluster ON ledger (cluster, seq) WHERE cluster IS NOT NULL;
DROP INDEX ledger_run;
CREATE INDEX ledger_run ON ledger (run, seq) WHERE run IS NOT NULL;
DROP INDEX ledger_playbook;
CREATE INDEX ledger_playbook ON ledger (playbook, seq) WHERE playbook IS NOT NULL;
