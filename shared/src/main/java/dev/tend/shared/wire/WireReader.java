package dev.tend.shared.wire;

import dev.tend.shared.CanonicalEvents;
import dev.tend.shared.HealthTransition;
import dev.tend.shared.Id;
import dev.tend.shared.InvalidInputException;
import dev.tend.shared.NearestName;
import dev.tend.shared.Problem;
import dev.tend.shared.WireEvent;
import dev.tend.shared.time.Durations;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStream;
import java.io.Reader;
import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.Collection;
import java.util.Collections;
import java.util.EnumMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.Set;
import java.util.TreeSet;
import java.util.concurrent.atomic.AtomicLongArray;
import java.util.function.Consumer;
import java.util.function.Supplier;

/**
 * Reads wire format v1 (DESIGN.md section 3): JSON Lines of health transitions and
 * topology events, optionally preceded by a recording header.
 *
 * <p>Each line is one of:
 * <ul>
 *   <li>a <b>recording header</b>: it has a {@code recording} key; allowed once, before the
 *       first event; anywhere else the line is rejected;</li>
 *   <li>a <b>health transition</b>: it has {@code signal} (and needs {@code state},
 *       {@code at}, {@code cluster}; {@code node} absent or null means cluster-level;
 *       {@code detail}, if present and not null, must be an object);</li>
 *   <li>a <b>topology event</b>: it has {@code topology} (and needs {@code at},
 *       {@code cluster}, {@code node}; {@code attrs}, if present and not null, must be an
 *       object);</li>
 *   <li>blank: empty or whitespace only.</li>
 * </ul>
 * A line with both {@code signal} and {@code topology}, or with none of the marking keys,
 * is rejected. Unknown fields are kept, in line order, in the event's {@code extra} as
 * plain Java JSON values (Map, List, String, Integer/Long/BigInteger, Double, Boolean,
 * null) and otherwise ignored. Ids must match {@link dev.tend.shared.Id#PATTERN}; times are
 * RFC 3339 with a zone ({@link Rfc3339}).
 *
 * <p>A rejected line becomes a {@link LineResult.Bad} whose {@link Problem} names the
 * source, line, the column where the offending value starts (0 when nothing on the line
 * is at fault, as for a missing field), the field, and a sentence such as
 * {@code events.jsonl:7:40: field 'cluster': 'fares 3' is not an id: use letters, digits and . _ : - only, starting with a letter or digit}.
 * A line is checked field by field in written order (at, cluster, node, signal, state,
 * detail); the first problem rejects it.
 *
 * <p>Times are bounded (DESIGN.md section 3), so that one mistyped year cannot move event
 * time anywhere: a time before 1970 or after 2200 is refused; after a recording header with
 * {@code from} or {@code until}, an event outside that period is refused; a reader for a live
 * input ({@link #withLiveClock}) refuses an event more than {@code max-skew} ahead of its clock. Each
 * refusal is a {@link LineResult.Bad} naming field {@code at}, and is counted by
 * {@link TimeRefusal} ({@link #timeRefusals()}). Only what tend wrote itself (its journal)
 * is read without these bounds ({@link #trusted}).
 *
 * <p>The reader does not order events: late and out-of-order lines are handed on in line
 * order, and ordering by event time is the fleet view's job.
 *
 * <p>One reader follows one input: it remembers the header and the first event, so lines
 * must be given in order. {@link #parseLine} may also be called from several threads for
 * independent lines (journal rows, HTTP bodies); each call keeps its work to itself, and
 * only the header rule then depends on the order of calls. The JSON machinery behind it
 * is shared by all readers.
 */
public final class WireReader {
    /** How many problems {@link #readAll} keeps; later bad lines are only counted. */
    public static final int MAX_PROBLEMS_KEPT = 1000;

    private static final char BYTE_ORDER_MARK = '\uFEFF';

    /** The first instant accepted at the wire. */
    public static final Instant EARLIEST = Instant.parse("1970-01-01T00:00:00Z");
    /** The first instant refused at the wire: every time of the year 2200 is still accepted. */
    public static final Instant BEYOND = Instant.parse("2201-01-01T00:00:00Z");

    private final String source;
    private final boolean bounded;
    private final Supplier<Instant> clock;
    private final Duration maxSkew;
    private final Set<String> signals;
    /** Whether {@link #readAll(InputStream, Consumer)} tries {@link PlainLine} first (tests compare with and without). */
    private final boolean plainFirst;
    /** The canonical ids handed on ({@link #withIds}); null: a new {@link Id} each time. */
    private final CanonicalEvents ids;
    private final AtomicLongArray refusals = new AtomicLongArray(TimeRefusal.values().length);
    private volatile long headerLine;
    private volatile long firstEventLine;
    private volatile RecordingHeader header;
    /** The live clock's limit on event times; null without a live clock. */
    private final AheadLimit ahead;

