package dev.tend.simulator.synth;

import dev.tend.shared.HealthTransition;
import dev.tend.shared.Id;
import dev.tend.shared.SignalState;
import dev.tend.shared.TendException;
import dev.tend.shared.TopologyChange;
import dev.tend.shared.TopologyEvent;
import dev.tend.shared.fleet.ClusterSpec;
import dev.tend.shared.fleet.Fleet;
import dev.tend.shared.wire.RecordingHeader;
import dev.tend.shared.wire.WireWriter;

import java.io.BufferedWriter;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.SplittableRandom;

/**
 * Writes a synthetic recording of an invented Larkspur fleet, and the fleet file beside it,
 * both a pure function of the options (the same seed gives the same bytes). The background
 * is what a health pipeline reports on a normal day: short breaches that clear within a
 * minute or two (about 34 per cluster per day, most on signals no playbook reacts to),
 * signals that flap, disks the owner filled followed by the broker process stopping on the
 * same node, and a few nodes that go silent for good. Once, halfway through, zone z-b goes
 * dark for half an hour to three quarters: every node there goes silent and every cluster
 * reports itself under-replicated until its node is back. About 70 events per cluster per
 * day: {@code --clusters 2000 --days 7} gives about a million.
 *
 * <p>Times are whole seconds; about 3 % of events arrive a few seconds late, so the file
 * is in arrival order, not strictly in event-time order.
 */
public final class Synthesizer {
    /** Where a synthetic recording starts unless told otherwise: a Monday. */
    public static final Instant DEFAULT_START = Instant.parse("2027-03-01T00:00:00Z");
    static final String[] SIGNALS = {"heartbeat", "process-down", "replica-lag", "storage-full", "under-replicated",
            "cpu-high", "disk-latency", "gc-pause", "request-errors", "consumer-lag"};
    private static final int HEARTBEAT = 0, PROCESS_DOWN = 1, REPLICA_LAG = 2, STORAGE_FULL = 3, UNDER_REPLICATED = 4,
            CONSUMER_LAG = 9;
    private static final int[] NOISE_WEIGHTS = {8, 8, 10, 0, 0, 20, 18, 16, 15, 5};
    private static final int DAY = 86_400;

    /**
     * @param clusters 1 to 100,000
     * @param days     1 to 366
     * @param start    whole seconds
     */
    public record Options(int clusters, int days, long seed, Instant start) {
        public Options {
            if (clusters < 1 || clusters > 100_000) throw new IllegalArgumentException("clusters must be between 1 and 100000, got " + clusters);
            if (days < 1 || days > 366) throw new IllegalArgumentException("days must be between 1 and 366, got " + days);
            Objects.requireNonNull(start, "start");
            if (start.getNano() != 0) throw new IllegalArgumentException("start must be a whole second, got " + start);
        }

        public static Options of(int clusters, int days, long seed) {
            return new Options(clusters, days, seed, DEFAULT_START);
        }

        public Instant until() {
            return start.plus(Duration.ofDays(days));
        }
    }

    /** What was written. */
    public record Result(Path recording, Path fleet, long events, Instant from, Instant until) {
    }

    private Synthesizer() {
    }

    /** The fleet file written beside {@code recording}: its name without .jsonl/.json, plus {@code .fleet.yaml}. */
    public static Path fleetPathFor(Path recording) {
        String name = recording.getFileName().toString();
        for (String ext : List.of(".jsonl", ".json", ".ndjson")) {
            if (name.endsWith(ext) && name.length() > ext.length()) {
                name = name.substring(0, name.length() - ext.length());
                break;
            }
        }
        return recording.resolveSibling(name + ".fleet.yaml");
    }

