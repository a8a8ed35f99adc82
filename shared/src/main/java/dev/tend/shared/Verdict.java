package dev.tend.shared;

import java.util.Locale;

/** What the guards decided for a candidate run. */
public enum Verdict {
    START, HOLD, DENY, AWAIT_APPROVAL;

    /** The contract name: {@code start}, {@code hold}, {@code deny}, {@code await-approval}. */
    public String wireName() {
        return name().toLowerCase(Locale.ROOT).replace('_', '-');
    }

    public static Verdict parse(String wire) {
        for (Verdict v : values()) {
            if (v.wireName().equals(wire)) return v;
        }
        throw new IllegalArgumentException("verdict must be start, hold, deny or await-approval, got '" + wire + "'");
    }
}
