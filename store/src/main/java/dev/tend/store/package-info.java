/**
 * tend's persistence, on SQLite (one machine) or PostgreSQL (several tend processes).
 *
 * <p>{@link dev.tend.store.Store} opens a database and migrates it to this tend's schema
 * (Flyway, one set of scripts for both databases under {@code db/tend}). All access is
 * scoped by a callback: {@link dev.tend.store.Store#inTransaction} hands out a
 * {@link dev.tend.store.StoreTx}, {@link dev.tend.store.Store#read} a
 * {@link dev.tend.store.StoreReader}. What it keeps:
 * <ul>
 *   <li>the input journal ({@link dev.tend.store.InputRow}): every input the engine took, in
 *       seq order; replaying it rebuilds the engine's state;</li>
 *   <li>projections of the engine's effects for listing without a replay: runs, steps,
 *       timers, exclusions, approvals, fleet state;</li>
 *   <li>the audit ledger ({@link dev.tend.store.LedgerEntry}): append-only, RFC 8785
 *       canonical JSON entries chained by SHA-256, checked by
 *       {@link dev.tend.store.StoreReader#verifyLedger()}.</li>
 * </ul>
 * An input and the ledger entries of the decisions it caused are written in one
 * transaction, so they commit together or not at all.
 *
 * <p>Times are kept as nanoseconds since the epoch (exact, 1677 to 2262). Journal and
 * ledger appends are numbered in memory and sent in prepared batches; the tails they
 * continue from are cached per Store and checked once per transaction (see
 * {@code internal.HeadCache}). Types in {@code dev.tend.store.internal} are not API.
 */
package dev.tend.store;
