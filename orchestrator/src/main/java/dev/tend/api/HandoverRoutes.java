package dev.tend.api;

import dev.tend.api.auth.Role;
import dev.tend.api.view.HandoverView;
import dev.tend.handover.HandoverHtml;
import dev.tend.handover.HandoverReport;
import dev.tend.handover.ReportPeriod;
import dev.tend.store.Store;
import io.javalin.http.Context;
import io.javalin.router.JavalinDefaultRouting;

import java.time.Clock;
import java.time.Instant;

/**
 * {@code GET /api/v1/handover?since=T[&until=T][&format=json|html]}: the handover report of
 * {@code [since, until)} (until defaults to now), computed from the ledger, as JSON
 * ({@link HandoverView}, the default) or as the self-contained HTML page of {@code tend handover}.
 */
final class HandoverRoutes {
    private final Store store;
    private final Clock clock;

    HandoverRoutes(Store store, Clock clock) {
        this.store = store;
        this.clock = clock;
    }

    void mount(JavalinDefaultRouting r) {
        r.get("/api/v1/handover", this::report, Role.VIEWER);
    }

    private void report(Context ctx) {
        String format = ctx.queryParam("format");
        if (format == null || format.isEmpty()) format = "json";
        if (!format.equals("json") && !format.equals("html")) {
            throw Requests.invalid("format", "format must be json or html, got '" + format + "'");
        }
        Instant since = Requests.time(ctx, "since");
        if (since == null) throw Requests.invalid("since", "since is required: an RFC 3339 time like 2027-03-14T22:00:00Z");
        Instant until = Requests.time(ctx, "until");
        if (until == null) until = clock.instant();
        if (!until.isAfter(since)) throw Requests.invalid("until", "until (" + until + ") must be after since (" + since + ")");
        ReportPeriod period = ReportPeriod.of(since, until);
        HandoverReport report = store.read(rd -> HandoverReport.from(rd, period));
        if (format.equals("html")) {
            ctx.contentType("text/html; charset=utf-8").result(HandoverHtml.render(report));
        } else {
            ctx.json(HandoverView.of(report));
        }
    }
}
