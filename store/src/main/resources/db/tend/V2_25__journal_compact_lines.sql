-- From this version on, a transition's or topology event's journal row may keep its wire line
-- without the leading "at" and "cluster" members, which the row's event_at_ns and cluster
-- columns hold (CompactLine: the line from the comma after the cluster); this tend gives the
-- whole line back when it reads the row, and reads the whole lines written before as they are.
-- No table changes. The version is in the store's history so that a tend older than this one,
-- which would find these rows unreadable, refuses the store when it opens it (Migrations: a
-- version it does not know) instead of failing on the first such row while it recovers.
SELECT 1;
