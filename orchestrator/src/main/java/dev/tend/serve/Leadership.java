package dev.tend.serve;

import dev.tend.api.view.LeaderView;
import dev.tend.store.LeaseRow;

import java.util.concurrent.atomic.AtomicLong;
import java.util.concurrent.atomic.AtomicReference;

/**
 * This instance's part among instances sharing one PostgreSQL store, for the health route,
 * the console and the metrics: leader or standby, the lease's epoch and holder, takeovers
 * made by this instance, and a standby's journal lag. Thread-safe.
 */
public final class Leadership {
    private final String instance;
    private final String address;
    private final AtomicReference<LeaderView> view;
    private final AtomicLong takeovers = new AtomicLong();

    public Leadership(String instance, String address) {
        this.instance = instance;
        this.address = address;
        this.view = new AtomicReference<>(new LeaderView("standby", instance, 0, null, null, 0));
    }

    public String instance() {
        return instance;
    }

    /** Where this instance's API answers. */
    public String address() {
        return address;
    }

    public LeaderView view() {
        return view.get();
    }

    /** This instance took the lease at {@code epoch}; {@code takeover} when another instance had led before. */
    void lead(long epoch, boolean takeover) {
        if (takeover) takeovers.incrementAndGet();
        view.set(new LeaderView("leader", instance, epoch, instance, address, 0));
    }

    /** A standby saw the lease as {@code row} (null: never held) with {@code lag} inputs still to read. */
    void standby(LeaseRow row, long lag) {
        boolean held = row != null && !row.lapsed() && !row.holder().isEmpty();
        view.set(new LeaderView("standby", instance, row == null ? 0 : row.epoch(), held ? row.holder() : null,
                held ? row.address() : null, lag));
    }

    public boolean leads() {
        return view.get().role().equals("leader");
    }

    public long takeovers() {
        return takeovers.get();
    }
}
