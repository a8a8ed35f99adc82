-- Which journal rows hold the transitions and topology events of an hour of event time, kept
-- as one row per hour (the least and the greatest seq of such rows whose event time falls in
-- it) instead of an index over every row's event time. `tend record --db` asks the journal
-- for a period of event time; it now scans the seq range of the period's hours, a few rows
-- to the hour at most, instead of walking the index. The index was a second B-tree written by
-- every input: about a tenth of what the commits of a 1,000,000-line ingest wrote, and one
-- more page in the log of each commit of a live server (DEVELOPERS.md, "Ingest").
-- An hour is event_at_ns / 3,600,000,000,000, rounded towards zero (as SQL's and Java's
-- integer division both do); JdbiTx keeps it up to date in the transaction of the rows.
CREATE TABLE journal_event_hours (
    hour      BIGINT NOT NULL PRIMARY KEY,
    first_seq BIGINT NOT NULL,
    last_seq  BIGINT NOT NULL
);
INSERT INTO journal_event_hours (hour, first_seq, last_seq)
SELECT event_at_ns / 3600000000000, MIN(seq), MAX(seq)
FROM input_journal
WHERE kind IN ('transition', 'topology') AND event_at_ns IS NOT NULL
GROUP BY event_at_ns / 3600000000000;
DROP INDEX input_journal_recording;
