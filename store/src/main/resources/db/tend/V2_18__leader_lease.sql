-- The leader lease of `tend serve` instances sharing one PostgreSQL store (one row, id 1).
-- `epoch` rises by one at every takeover; the leader's commits check it in the same
-- transaction (fencing), so a deposed leader never writes again. `expires_ms` is the
-- database's own clock (milliseconds since 1970), so the instances' clocks do not matter.
-- `address` is where the leader's API answers, for standbys to name in refusals.
CREATE TABLE leader_lease (
    id         INTEGER NOT NULL PRIMARY KEY,
    epoch      BIGINT NOT NULL,
    holder     TEXT NOT NULL,
    address    TEXT NOT NULL,
    expires_ms BIGINT NOT NULL
);