    private WireReader(String source, boolean bounded, Supplier<Instant> clock, Duration maxSkew, Set<String> signals,
                       boolean plainFirst, CanonicalEvents ids) {
        this.source = Objects.requireNonNull(source, "source");
        this.bounded = bounded;
        this.clock = clock;
        this.maxSkew = maxSkew;
        this.signals = signals;
        this.plainFirst = plainFirst;
        this.ids = ids;
        this.ahead = clock == null ? null : new AheadLimit(clock, maxSkew);
    }

    /** A reader for one input; {@code source} (a file name, or "-" for standard input) names it in problems. */
    public static WireReader of(String source) {
        return new WireReader(source, true, null, null, Set.of(), true, null);
    }

    /**
     * A reader of lines tend accepted and stored itself (its journal): no time bounds and no
     * vocabulary, since refusing what was once accepted would lose it.
     */
    public static WireReader trusted(String source) {
        return new WireReader(source, false, null, null, Set.of(), true, null);
    }

    /**
     * A copy for a live input (ingest, HTTP, standard input): it also refuses an event whose
     * time is more than {@code maxSkew} ahead of {@code clock} at the moment its line is read.
     * Call before reading the first line.
     */
    public WireReader withLiveClock(Supplier<Instant> newClock, Duration newMaxSkew) {
        Objects.requireNonNull(newClock, "clock");
        if (newMaxSkew == null || newMaxSkew.isNegative()) {
            throw new IllegalArgumentException("maxSkew must be zero or longer, got " + newMaxSkew);
        }
        return new WireReader(source, bounded, newClock, newMaxSkew, signals, plainFirst, ids);
    }

    /**
     * A copy that refuses a transition whose signal is not one of {@code declared}
     * (tend.yaml {@code signals:}), suggesting the nearest declared one; an empty collection
     * accepts every signal. Call before reading the first line.
     */
    public WireReader withSignals(Collection<Id> declared) {
        Set<String> names = new TreeSet<>();
        for (Id id : declared) names.add(id.value());
        return new WireReader(source, bounded, clock, maxSkew, Collections.unmodifiableSet(names), plainFirst, ids);
    }

    /** A copy that reads every line the general way, never by {@link PlainLine}: the reference its tests compare with. */
    WireReader withoutPlainLines() {
        return new WireReader(source, bounded, clock, maxSkew, signals, false, ids);
    }

    /**
     * A copy whose events carry the instances of {@code canonical} for their ids: a reader
     * that hands the engine the instances its maps hold (the fleet's, one per distinct id)
     * spares the engine a lookup of each id of each event. The fast path asks once per
     * distinct id, the general way once per id of the line. Call before reading the first line.
     */
    public WireReader withIds(CanonicalEvents canonical) {
        return new WireReader(source, bounded, clock, maxSkew, signals, plainFirst, Objects.requireNonNull(canonical, "canonical"));
    }

    /** {@code e} with the ids {@link #withIds} gives; {@code e} itself without. */
    private WireEvent canonical(WireEvent e) {
        return ids == null ? e : ids.of(e);
    }

    /** Lines refused for their time so far, by reason; every reason present (0 when none). */
    public Map<TimeRefusal, Long> timeRefusals() {
        Map<TimeRefusal, Long> out = new EnumMap<>(TimeRefusal.class);
        for (TimeRefusal r : TimeRefusal.values()) out.put(r, refusals.get(r.ordinal()));
        return out;
    }

    public String source() {
        return source;
    }

