package dev.tend.engine.guard;

import dev.tend.shared.ReasonCode;
import dev.tend.shared.Verdict;

import java.time.Instant;
import java.util.ArrayList;
import java.util.EnumSet;
import java.util.List;
import java.util.Set;

/**
 * The verdict for a candidate with every guard's objection, in guard order. The verdict is
 * the gravest any objection gives (deny over hold over await-approval); start when none object.
 */
public record Decision(Verdict verdict, List<Objection> objections) {
    public Decision {
        objections = List.copyOf(objections);
    }

    public static Decision of(List<Objection> objections) {
        Verdict v = Verdict.START;
        for (Objection o : objections) {
            Verdict ov = o.code().verdict();
            if (ov == Verdict.DENY) v = Verdict.DENY;
            else if (ov == Verdict.HOLD && v != Verdict.DENY) v = Verdict.HOLD;
            else if (ov == Verdict.AWAIT_APPROVAL && v == Verdict.START) v = Verdict.AWAIT_APPROVAL;
        }
        return new Decision(v, objections);
    }

    public List<ReasonCode> reasons() {
        List<ReasonCode> out = new ArrayList<>();
        for (Objection o : objections) out.add(o.code());
        return out;
    }

    public List<String> reasonCodes() {
        List<String> out = new ArrayList<>();
        for (Objection o : objections) out.add(o.code().code());
        return out;
    }

    public boolean has(ReasonCode code) {
        for (Objection o : objections) if (o.code() == code) return true;
        return false;
    }

    public Set<Wake> wakes() {
        Set<Wake> w = EnumSet.noneOf(Wake.class);
        for (Objection o : objections) w.add(o.wake());
        return w;
    }

    /**
     * The earliest processing time at which every time-based objection may be gone (the
     * latest of their retry times), or null when none is time-based.
     */
    public Instant retryAt() {
        Instant t = null;
        for (Objection o : objections) {
            if (o.retryAt() != null && (t == null || o.retryAt().isAfter(t))) t = o.retryAt();
        }
        return t;
    }

    /** Like {@link #retryAt()} for event-time objections. */
    public Instant retryAtEventTime() {
        Instant t = null;
        for (Objection o : objections) {
            if (o.retryAtEventTime() != null && (t == null || o.retryAtEventTime().isAfter(t))) t = o.retryAtEventTime();
        }
        return t;
    }
}