    /**
     * Writes the recording to {@code recording} and its fleet to {@link #fleetPathFor}; the
     * header names the fleet by that file name (relative to the recording).
     *
     * @throws TendException when a file cannot be written
     */
    public static Result write(Options o, Path recording) {
        Fleet fleet = SyntheticFleet.of(o.clusters());
        EventBuffer events = generate(o, fleet);
        Path fleetPath = fleetPathFor(recording);
        try {
            Path dir = recording.toAbsolutePath().getParent();
            if (dir != null) Files.createDirectories(dir);
            Files.writeString(fleetPath, SyntheticFleet.yaml(fleet), StandardCharsets.UTF_8);
            try (BufferedWriter out = Files.newBufferedWriter(recording, StandardCharsets.UTF_8)) {
                WireWriter w = WireWriter.to(out);
                w.writeHeader(RecordingHeader.of("synthetic-" + o.clusters() + "-clusters-" + o.days() + "-days-seed-" + o.seed())
                        .withFleet(fleetPath.getFileName().toString())
                        .withPeriod(o.start(), o.until())
                        .withDescription("Synthetic " + o.days() + (o.days() == 1 ? " day" : " days") + " of " + o.clusters()
                                + " invented Larkspur clusters: short breaches, flapping, owner-filled disks, silent nodes, one outage of zone z-b"));
                writeEvents(w, o, fleet, events);
                w.flush();
            }
        } catch (IOException e) {
            throw new TendException("cannot write the synthetic recording " + recording + ": " + e.getMessage(), e);
        }
        return new Result(recording, fleetPath, events.size, o.start(), o.until());
    }

    static EventBuffer generate(Options o, Fleet fleet) {
        long limit = (long) o.days() * DAY;
        EventBuffer buf = new EventBuffer(limit);
        SplittableRandom root = new SplittableRandom(o.seed());
        List<ClusterSpec> clusters = new ArrayList<>(fleet.clusters());
        for (int c = 0; c < clusters.size(); c++) {
            SplittableRandom rnd = root.split();
            ClusterSpec spec = clusters.get(c);
            boolean broker = "broker".equals(spec.tags().get("kind"));
            for (int day = 0; day < o.days(); day++) {
                int episodes = 27 + rnd.nextInt(15);
                for (int i = 0; i < episodes; i++) shortBreach(buf, rnd, c, spec.size(), broker, (long) day * DAY + rnd.nextInt(DAY));
                if (rnd.nextDouble() < 0.12) flapping(buf, rnd, c, spec.size(), broker, (long) day * DAY + rnd.nextInt(DAY));
            }
            if (rnd.nextDouble() < 0.3 / o.days()) {
                // a node drained and put back, recorded as a topology change
                long t = rnd.nextLong(limit);
                buf.add(t, delay(rnd), c, rnd.nextInt(spec.size()), 0, EventBuffer.TOPOLOGY_CHANGED);
            }
        }
        SplittableRandom global = root.split();
        int disks = (int) Math.max(2, Math.round(o.clusters() * 0.03 * o.days() / 7.0));
        for (int i = 0; i < disks; i++) {
            int c = global.nextInt(clusters.size());
            ownerFilledDisk(buf, global, c, clusters.get(c).size(), global.nextLong(limit));
        }
        int silent = (int) Math.max(2, Math.round(o.clusters() / 400.0 * o.days() / 7.0));
        for (int i = 0; i < silent; i++) {
            int c = global.nextInt(clusters.size());
            long t = (long) (limit * (0.1 + 0.6 * global.nextDouble()));
            int node = global.nextInt(clusters.get(c).size());
            for (long s = t; s < limit; s += 300) buf.add(s, delay(global), c, node, HEARTBEAT, EventBuffer.SILENT);
        }
        zoneOutage(buf, global, clusters, (long) (o.days() / 2) * DAY + 7200 + global.nextInt(4 * 3600));
        return buf;
    }

    private static void shortBreach(EventBuffer buf, SplittableRandom rnd, int c, int nodes, boolean broker, long t) {
        int signal = pick(rnd);
        if (signal == REPLICA_LAG && !broker) signal = 5;
        int node = signal == CONSUMER_LAG ? -1 : rnd.nextInt(nodes);
        long lasts = 20 + rnd.nextInt(101);
        buf.add(t, delay(rnd), c, node, signal, signal == HEARTBEAT ? EventBuffer.SILENT : EventBuffer.BREACH);
        buf.add(t + lasts, delay(rnd), c, node, signal, EventBuffer.CLEAR);
    }

    private static void flapping(EventBuffer buf, SplittableRandom rnd, int c, int nodes, boolean broker, long t) {
        int signal = broker && rnd.nextBoolean() ? REPLICA_LAG : HEARTBEAT;
        int node = rnd.nextInt(nodes);
        int changes = 8 + 2 * rnd.nextInt(4);
        for (int i = 0; i < changes; i++) {
            byte st = i % 2 == 1 ? EventBuffer.CLEAR : signal == HEARTBEAT ? EventBuffer.SILENT : EventBuffer.BREACH;
            buf.add(t, delay(rnd), c, node, signal, st);
            t += 20 + rnd.nextInt(51);
        }
    }

