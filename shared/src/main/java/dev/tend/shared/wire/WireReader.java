package dev.tend.shared.wire;

import dev.tend.shared.InvalidInputException;
import dev.tend.shared.Problem;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStream;
import java.io.Reader;
import java.util.ArrayList;
import java.util.List;
import java.util.Objects;
import java.util.function.Consumer;

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

    private final String source;
    private volatile long headerLine;
    private volatile long firstEventLine;

    private WireReader(String source) {
        this.source = Objects.requireNonNull(source, "source");
    }

    /** A reader for one input; {@code source} (a file name, or "-" for standard input) names it in problems. */
    public static WireReader of(String source) {
        return new WireReader(source);
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
                result = new LineResult.Event(LineDecoder.topology(fields), lineNumber);
            } else if (transition || fields.has("state")) {
                result = new LineResult.Event(LineDecoder.transition(fields), lineNumber);
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
        return readAll(() -> {
            String text = lines.readLine();
            return text == null ? null : new Utf8Lines.Line(text, 0);
        }, sink);
    }

    /**
     * As {@link #readAll(Reader, Consumer)}, from bytes: each line is decoded as UTF-8 on its
     * own, and a line that is not valid UTF-8 is a bad line located at its first wrong byte,
     * while the lines after it are read as usual. Files and standard input are read this way,
     * so that both behave the same.
     */
    public ReadSummary readAll(InputStream in, Consumer<LineResult> sink) {
        Utf8Lines lines = new Utf8Lines(in);
        return readAll(lines::next, sink);
    }

    private interface LineSource {
        Utf8Lines.Line next() throws IOException;
    }

    private ReadSummary readAll(LineSource lines, Consumer<LineResult> sink) {
        long n = 0, events = 0, headers = 0, blanks = 0, bad = 0, omitted = 0;
        List<Problem> problems = new ArrayList<>();
        Utf8Lines.Line next;
        while ((next = next(lines, n)) != null) {
            n++;
            LineResult r;
            if (!next.isValid()) {
                r = bad(n, next.badColumn(), "", "this line is not valid UTF-8 (the byte at column " + next.badColumn()
                        + " cannot start or continue a character); the line is skipped");
            } else {
                String line = next.text();
                if (n == 1 && !line.isEmpty() && line.charAt(0) == BYTE_ORDER_MARK) line = line.substring(1);
                r = parseLine(line, n);
            }
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

    private Utf8Lines.Line next(LineSource lines, long done) {
        try {
            return lines.next();
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
        RecordingHeader header = LineDecoder.header(fields);
        headerLine = lineNumber;
        return new LineResult.Header(header, lineNumber);
    }

    private LineResult bad(long lineNumber, int column, String field, String message) {
        return new LineResult.Bad(Problem.at(source, lineInt(lineNumber), column, field, message));
    }

    private static int lineInt(long lineNumber) {
        return (int) Math.max(0, Math.min(lineNumber, Integer.MAX_VALUE));
    }
}
