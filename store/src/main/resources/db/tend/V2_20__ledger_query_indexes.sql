-- Indexes for what operators ask of a large ledger (millions of entries), after V2_19 (the
-- stream offsets): Flyway applies versions in order.
-- GET /api/v1/ledger?kind=... and ?playbook=... answer the newest matching entries by
-- walking these backwards from the newest seq and stopping at the page's limit; the handover
-- finds the runs still open when its period begins (their run-started and run-ended entries)
-- and the brake and loop entries before it through ledger_kind, instead of reading every
-- entry since the ledger began.
CREATE INDEX ledger_kind ON ledger (kind, seq);
CREATE INDEX ledger_playbook ON ledger (playbook, seq);