    /** The owner's job fills a disk; the broker stops a minute or so later; the owner fixes both hours later. */
    private static void ownerFilledDisk(EventBuffer buf, SplittableRandom rnd, int c, int nodes, long t) {
        int node = rnd.nextInt(nodes);
        long fixed = t + 3600 + rnd.nextInt(3 * 3600);
        for (long s = t; s < fixed; s += 900) buf.add(s, delay(rnd), c, node, STORAGE_FULL, EventBuffer.BREACH);
        buf.add(t + 60 + rnd.nextInt(121), delay(rnd), c, node, PROCESS_DOWN, EventBuffer.BREACH);
        buf.add(fixed, delay(rnd), c, node, PROCESS_DOWN, EventBuffer.CLEAR);
        buf.add(fixed + 30 + rnd.nextInt(61), delay(rnd), c, node, STORAGE_FULL, EventBuffer.CLEAR);
    }

    private static void zoneOutage(EventBuffer buf, SplittableRandom rnd, List<ClusterSpec> clusters, long t0) {
        long lasts = 1500 + rnd.nextInt(1200);
        for (int c = 0; c < clusters.size(); c++) {
            ClusterSpec spec = clusters.get(c);
            long firstDown = Long.MAX_VALUE, lastUp = Long.MIN_VALUE;
            for (int n = 0; n < spec.size(); n++) {
                if (!"z-b".equals(spec.nodes().get(n).zone())) continue;
                long down = t0 + rnd.nextInt(180);
                long up = t0 + lasts + rnd.nextInt(180);
                buf.add(down, delay(rnd), c, n, HEARTBEAT, EventBuffer.SILENT);
                buf.add(up, delay(rnd), c, n, HEARTBEAT, EventBuffer.CLEAR);
                firstDown = Math.min(firstDown, down);
                lastUp = Math.max(lastUp, up);
            }
            if (firstDown == Long.MAX_VALUE) continue;
            buf.add(firstDown + 20 + rnd.nextInt(41), delay(rnd), c, -1, UNDER_REPLICATED, EventBuffer.BREACH);
            buf.add(lastUp + 60 + rnd.nextInt(241), delay(rnd), c, -1, UNDER_REPLICATED, EventBuffer.CLEAR);
        }
    }

    private static int pick(SplittableRandom rnd) {
        int total = 0;
        for (int w : NOISE_WEIGHTS) total += w;
        int x = rnd.nextInt(total);
        for (int i = 0; i < NOISE_WEIGHTS.length; i++) {
            x -= NOISE_WEIGHTS[i];
            if (x < 0) return i;
        }
        return NOISE_WEIGHTS.length - 1;
    }

    private static int delay(SplittableRandom rnd) {
        return rnd.nextDouble() < 0.03 ? 2000 + rnd.nextInt(38_000) : rnd.nextInt(1500);
    }

    private static void writeEvents(WireWriter w, Options o, Fleet fleet, EventBuffer buf) {
        List<ClusterSpec> clusters = new ArrayList<>(fleet.clusters());
        Id[] signals = new Id[SIGNALS.length];
        for (int i = 0; i < SIGNALS.length; i++) signals[i] = Id.of(SIGNALS[i]);
        long start = o.start().getEpochSecond();
        Map<String, Object> none = Map.of();
        for (int i : buf.arrivalOrder()) {
            ClusterSpec c = clusters.get(buf.cluster[i]);
            Id node = buf.node[i] < 0 ? null : c.nodes().get(buf.node[i]).id();
            Instant at = Instant.ofEpochSecond(start + buf.at[i]);
            if (buf.state[i] == EventBuffer.TOPOLOGY_CHANGED) {
                w.write(new TopologyEvent(at, c.id(), node, TopologyChange.CHANGED,
                        Map.of("zone", c.nodes().get(buf.node[i]).zone()), none));
                continue;
            }
            SignalState state = buf.state[i] == EventBuffer.BREACH ? SignalState.BREACH
                    : buf.state[i] == EventBuffer.SILENT ? SignalState.SILENT : SignalState.CLEAR;
            Map<String, Object> detail = buf.signal[i] == STORAGE_FULL && state == SignalState.BREACH
                    ? Map.of("used_pct", 96.0 + (buf.at[i] % 40) / 10.0) : none;
            w.write(new HealthTransition(at, c.id(), node, signals[buf.signal[i]], state, detail, none));
        }
    }
}
