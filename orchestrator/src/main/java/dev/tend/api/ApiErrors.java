package dev.tend.api;

import dev.tend.api.auth.ForbiddenException;
import dev.tend.api.auth.TooManyFailuresException;
import dev.tend.api.auth.UnauthenticatedException;
import dev.tend.api.view.ErrorBody;
import dev.tend.api.view.LineProblem;
import dev.tend.shared.InvalidInputException;
import dev.tend.shared.Problem;
import dev.tend.store.StoreException;
import io.javalin.router.JavalinDefaultRouting;
import io.javalin.http.Context;
import io.javalin.http.HttpResponseException;

import java.io.PrintWriter;
import java.util.List;

/**
 * The one place where failures become HTTP answers: every error is a JSON {@link ErrorBody}.
 * <pre>
 * UnauthenticatedException   401 unauthenticated (with WWW-Authenticate: Bearer)
 * ForbiddenException         403 forbidden, naming the role needed
 * NotFoundException          404 not-found
 * InvalidInputException,
 * IllegalArgumentException   400 invalid-input, each problem listed
 * RefusedException           409 refused, with the engine's reason
 * TooManyFailuresException   429 too-many-attempts (with Retry-After), after repeated wrong tokens
 * a Host not served          421 misdirected
 * NotLeaderException         503 not-leader (with X-Tend-Leader: the leader's URL), a write sent to a standby
 * DriverUnavailableException,
 * StoreException             503 unavailable
 * Javalin's own (no route, wrong method), body too large (413 too-large): their status
 * anything else              500 failed (and the stack trace to the server's log)
 * </pre>
 */
final class ApiErrors {
    private ApiErrors() {
    }

    static void install(JavalinDefaultRouting app, PrintWriter log) {
        app.exception(UnauthenticatedException.class, (e, ctx) -> {
            ctx.header("WWW-Authenticate", "Bearer realm=\"tend\"");
            answer(ctx, 401, ErrorBody.of("unauthenticated", e.getMessage()));
        });
        app.exception(ForbiddenException.class, (e, ctx) ->
                answer(ctx, 403, new ErrorBody("forbidden", e.getMessage(), e.needed().wireName(), null)));
        app.exception(TooManyFailuresException.class, (e, ctx) -> {
            ctx.header("Retry-After", String.valueOf(e.retryAfterSeconds()));
            answer(ctx, 429, ErrorBody.of("too-many-attempts", e.getMessage()));
        });
        app.exception(NotFoundException.class, (e, ctx) -> answer(ctx, 404, ErrorBody.of("not-found", e.getMessage())));
        app.exception(InvalidInputException.class, (e, ctx) -> answer(ctx, 400, new ErrorBody("invalid-input",
                e.problems().size() == 1 ? e.problems().get(0).message() : e.problems().size() + " problems in the request",
                null, problems(e.problems()))));
        app.exception(IllegalArgumentException.class, (e, ctx) -> answer(ctx, 400, ErrorBody.of("invalid-input", e.getMessage())));
        app.exception(RefusedException.class, (e, ctx) -> answer(ctx, 409, ErrorBody.of("refused", e.getMessage())));
        app.exception(NotLeaderException.class, (e, ctx) -> {
            if (e.leaderUrl() != null) ctx.header(NotLeaderException.HEADER, e.leaderUrl());
            answer(ctx, 503, ErrorBody.of("not-leader", e.getMessage()));
        });
        app.exception(DriverUnavailableException.class, (e, ctx) -> answer(ctx, 503, ErrorBody.of("unavailable", e.getMessage())));
        app.exception(StoreException.class, (e, ctx) -> answer(ctx, 503, ErrorBody.of("unavailable", e.getMessage())));
        app.exception(HttpResponseException.class, (e, ctx) -> answer(ctx, e.getStatus(),
                ErrorBody.of(e.getStatus() == 404 ? "not-found" : e.getStatus() == 413 ? "too-large" : e.getStatus() == 421 ? "misdirected"
                        : e.getStatus() >= 500 ? "failed" : "invalid-input", e.getMessage())));
        app.exception(Exception.class, (e, ctx) -> {
            synchronized (log) {
                log.println("tend: " + ctx.method() + " " + ctx.path() + " failed:");
                e.printStackTrace(log);
                log.flush();
            }
            answer(ctx, 500, ErrorBody.of("failed", "the server failed on this request; the details are in its log"));
        });
    }

    static List<LineProblem> problems(List<Problem> problems) {
        return problems.stream().map(p -> new LineProblem(p.line(), p.column(), p.field(), p.message())).toList();
    }

    private static void answer(Context ctx, int status, ErrorBody body) {
        ctx.status(status).json(body);
    }
}
