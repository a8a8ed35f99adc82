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
        for (int i = 0; i < objections.size(); i++) {
            Verdict ov = objections.get(i).code().verdict();
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

    // indexed loops, no iterator: the engine asks these at every evaluation
    public boolean has(ReasonCode code) {
        for (int i = 0; i < objections.size(); i++) if (objections.get(i).code() == code) return true;
        return false;
    }

    public Set<Wake> wakes() {
        Set<Wake> w = EnumSet.noneOf(Wake.class);
        for (Objection o : objections) w.add(o.wake());
        return w;
    }

    /** True when some objection wakes on {@code wake}: {@code wakes().contains(wake)}, without the set. */
    public boolean wakesOn(Wake wake) {
        for (int i = 0; i < objections.size(); i++) if (objections.get(i).wake() == wake) return true;
        return false;
    }

    /**
     * The earliest processing time at which every time-based objection may be gone (the
     * latest of their retry times), or null when none is time-based.
     */
    public Instant retryAt() {
        Instant t = null;
        for (int i = 0; i < objections.size(); i++) {
            Instant r = objections.get(i).retryAt();
            if (r != null && (t == null || r.isAfter(t))) t = r;
        }
        return t;
    }

    /** Like {@link #retryAt()} for event-time objections. */
    public Instant retryAtEventTime() {
        Instant t = null;
        for (int i = 0; i < objections.size(); i++) {
            Instant r = objections.get(i).retryAtEventTime();
            if (r != null && (t == null || r.isAfter(t))) t = r;
        }
        return t;
    }
}
