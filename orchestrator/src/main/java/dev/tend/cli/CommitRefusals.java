package dev.tend.cli;

import dev.tend.engine.Effect;
import dev.tend.engine.Engine;
import dev.tend.engine.Input;
import dev.tend.runtime.CommitListener;

import java.io.PrintWriter;
import java.util.List;
import java.util.concurrent.atomic.AtomicLong;

/**
 * What {@code tend ingest} says when the driver refuses an input at commit: the file and line
 * it was read from, then what it was and why. Remembers the line of each input from its
 * submission until its batch is committed or it is refused, so memory holds only the inputs
 * on their way, never the file. The driver commits or refuses the submitted inputs in the
 * order submitted, so they wait in that order and are matched at the head by identity,
 * without a hash of every input.
 */
public final class CommitRefusals implements CommitListener {
    private final String source;
    private final PrintWriter err;
    /** The inputs submitted and not yet committed or refused, oldest first, with their lines. */
    private final OnTheirWay onTheirWay = new OnTheirWay();
    private final AtomicLong refused = new AtomicLong();

    /** {@code source}: the file's path as given, or {@code -} for standard input. */
    public CommitRefusals(String source, PrintWriter err) {
        this.source = source;
        this.err = err;
    }

    /** {@code in} was read from {@code line} of the source and is about to be submitted. */
    public void submitted(Input in, long line) {
        onTheirWay.add(in, line);
    }

    /** Inputs refused so far. */
    public long count() {
        return refused.get();
    }

    @Override
    public void committed(Engine engine, List<Input> inputs, List<Effect> effects) {
        onTheirWay.passed(inputs);
    }

    @Override
    public void refused(Input in, String reason) {
        refused.incrementAndGet();
        long line = onTheirWay.passed(in);
        String what = "a " + in.kind() + " input" + (in.cluster() == null ? "" : " of " + in.cluster());
        err.println((line < 0 ? "tend: refused " + what : source + ":" + line + ": refused " + what + " at commit")
                + " (a ledger entry input-refused names it): " + reason);
    }

    /** Submitted inputs and their lines in submission order: a ring that grows, under one lock. */
    private static final class OnTheirWay {
        private Input[] inputs = new Input[1024];
        private long[] lines = new long[1024];
        private int head;
        private int size;

        synchronized void add(Input in, long line) {
            if (size == inputs.length) grow();
            int at = (head + size) & (inputs.length - 1);
            inputs[at] = in;
            lines[at] = line;
            size++;
        }

        /** Forgets the inputs of {@code batch} that were submitted (the others, such as timer firings, were never here). */
        synchronized void passed(List<Input> batch) {
            for (Input in : batch) {
                if (size > 0 && inputs[head] == in) pop();
            }
        }

        /** Forgets {@code in} and returns its line; -1 when it was not submitted here. */
        synchronized long passed(Input in) {
            if (size == 0 || inputs[head] != in) return -1;
            long line = lines[head];
            pop();
            return line;
        }

        private void pop() {
            inputs[head] = null;
            head = (head + 1) & (inputs.length - 1);
            size--;
        }

        private void grow() {
            Input[] in2 = new Input[inputs.length * 2];
            long[] lines2 = new long[inputs.length * 2];
            for (int i = 0; i < size; i++) {
                int from = (head + i) & (inputs.length - 1);
                in2[i] = inputs[from];
                lines2[i] = lines[from];
            }
            inputs = in2;
            lines = lines2;
            head = 0;
        }
    }
}
