-- Receipts of requests counted but not yet in the ledger (OpenReceipt): a live commit adds its
-- callers' counts here, one small row per caller, instead of appending a ledger entry (a row,
-- three index entries and the head: most of the pages a one-request commit wrote). Closed about
-- once a second, each row becomes one ledger entry in the transaction that deletes it, so a
-- crash at any moment loses no receipt: what is open is appended at the next close.
CREATE TABLE open_receipts (
    kind     TEXT NOT NULL,
    caller   TEXT NOT NULL,
    accepted BIGINT NOT NULL,
    rejected BIGINT NOT NULL,
    requests BIGINT NOT NULL,
    first_ns BIGINT NOT NULL,
    last_ns  BIGINT NOT NULL,
    PRIMARY KEY (kind, caller)
) ${without_rowid};
