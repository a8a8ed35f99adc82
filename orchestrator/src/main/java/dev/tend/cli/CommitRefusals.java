package dev.tend.cli;

import dev.tend.engine.Effect;
import dev.tend.engine.Engine;
import dev.tend.engine.Input;
import dev.tend.runtime.CommitListener;

import java.io.PrintWriter;
import java.util.Collections;
import java.util.IdentityHashMap;
import java.util.List;
import java.util.Map;
import java.util.concurrent.atomic.AtomicLong;

/**
 * What {@code tend ingest} says when the driver refuses an input at commit: the file and line
 * it was read from, then what it was and why. Remembers the line of each input from its
 * submission until its batch is committed or it is refused, so memory holds only the inputs
 * on their way, never the file.
 */
public final class CommitRefusals implements CommitListener {
    private final String source;
    private final PrintWriter err;
    private final Map<Input, Long> lineOf = Collections.synchronizedMap(new IdentityHashMap<>());
    private final AtomicLong refused = new AtomicLong();

    /** {@code source}: the file's path as given, or {@code -} for standard input. */
    public CommitRefusals(String source, PrintWriter err) {
        this.source = source;
        this.err = err;
    }

    /** {@code in} was read from {@code line} of the source and is about to be submitted. */
    public void submitted(Input in, long line) {
        lineOf.put(in, line);
    }

    /** Inputs refused so far. */
    public long count() {
        return refused.get();
    }

    @Override
    public void committed(Engine engine, List<Input> inputs, List<Effect> effects) {
        for (Input in : inputs) lineOf.remove(in);
    }

    @Override
    public void refused(Input in, String reason) {
        refused.incrementAndGet();
        Long line = lineOf.remove(in);
        String what = "a " + in.kind() + " input" + (in.cluster() == null ? "" : " of " + in.cluster());
        err.println((line == null ? "tend: refused " + what : source + ":" + line + ": refused " + what + " at commit")
                + " (a ledger entry input-refused names it): " + reason);
    }
}
