package dev.tend.store;

/**
 * A commit of a leader whose lease is no longer current: another instance took over (the
 * epoch moved on), so the transaction was rolled back and nothing of it was written. The
 * instance must stop acting as leader.
 */
public final class LeaseLostException extends StoreException {
    private final long epoch;

    public LeaseLostException(String location, long epoch, String message) {
        super(location, message);
        this.epoch = epoch;
    }

    /** The epoch this instance led under. */
    public long epoch() {
        return epoch;
    }
}
