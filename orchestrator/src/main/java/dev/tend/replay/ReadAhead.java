package dev.tend.replay;

import dev.tend.shared.CanonicalEvents;
import dev.tend.shared.HealthTransition;
import dev.tend.shared.Id;
import dev.tend.shared.Problem;
import dev.tend.shared.TendException;
import dev.tend.shared.WireEvent;
import dev.tend.shared.fleet.SignalNumbering;
import dev.tend.shared.wire.ReadSummary;
import dev.tend.simulator.Recording;

import java.util.ArrayList;
import java.util.Collection;
import java.util.List;
import java.util.concurrent.ArrayBlockingQueue;
import java.util.concurrent.BlockingQueue;

/**
 * Reads a recording on a second thread while the calling thread replays it: parsing lines
 * and running the engine then take two cores instead of adding up on one. Events reach the
 * sink on the calling thread in file order, a batch at a time, so the replay is exactly what
 * reading on one thread would give. Ids are made canonical on the way (one instance per
 * distinct id), so the engine's maps compare them by identity rather than character by
 * character, and each transition's signal is numbered ({@link SignalNumbering}), so the
 * engine's health view finds it by number rather than by hashing.
 */
final class ReadAhead {
    private static final int BATCH = 2048;
    private static final int BATCHES_AHEAD = 16;

    private static final class Batch {
        final WireEvent[] events = new WireEvent[BATCH];
        final long[] lines = new long[BATCH];
        /** A transition's signal numbered by the reader's {@link SignalNumbering}; null for a topology event. */
        final SignalNumbering.Numbered[] keys = new SignalNumbering.Numbered[BATCH];
        int size;
        final List<Problem> problems = new ArrayList<>(0);
        long bytesRead = -1;
        ReadSummary summary;
        Throwable failure;

        boolean isFull() {
            return size == BATCH;
        }
    }

    /** Thrown inside the reader to stop it when the replaying side gave up. */
    private static final class Stopped extends RuntimeException {
        Stopped() {
            super(null, null, false, false);
        }
    }

    private ReadAhead() {
    }

    /** A sink that takes each transition's signal numbered as well (see {@link SignalNumbering}). */
    interface NumberedSink extends Recording.Sink {
        /** {@link #event(WireEvent, long)} with {@code key}, the numbered key of a transition's signal (null for a topology event). */
        void event(WireEvent event, long line, SignalNumbering.Numbered key);
    }

    /**
     * Reads {@code recording} into {@code sink} as {@link Recording#read} does, parsing on a
     * second thread. Ids equal to one of {@code known} (the fleet's clusters and nodes, the
     * playbooks' signals) are replaced by that instance, so that looking them up in the
     * engine's fleet and playbooks finds them by identity.
     */
    static ReadSummary read(Recording recording, Recording.Sink sink, Collection<Id> known) {
        return start(recording, known, 1).take(0, sink);
    }

    /**
     * Starts reading {@code recording} on a second thread for {@code consumers} replays, each of
     * which calls {@link Reading#take} with its own number, on its own thread: the file is read
     * and parsed once, and every consumer receives every event (the same instances, which no one
     * changes), as {@link #read} would give it.
     */
    static Reading start(Recording recording, Collection<Id> known, int consumers) {
        Reader reader = new Reader(recording, consumers);
        for (Id id : known) reader.events.know(id);
        Thread thread = new Thread(reader, "tend-replay-reader");
        thread.setDaemon(true);
        thread.start();
        return new Reading(recording, reader, thread);
    }

    /** A reading under way: what its consumers take. */
    static final class Reading {
        private final Recording recording;
        private final Reader reader;
        private final Thread thread;

        private Reading(Recording recording, Reader reader, Thread thread) {
            this.recording = recording;
            this.reader = reader;
            this.thread = thread;
        }

        /** Hands consumer {@code consumer}'s share of the reading to {@code sink}, on the calling thread. */
        ReadSummary take(int consumer, Recording.Sink sink) {
            BlockingQueue<Batch> queue = reader.queues.get(consumer);
            NumberedSink numbered = sink instanceof NumberedSink n ? n : null;
            boolean done = false;
            try {
                while (true) {
                    Batch b = queue.take();
                    if (numbered != null) {
                        for (int i = 0; i < b.size; i++) numbered.event(b.events[i], b.lines[i], b.keys[i]);
                    } else {
                        for (int i = 0; i < b.size; i++) sink.event(b.events[i], b.lines[i]);
                    }
                    for (Problem p : b.problems) sink.problem(p);
                    if (b.bytesRead >= 0) sink.progress(b.bytesRead);
                    if (b.failure != null) {
                        done = true;
                        if (b.failure instanceof RuntimeException e) throw e;
                        if (b.failure instanceof Error e) throw e;
                        throw new TendException("reading " + recording.file() + " failed: " + b.failure, b.failure);
                    }
                    if (b.summary != null) {
                        done = true;
                        return b.summary;
                    }
                }
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
                throw new TendException("the replay of " + recording.file() + " was interrupted", e);
            } finally {
                if (!done && reader.leave(consumer)) thread.interrupt();
            }
        }
    }

    private static final class Reader implements Runnable, Recording.Sink {
        private final Recording recording;
        final List<BlockingQueue<Batch>> queues = new ArrayList<>();
        /** Per consumer: it stopped before the end (threw), and takes no more. */
        private final boolean[] gone;
        final CanonicalEvents events = new CanonicalEvents();
        private final SignalNumbering numbering = new SignalNumbering();
        private Batch batch = new Batch();
        volatile boolean stop;

        Reader(Recording recording, int consumers) {
            this.recording = recording;
            for (int i = 0; i < consumers; i++) queues.add(new ArrayBlockingQueue<>(BATCHES_AHEAD));
            this.gone = new boolean[consumers];
        }

        /**
         * Consumer {@code i} takes no more; true when it was the last, and the reading stops. Its
         * queue is emptied, so that a reader waiting to hand it a batch goes on to the others.
         */
        boolean leave(int i) {
            synchronized (gone) {
                gone[i] = true;
                queues.get(i).clear();
                for (boolean g : gone) if (!g) return false;
                stop = true;
                return true;
            }
        }

        private boolean isGone(int i) {
            synchronized (gone) {
                return gone[i];
            }
        }

        @Override
        public void run() {
            try {
                ReadSummary summary = recording.read(this);
                batch.summary = summary;
                hand();
            } catch (Stopped s) {
                // the replaying side stopped first; nobody waits for the rest
            } catch (Throwable t) {
                batch.failure = t;
                try {
                    hand();
                } catch (Stopped s) {
                    // nobody waits
                }
            }
        }

        /** The recording is read with the canonical ids ({@link #ids}): its events need no {@link CanonicalEvents#of}. */
        @Override
        public CanonicalEvents ids() {
            return events;
        }

        @Override
        public void event(WireEvent event, long line) {
            batch.events[batch.size] = event;
            batch.lines[batch.size] = line;
            batch.keys[batch.size] = event instanceof HealthTransition t ? numbering.of(t.cluster(), t.node(), t.signal()) : null;
            batch.size++;
            if (batch.isFull()) hand();
        }

        @Override
        public void problem(Problem problem) {
            batch.problems.add(problem);
        }

        @Override
        public void progress(long bytesRead) {
            batch.bytesRead = bytesRead;
        }

        private void hand() {
            if (stop) throw new Stopped();
            try {
                for (int i = 0; i < queues.size(); i++) {
                    if (!isGone(i)) queues.get(i).put(batch);
                }
            } catch (InterruptedException e) {
                throw new Stopped();
            }
            batch = new Batch();
        }
    }
}
