-- How far each partition of a topic tend consumes has been taken in: `next_offset` is the
-- offset of the first record not yet journaled or refused. It is written in the same
-- transaction as the journal rows (or the refusal) of the records it counts, so a consumer
-- started again (after a crash, or by a new leader) seeks here and takes each record once.
CREATE TABLE stream_offsets (
    topic       TEXT NOT NULL,
    part        INTEGER NOT NULL,
    next_offset BIGINT NOT NULL,
    PRIMARY KEY (topic, part)
);
