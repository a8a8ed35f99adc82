package dev.tend.api;

import com.fasterxml.jackson.core.JsonParser;
import com.fasterxml.jackson.databind.JsonNode;
import dev.tend.api.auth.Caller;
import dev.tend.api.auth.Role;
import dev.tend.api.view.LineProblem;
import dev.tend.api.view.TransitionsOutcome;
import dev.tend.engine.Input;
import dev.tend.engine.LedgerKind;
import dev.tend.metrics.TendMetrics;
import dev.tend.playbooks.TendConfig;
import dev.tend.shared.HealthTransition;
import dev.tend.shared.TopologyEvent;
import dev.tend.shared.wire.LineResult;
import dev.tend.shared.wire.ReadSummary;
import dev.tend.shared.wire.TimeRefusal;
import dev.tend.shared.wire.WireReader;
import dev.tend.store.LedgerDraft;
import dev.tend.store.Store;
import io.javalin.http.ContentType;
import io.javalin.http.Context;
import io.javalin.router.JavalinDefaultRouting;
import jakarta.servlet.http.HttpServletResponse;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.StringReader;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.time.Clock;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.concurrent.CompletableFuture;

/**
 * {@code POST /api/v1/transitions}: wire format v1, one JSON object (compact or pretty) or JSON
 * Lines. Good lines are applied in order and committed before the answer; bad lines are
 * answered with their line numbers and messages. The status says which happened:
 * 200 every line applied, 207 some applied and some refused, 400 none applied
 * (every line refused, or no event in the body). Each request that carried a line is counted in
 * a {@code transitions-received} ledger entry: the token's name, the client address and the
 * counts, one entry for a caller's requests within about a second.
 */
final class TransitionRoutes {
    /** Problems listed in one answer; the count of rejected lines is always complete. */
    static final int MAX_PROBLEMS = 1000;

    private final Gateway gateway;
    private final TendMetrics metrics;
    private final Store store;
    private final Clock clock;
    private final TendConfig config;
    /** The reader with the declared signals, built once; each request reads with a copy of its own (it counts refusals). */
    private final WireReader declared;

    TransitionRoutes(Gateway gateway, TendMetrics metrics, Store store, Clock clock, TendConfig config) {
        this.gateway = gateway;
        this.metrics = metrics;
        this.store = store;
        this.clock = clock;
        this.config = config;
        this.declared = WireReader.of("request").withSignals(config.signals());
    }

    void mount(JavalinDefaultRouting r) {
        r.post("/api/v1/transitions", this::post, Role.OPERATOR);
    }

    private void post(Context ctx) {
        String body = singleObjectOnOneLine(Requests.bodyText(ctx));
        List<Input> events = new ArrayList<>();
        List<LineProblem> problems = new ArrayList<>();
        WireReader wire = declared.withLiveClock(clock::instant, config.maxSkew());
        // a buffer the size of the body (the reader's default of 64 K chars would be allocated per request)
        ReadSummary summary = wire.readAll(new BufferedReader(new StringReader(body), Math.max(16, Math.min(body.length(), 1 << 16))), r -> {
            if (r instanceof LineResult.Event e) {
                events.add(e.event() instanceof HealthTransition t ? new Input.Transition(t)
                        : new Input.Topology((TopologyEvent) e.event()));
            } else if (r instanceof LineResult.Bad b && problems.size() < MAX_PROBLEMS) {
                problems.add(new LineProblem(b.problem().line(), b.problem().column(), b.problem().field(), b.problem().message()));
            }
        });
        if (events.isEmpty() && summary.bad() == 0) {
            answer(ctx, 0, 0, problems, Map.of());
            return;
        }
        // who fed the engine, from where: one entry per request, not per line (and per commit for a caller's requests)
        Caller caller = Requests.caller(ctx);
        Map<String, Object> fields = new LinkedHashMap<>();
        fields.put("by", caller.name());
        fields.put("from", Requests.from(ctx));
        fields.put("accepted", events.size());
        fields.put("rejected", summary.bad());
        fields.put("requests", 1); // a caller's requests within about a second are one entry (ReceiptCloser)
        LedgerDraft receipt = new LedgerDraft(clock.instant(), LedgerKind.TRANSITIONS_RECEIVED.wire(),
                LedgerKind.TRANSITIONS_RECEIVED.check(fields));
        Map<TimeRefusal, Long> timeRefused = summary.bad() > 0 ? wire.timeRefusals() : Map.of();
        if (events.isEmpty()) {
            // every line was refused: the receipt alone, in a commit of its own
            store.useTransaction(tx -> tx.appendLedger(List.of(receipt)));
            answer(ctx, 0, summary.bad(), problems, timeRefused);
            return;
        }
        // committed with the events it names (no commit of its own); the answer is written once
        // they are, on the thread that learns it, while this one goes back to serving others
        CompletableFuture<Void> committed = gateway.eventsLater(events, receipt);
        int accepted = events.size();
        ctx.future(() -> committed.thenRun(() -> answer(ctx, accepted, summary.bad(), problems, timeRefused)));
    }

    /** Counts the request and writes its answer: {@code accepted} events are committed, {@code rejected} lines refused. */
    private void answer(Context ctx, int accepted, long rejected, List<LineProblem> problems, Map<TimeRefusal, Long> timeRefused) {
        metrics.transitionsReceived(accepted);
        if (rejected > 0) {
            metrics.linesRejected(rejected);
            metrics.timeRefused(timeRefused); // a line refused for its time is a bad line
        }
        int status = accepted == 0 ? 400 : rejected > 0 ? 207 : 200;
        if (accepted == 0 && problems.isEmpty()) {
            problems.add(new LineProblem(0, 0, "", "the body holds no transition or topology event"));
        }
        if (problems.isEmpty()) {
            // the common answer, written without a serializer (the same text: TransitionsAnswerTest)
            // straight to the response: a result set on the context is copied through a new
            // 8 KB buffer and a compressing stream (it is never compressed: far under the threshold)
            byte[] answer = answerWithoutProblems(accepted, rejected).getBytes(StandardCharsets.US_ASCII);
            HttpServletResponse res = ctx.res();
            res.setStatus(status);
            res.setContentType(ContentType.JSON);
            res.setContentLength(answer.length);
            try {
                res.getOutputStream().write(answer);
            } catch (IOException e) {
                throw new UncheckedIOException("the answer could not be written; the events are committed", e);
            }
        } else {
            ctx.status(status).json(new TransitionsOutcome(accepted, rejected, problems));
        }
    }

    /** The JSON of a {@link TransitionsOutcome} with no problems, as the API's mapper writes it. */
    static String answerWithoutProblems(long accepted, long rejected) {
        return "{\"accepted\":" + accepted + ",\"rejected\":" + rejected + ",\"problems\":[]}";
    }

    /**
     * A body that is one pretty-printed JSON object becomes that object on one line, so that
     * it reads as one line of wire format; anything else is left as it is.
     */
    private static String singleObjectOnOneLine(String body) {
        String trimmed = body.strip();
        if (!trimmed.startsWith("{") || trimmed.indexOf('\n') < 0) return body;
        try (JsonParser p = ApiJson.MAPPER.createParser(trimmed)) {
            JsonNode n = ApiJson.MAPPER.readTree(p);
            if (n == null || !n.isObject() || p.nextToken() != null) return body;
            return ApiJson.MAPPER.writeValueAsString(n);
        } catch (IOException notOneObject) {
            return body; // JSON Lines, or broken: the wire reader reports each line
        }
    }
}
