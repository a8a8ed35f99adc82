package dev.tend.api;

import dev.tend.api.auth.Caller;
import dev.tend.api.auth.FailedTokens;
import dev.tend.api.auth.ForbiddenException;
import dev.tend.api.auth.Role;
import dev.tend.api.auth.Tokens;
import dev.tend.api.auth.UnauthenticatedException;
import dev.tend.api.view.FleetHealth;
import dev.tend.metrics.TendMetrics;
import dev.tend.playbooks.PlaybookSet;
import dev.tend.store.Store;
import io.javalin.Javalin;
import io.javalin.http.Context;
import io.javalin.http.staticfiles.Location;
import io.javalin.json.JavalinJackson;
import io.javalin.security.RouteRole;

import java.io.PrintWriter;
import java.time.Clock;
import java.util.List;
import java.util.Objects;
import java.util.Set;
import java.util.function.Supplier;

/**
 * The HTTP API (JSON under {@code /api/v1/}), {@code /metrics}, and the web console's static
 * files from the classpath folder {@code /console} when the build has one, on one Javalin
 * server. A thin layer: each route validates its request, reads the store's projections (never
 * the engine, which belongs to the driver thread) or hands a command to the {@link Gateway},
 * and {@link ApiErrors} turns every failure into a status. Every route under {@code /api/v1/}
 * needs a bearer token with the route's {@link Role}.
 */
public final class ApiServer implements AutoCloseable {
    /** Largest request body accepted: a batch of transitions as JSON Lines. */
    public static final long MAX_BODY = 32L << 20;

    private final Javalin app;

    private ApiServer(Javalin app) {
        this.app = app;
    }

    /** The parts the routes use. */
    public record Parts(Store store, Gateway gateway, Tokens tokens, Supplier<FleetHealth> health, TendMetrics metrics,
                        Clock clock, PrintWriter log, PlaybookSet playbooks) {
        public Parts {
            Objects.requireNonNull(playbooks, "playbooks");
            Objects.requireNonNull(store, "store");
            Objects.requireNonNull(gateway, "gateway");
            Objects.requireNonNull(tokens, "tokens");
            Objects.requireNonNull(health, "health");
            Objects.requireNonNull(metrics, "metrics");
            Objects.requireNonNull(clock, "clock");
            Objects.requireNonNull(log, "log");
        }
    }

    /** Starts listening on {@code host:port} (port 0: any free port, see {@link #port()}), answering loopback names and {@code host}. */
    public static ApiServer start(String host, int port, Parts parts) {
        return start(host, port, List.of(), FailedTokens.LIMIT, parts);
    }

    /**
     * As above, also answering requests whose Host header names one of {@code allowHosts}, and
     * answering 429 to an address after {@code wrongTokens} wrong tokens in a minute.
     */
    public static ApiServer start(String host, int port, List<String> allowHosts, int wrongTokens, Parts parts) {
        return start(host, port, allowHosts, wrongTokens, null, parts);
    }

    /** As above, over TLS with {@code tls} when it is not null (HTTPS only; no plain listener then). */
    public static ApiServer start(String host, int port, List<String> allowHosts, int wrongTokens, ServerTls tls, Parts parts) {
        HostCheck hosts = new HostCheck(host, allowHosts);
        FailedTokens failed = FailedTokens.systemClock(wrongTokens);
        RunRoutes runs = new RunRoutes(parts.store(), parts.gateway());
        Javalin app = Javalin.create(cfg -> {
            cfg.showJavalinBanner = false;
            cfg.startupWatcherEnabled = false;
            cfg.http.maxRequestSize = MAX_BODY;
            cfg.jsonMapper(new JavalinJackson(ApiJson.MAPPER, false));
            if (tls != null) cfg.jetty.addConnector((server, http) -> TlsConnector.of(server, http, tls, host, port));
            if (ApiServer.class.getResource("/console/index.html") != null || ApiServer.class.getResource("/console") != null) {
                cfg.staticFiles.add(sf -> {
                    sf.hostedPath = "/";
                    sf.directory = "/console";
                    sf.location = Location.CLASSPATH;
                });
            }
            cfg.router.mount(r -> {
                r.before(ctx -> {
                    SecurityHeaders.add(ctx);
                    hosts.check(ctx);
                });
                r.beforeMatched(ctx -> authorize(ctx, parts.tokens(), failed));
                ApiErrors.install(r, parts.log());
                // first: Javalin looks a request's route up several times per request, trying the
                // routes of its method in the order mounted, a regex match each, and this is the
                // route a health pipeline calls for every transition (no other path overlaps it)
                new TransitionRoutes(parts.gateway(), parts.metrics(), parts.store(), parts.clock(), parts.playbooks().config()).mount(r);
                runs.mount(r);
                new ApprovalRoutes(parts.store(), parts.gateway(), runs).mount(r);
                new ExclusionRoutes(parts.store(), parts.gateway(), parts.clock()).mount(r);
                new BrakeRoutes(parts.store(), parts.gateway()).mount(r);
                new LedgerRoutes(parts.store()).mount(r);
                new PageRoutes(parts.store()).mount(r);
                new HandoverRoutes(parts.store(), parts.clock()).mount(r);
                new PlaybookRoutes(parts.playbooks()).mount(r);
                new VocabularyRoutes().mount(r);
                new HealthRoutes(parts.health(), parts.metrics()).mount(r);
            });
        });
        app.start(host, port);
        return new ApiServer(app);
    }

    private static void authorize(Context ctx, Tokens tokens, FailedTokens failed) {
        Set<RouteRole> roles = ctx.routeRoles();
        if (roles.isEmpty()) return; // console files and /metrics
        Role needed = (Role) roles.iterator().next();
        if (failed.anyFailed()) failed.check(ctx.ip());
        Caller caller;
        String token = bearer(ctx, tokens);
        caller = tokens.holderOf(token).orElse(null);
        if (caller == null) {
            failed.failed(ctx.ip());
            throw new UnauthenticatedException("the bearer token is not one this server accepts");
        }
        if (!caller.may(needed)) throw new ForbiddenException(needed, caller);
        ctx.attribute(Requests.CALLER, caller);
    }

    private static String bearer(Context ctx, Tokens tokens) {
        String h = ctx.header("Authorization");
        if (h == null || h.isBlank()) {
            throw new UnauthenticatedException(tokens.isEmpty()
                    ? "this server accepts no tokens yet; start it with --tokens FILE"
                    : "this needs a bearer token: send the header Authorization: Bearer <token>");
        }
        // the scheme is case-insensitive (RFC 7235 section 2.1)
        if (h.length() < 8 || !h.regionMatches(true, 0, "bearer ", 0, 7)) {
            throw new UnauthenticatedException("the Authorization header must be 'Bearer <token>'");
        }
        return h.substring(7).strip();
    }

    /** The port listened on. */
    public int port() {
        return app.port();
    }

    /** Stops listening; requests in progress are cut off. Idempotent. */
    @Override
    public void close() {
        app.stop();
    }
}