    /**
     * Parses one line (without its line break). Calls must come in line order: whether a
     * header is allowed depends on the lines before. Never throws for bad input.
     *
     * @param line       the text of the line, not null
     * @param lineNumber its 1-based number, used in problems
     */
    public LineResult parseLine(String line, long lineNumber) {
        if (line.isBlank()) return new LineResult.Blank(lineNumber);
        try {
            JsonLine fields = JsonLine.parse(line);
            if (fields.has("recording")) return header(fields, lineNumber);
            boolean transition = fields.has("signal");
            int topology = fields.indexOf("topology");
            if (transition && topology >= 0) {
                throw new LineRejected(fields.column(topology), "topology", "this line has both 'signal' and"
                        + " 'topology': a line is a health transition or a topology event, not both");
            }
            LineResult result;
            if (topology >= 0) {
                result = new LineResult.Event(canonical(checked(fields, LineDecoder.topology(fields))), lineNumber);
            } else if (transition || fields.has("state")) {
                result = new LineResult.Event(canonical(checked(fields, LineDecoder.transition(fields))), lineNumber);
            } else {
                throw new LineRejected(0, "", "this line is neither a health transition (it needs 'signal' and 'state')"
                        + " nor a topology event (it needs 'topology') nor a recording header (it needs 'recording')");
            }
            if (firstEventLine == 0) firstEventLine = lineNumber;
            return result;
        } catch (LineRejected r) {
            return bad(lineNumber, r.column, r.field, r.getMessage());
        }
    }

    /**
     * Reads {@code in} to its end, handing each line's result to {@code sink} in line
     * order as soon as the line has been read, so that a live input (standard input, a
     * pipe) is processed as it arrives. Bad lines are handed on too and never stop the
     * reading. A byte order mark at the very start is skipped. The caller closes {@code in}.
     *
     * @return the counts, and the problems of the first {@value #MAX_PROBLEMS_KEPT} bad lines
     * @throws InvalidInputException when {@code in} itself fails; the lines before have
     *         been handed on
     * @throws RuntimeException whatever {@code sink} throws, which stops the reading
     */
    public ReadSummary readAll(Reader in, Consumer<LineResult> sink) {
        BufferedReader lines = in instanceof BufferedReader b ? b : new BufferedReader(in, 1 << 16);
        return readAll(n -> {
            String text = lines.readLine();
            return text == null ? null : parsed(new Utf8Lines.Line(text, 0), n);
        }, sink);
    }

    /**
     * As {@link #readAll(Reader, Consumer)}, from bytes: each line is decoded as UTF-8 on its
     * own, and a line that is not valid UTF-8 is a bad line located at its first wrong byte,
     * while the lines after it are read as usual. Files and standard input are read this way,
     * so that both behave the same. The usual transition line is read from its bytes
     * ({@link PlainLine}), and its event comes with its wire line ({@link LineResult.Event#wire()}).
     */
    public ReadSummary readAll(InputStream in, Consumer<LineResult> sink) {
        Utf8Lines lines = new Utf8Lines(in);
        PlainLine plain = plainFirst ? new PlainLine(signals, ids == null ? null : ids::canonical) : null;
        return readAll(n -> {
            if (!lines.advance()) return null;
            LineResult r = plain == null ? null : plain(plain.read(lines.bytes(), lines.length(), n));
            return r != null ? r : parsed(lines.decode(), n);
        }, sink);
    }

    private interface LineSource {
        /** The result of line {@code lineNumber}, or null at the end of the input. */
        LineResult next(long lineNumber) throws IOException;
    }

    private ReadSummary readAll(LineSource lines, Consumer<LineResult> sink) {
        long n = 0, events = 0, headers = 0, blanks = 0, bad = 0, omitted = 0;
        List<Problem> problems = new ArrayList<>();
        LineResult r;
        while ((r = next(lines, n)) != null) {
            n++;
            if (r instanceof LineResult.Event) {
                events++;
            } else if (r instanceof LineResult.Header) {
                headers++;
            } else if (r instanceof LineResult.Blank) {
                blanks++;
            } else {
                bad++;
                if (problems.size() < MAX_PROBLEMS_KEPT) problems.add(((LineResult.Bad) r).problem());
                else omitted++;
            }
            sink.accept(r);
        }
        return new ReadSummary(n, events, headers, blanks, bad, problems, omitted);
    }

    /** The result of line {@code n} from its text, or the bad line its wrong encoding makes. */
    private LineResult parsed(Utf8Lines.Line next, long n) {
        if (!next.isValid()) {
            return bad(n, next.badColumn(), "", "this line is not valid UTF-8 (the byte at column " + next.badColumn()
                    + " cannot start or continue a character); the line is skipped");
        }
        String line = next.text();
        if (n == 1 && !line.isEmpty() && line.charAt(0) == BYTE_ORDER_MARK) line = line.substring(1);
        return parseLine(line, n);
    }

