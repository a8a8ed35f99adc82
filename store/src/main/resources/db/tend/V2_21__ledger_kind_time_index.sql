-- The handover of a period finds the runs still open when it begins: the runs of the opening
-- kinds' entries before it, less those of the closing kinds' (LedgerPeriodRead). Through
-- ledger_kind (kind, seq) that was a table look-up per run entry of the whole ledger for its
-- time and run (30,000 run-started and 30,000 run-ended on a ledger of 10,000,000 entries);
-- this index answers it from the index alone, and lets the carried kinds (brake, loops) be
-- read by time. Building it on a ledger of 10,000,000 entries took about 30 s (DEVELOPERS.md,
-- "Reading a ledger of millions of entries").
CREATE INDEX ledger_kind_time ON ledger (kind, at_ns, run);
