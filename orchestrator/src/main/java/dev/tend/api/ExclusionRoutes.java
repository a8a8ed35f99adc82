package dev.tend.api;

import dev.tend.api.auth.Caller;
import dev.tend.api.auth.Role;
import dev.tend.api.view.ExclusionRequest;
import dev.tend.api.view.ExclusionView;
import dev.tend.engine.Input;
import dev.tend.shared.Id;
import dev.tend.shared.Target;
import dev.tend.shared.time.Durations;
import dev.tend.store.Store;
import io.javalin.http.Context;
import io.javalin.router.JavalinDefaultRouting;

import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.util.Objects;

/**
 * {@code GET /api/v1/exclusions} (lapsed ones too, marked inactive),
 * {@code POST /api/v1/exclusions} ({cluster, node?, reason, owner, until?}: 201),
 * {@code DELETE /api/v1/exclusions/{cluster}} and {@code .../{cluster}/{node}}.
 */
final class ExclusionRoutes {
    /** An exclusion shorter than this is a mistake, and a time this close could pass before the engine sees it. */
    static final Duration MIN_LENGTH = Duration.ofMinutes(1);

    private final Store store;
    private final Gateway gateway;
    private final Clock clock;

    ExclusionRoutes(Store store, Gateway gateway, Clock clock) {
        this.store = store;
        this.gateway = gateway;
        this.clock = clock;
    }

    void mount(JavalinDefaultRouting r) {
        r.get("/api/v1/exclusions", ctx -> {
            Instant now = clock.instant();
            ctx.json(store.read(rd -> rd.exclusions().stream().map(x -> Views.exclusion(x, now)).toList()));
        }, Role.VIEWER);
        r.post("/api/v1/exclusions", this::add, Role.OPERATOR);
        r.delete("/api/v1/exclusions/{cluster}", ctx -> remove(ctx, ctx.pathParam("cluster"), null), Role.OPERATOR);
        r.delete("/api/v1/exclusions/{cluster}/{node}", ctx -> remove(ctx, ctx.pathParam("cluster"), ctx.pathParam("node")),
                Role.OPERATOR);
    }

    private void add(Context ctx) {
        ExclusionRequest req = Requests.body(ctx, ExclusionRequest.class);
        Target target = target(req.cluster(), req.node());
        String reason = Requests.text(req.reason(), "reason", 1000);
        String owner = Requests.text(req.owner(), "owner", 200);
        Instant now = clock.instant();
        if (req.until() != null && req.until().isBefore(now.plus(MIN_LENGTH))) {
            throw Requests.invalid("until", "until must be at least " + MIN_LENGTH.toMinutes() + " minute from now ("
                    + now + "), got " + req.until());
        }
        if (req.until() != null && req.until().isAfter(now.plus(Durations.MAX))) {
            throw Requests.invalid("until", "until must be at most " + Durations.format(Durations.MAX) + " (ten years) from now ("
                    + now + "), got " + req.until() + "; leave it out for an exclusion that lasts until removed");
        }
        Caller caller = Requests.caller(ctx);
        // an unknown cluster or node is a mistake in the request (a typo, most often): 400, with the engine's suggestion
        CommandAnswers.requireDone(gateway.command(new Input.Exclude(target, reason, owner, req.until(), caller.name(),
                Requests.from(ctx))));
        ctx.status(201).json(find(target));
    }

    private void remove(Context ctx, String cluster, String node) {
        Target target = target(cluster, node);
        ExclusionView gone = find(target);
        Caller caller = Requests.caller(ctx);
        CommandAnswers.requireDone(gateway.command(new Input.Unexclude(target, caller.name(), Requests.from(ctx))));
        ctx.json(gone);
    }

    private ExclusionView find(Target t) {
        String node = t.node() == null ? null : t.node().value();
        Instant now = clock.instant();
        return store.read(rd -> rd.exclusions().stream()
                        .filter(x -> x.cluster().equals(t.cluster().value()) && Objects.equals(x.node(), node)).findFirst())
                .map(x -> Views.exclusion(x, now))
                .orElseThrow(() -> new NotFoundException(t + " is not excluded"));
    }

    private static Target target(String cluster, String node) {
        Id c = Requests.id(cluster, "cluster");
        return node == null || node.isEmpty() ? Target.cluster(c) : Target.node(c, Requests.id(node, "node"));
    }
}