    /**
     * {@code read}, a transition {@link PlainLine} read, when it passes the checks {@link #checked}
     * makes of time (the signal it has checked itself); else null, and the line is read the general
     * way, which words and counts the refusal.
     */
    private LineResult plain(LineResult.Event read) {
        if (read == null) return null;
        if (bounded) {
            Instant at = read.event().at();
            if (at.isBefore(EARLIEST) || !at.isBefore(BEYOND)) return null;
            RecordingHeader h = header;
            if (h != null && (h.from() != null && at.isBefore(h.from()) || h.until() != null && at.isAfter(h.until()))) return null;
            if (ahead != null && !ahead.allows(at)) return null;
        }
        if (firstEventLine == 0) firstEventLine = read.line();
        return read;
    }

    private LineResult next(LineSource lines, long done) {
        try {
            return lines.next(done + 1);
        } catch (IOException e) {
            throw new InvalidInputException(Problem.at(source, lineInt(done + 1), 0, "",
                    "cannot read past line " + done + ": " + e.getMessage()));
        }
    }

    private LineResult header(JsonLine fields, long lineNumber) throws LineRejected {
        int column = fields.column(fields.indexOf("recording"));
        if (firstEventLine != 0) {
            throw new LineRejected(column, "recording", "a recording header must come before the first event (line "
                    + firstEventLine + ")");
        }
        if (headerLine != 0) {
            throw new LineRejected(column, "recording", "a recording has one header; the first is at line " + headerLine);
        }
        RecordingHeader h = LineDecoder.header(fields);
        if (bounded) {
            if (h.from() != null) refuseOutsideWire(fields, "from", h.from());
            if (h.until() != null) refuseOutsideWire(fields, "until", h.until());
        }
        headerLine = lineNumber;
        header = h;
        return new LineResult.Header(h, lineNumber);
    }

    private WireEvent checked(JsonLine fields, WireEvent e) throws LineRejected {
        if (!signals.isEmpty() && e instanceof HealthTransition t && !signals.contains(t.signal().value())) {
            String name = t.signal().value();
            int i = fields.indexOf("signal");
            throw new LineRejected(fields.column(i), "signal", "field 'signal': '" + name + "' is not one of the signals"
                    + " tend.yaml declares" + NearestName.among(name, signals, 2).map(n -> " (did you mean '" + n + "'?)").orElse("")
                    + "; declared: " + String.join(", ", signals));
        }
        if (!bounded) return e;
        Instant at = e.at();
        refuseOutsideWire(fields, "at", at);
        RecordingHeader h = header;
        if (h != null && (h.from() != null && at.isBefore(h.from()) || h.until() != null && at.isAfter(h.until()))) {
            throw refuse(fields, "at", TimeRefusal.OUTSIDE_RECORDING, Rfc3339.format(at) + " is outside the recorded period of its header ("
                    + (h.from() == null ? "open" : Rfc3339.format(h.from())) + " to "
                    + (h.until() == null ? "open" : Rfc3339.format(h.until())) + ", line " + headerLine + ")");
        }
        if (ahead != null && !ahead.allows(at)) {
            Instant now = ahead.lastReading();
            throw refuse(fields, "at", TimeRefusal.AHEAD_OF_CLOCK, Rfc3339.format(at) + " is "
                    + Durations.format(Duration.between(now, at).withNanos(0)) + " ahead of this clock ("
                    + Rfc3339.format(now.with(java.time.temporal.ChronoField.NANO_OF_SECOND, 0)) + "); a live input refuses times more than "
                    + Durations.format(maxSkew) + " ahead (tend.yaml max-skew): is the year or the source's clock wrong?");
        }
        return e;
    }

    private void refuseOutsideWire(JsonLine fields, String field, Instant t) throws LineRejected {
        if (t.isBefore(EARLIEST)) {
            throw refuse(fields, field, TimeRefusal.BEFORE_1970, Rfc3339.format(t)
                    + " is before 1970; tend accepts times from 1970 to 2200: is the year mistyped?");
        }
        if (!t.isBefore(BEYOND)) {
            throw refuse(fields, field, TimeRefusal.AFTER_2200, Rfc3339.format(t)
                    + " is after 2200; tend accepts times from 1970 to 2200: is the year mistyped?");
        }
    }

    private LineRejected refuse(JsonLine fields, String field, TimeRefusal why, String message) {
        refusals.incrementAndGet(why.ordinal());
        int i = fields.indexOf(field);
        return new LineRejected(i < 0 ? 0 : fields.column(i), field, "field '" + field + "': " + message);
    }

    private LineResult bad(long lineNumber, int column, String field, String message) {
        return new LineResult.Bad(Problem.at(source, lineInt(lineNumber), column, field, message));
    }

    private static int lineInt(long lineNumber) {
        return (int) Math.max(0, Math.min(lineNumber, Integer.MAX_VALUE));
    }
}
