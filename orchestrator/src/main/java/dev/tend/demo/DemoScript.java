package dev.tend.demo;

import java.time.Duration;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import java.util.Objects;

/**
 * The scripted incidents of {@code tend demo} in the Larkspur demo fleet (invented, like
 * every name here), played as rounds of {@link #ROUND} of demo time, one after the other.
 * Each round casts every incident on other nodes (round k takes cast k modulo the number of
 * casts), so that cooldowns and loop limits from an earlier round do not hide the next one.
 */
public final class DemoScript {
    /** Demo time from one round's start to the next. */
    public static final Duration ROUND = Duration.ofMinutes(60);

    private DemoScript() {
    }

    /** A node of the demo fleet. */
    public record Target(String cluster, String node) {
        public Target {
            Objects.requireNonNull(cluster, "Target.cluster must not be null");
            Objects.requireNonNull(node, "Target.node must not be null");
        }

        static Target of(String text) {
            int slash = text.indexOf('/');
            if (slash < 1 || slash == text.length() - 1) {
                throw new IllegalArgumentException("a demo target must look like fares-3/n2, got '" + text + "'");
            }
            return new Target(text.substring(0, slash), text.substring(slash + 1));
        }
    }

    /**
     * One transition of an incident.
     *
     * @param after  demo time from the round's start, within the round
     * @param target index into the incident's cast
     */
    public record Beat(Duration after, int target, String signal, String state) {
        public Beat {
            Objects.requireNonNull(after, "Beat.after must not be null");
            if (after.isNegative() || after.compareTo(ROUND) >= 0) {
                throw new IllegalArgumentException("Beat.after must be from 0 to less than " + ROUND + ", got " + after);
            }
            if (target < 0) throw new IllegalArgumentException("Beat.target must be 0 or more, got " + target);
            Objects.requireNonNull(signal, "Beat.signal must not be null");
            Objects.requireNonNull(state, "Beat.state must not be null");
        }
    }

    /**
     * An incident: what happens, on which nodes in each round, and its transitions.
     *
     * @param casts the nodes of each round's variant, each as many as the beats refer to
     */
    public record Incident(String name, String description, List<List<Target>> casts, List<Beat> beats) {
        public Incident {
            Objects.requireNonNull(name, "Incident.name must not be null");
            Objects.requireNonNull(description, "Incident.description must not be null");
            casts = casts.stream().map(List::copyOf).toList();
            beats = List.copyOf(beats);
            if (casts.isEmpty()) throw new IllegalArgumentException("Incident " + name + " needs at least one cast");
            int needed = beats.stream().mapToInt(Beat::target).max().orElse(-1) + 1;
            for (List<Target> c : casts) {
                if (c.size() < needed) {
                    throw new IllegalArgumentException("Incident " + name + ": every cast needs " + needed + " targets, got " + c);
                }
            }
        }
    }

    /** One transition to send in a round. */
    public record Scripted(Duration after, String incident, Target target, String signal, String state) {
    }

    /** The Larkspur incidents: a silent node on a standard and on a critical cluster, owner-filled disks, a flapping heartbeat. */
    public static List<Incident> larkspur() {
        List<Beat> flapping = new ArrayList<>();
        for (int i = 0; i < 7; i++) {
            Duration at = Duration.ofMinutes(15 + 2L * i);
            flapping.add(new Beat(at, 0, "heartbeat", "silent"));
            flapping.add(new Beat(at.plusSeconds(70), 0, "heartbeat", "clear"));
        }
        return List.of(
                new Incident("silent-standard-node",
                        "a node of a standard cluster stops reporting; after 5 minutes tend drains and replaces it",
                        casts("tickets-12/n2", "schedules-8/n1", "tickets-15/n3", "dispatch-23/n2", "schedules-11/n3",
                                "tickets-18/n1", "dispatch-26/n1", "schedules-14/n2"),
                        List.of(new Beat(Duration.ofMinutes(1), 0, "heartbeat", "silent"),
                                new Beat(Duration.ofMinutes(50), 0, "heartbeat", "clear"))),
                new Incident("silent-critical-node",
                        "a node of a critical fares cluster stops reporting; the playbook asks a person before replacing it",
                        casts("fares-3/n2", "fares-4/n1", "fares-5/n3", "fares-6/n2", "fares-8/n1", "fares-10/n3",
                                "fares-11/n2", "fares-14/n1"),
                        List.of(new Beat(Duration.ofMinutes(2), 0, "heartbeat", "silent"),
                                new Beat(Duration.ofMinutes(55), 0, "heartbeat", "clear"))),
                new Incident("owner-filled-disks",
                        "the ticketing team's reindex fills two brokers' disks and their processes stop; the full disks explain it,"
                                + " so tend leaves it to the owner (masked)",
                        List.of(targets("tickets-13/n2", "tickets-14/n1"), targets("tickets-16/n1", "tickets-17/n3"),
                                targets("tickets-19/n2", "tickets-20/n2"), targets("tickets-21/n1", "tickets-22/n3")),
                        List.of(new Beat(Duration.ofMinutes(10), 0, "storage-full", "breach"),
                                new Beat(Duration.ofMinutes(10).plusSeconds(30), 1, "storage-full", "breach"),
                                new Beat(Duration.ofMinutes(11), 0, "process-down", "breach"),
                                new Beat(Duration.ofMinutes(11).plusSeconds(30), 1, "process-down", "breach"),
                                new Beat(Duration.ofMinutes(40), 0, "storage-full", "clear"),
                                new Beat(Duration.ofMinutes(40), 1, "storage-full", "clear"),
                                new Beat(Duration.ofMinutes(41), 0, "process-down", "clear"),
                                new Beat(Duration.ofMinutes(41), 1, "process-down", "clear"))),
                new Incident("flapping-heartbeat",
                        "a bad network port: a dispatch node's heartbeat flaps for 14 minutes, never silent long enough to act on;"
                                + " tend holds it as flapping",
                        casts("dispatch-21/n3", "dispatch-24/n1", "dispatch-27/n2", "dispatch-30/n3"),
                        flapping));
    }

    /** Every transition of round {@code round} (from 0) of {@code incidents}, in time order. */
    public static List<Scripted> round(List<Incident> incidents, int round) {
        if (round < 0) throw new IllegalArgumentException("round must be 0 or more, got " + round);
        List<Scripted> out = new ArrayList<>();
        for (Incident i : incidents) {
            List<Target> cast = i.casts().get(round % i.casts().size());
            for (Beat b : i.beats()) out.add(new Scripted(b.after(), i.name(), cast.get(b.target()), b.signal(), b.state()));
        }
        out.sort(Comparator.comparing(Scripted::after));
        return List.copyOf(out);
    }

    private static List<List<Target>> casts(String... single) {
        List<List<Target>> out = new ArrayList<>();
        for (String s : single) out.add(List.of(Target.of(s)));
        return out;
    }

    private static List<Target> targets(String... many) {
        return java.util.Arrays.stream(many).map(Target::of).toList();
    }
}
