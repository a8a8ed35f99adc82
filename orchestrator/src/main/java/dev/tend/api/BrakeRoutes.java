package dev.tend.api;

import dev.tend.api.auth.Caller;
import dev.tend.api.auth.Role;
import dev.tend.api.view.ReasonRequest;
import dev.tend.engine.Effect;
import dev.tend.engine.Input;
import dev.tend.store.Store;
import io.javalin.http.Context;
import io.javalin.router.JavalinDefaultRouting;

import java.util.List;

/**
 * {@code GET /api/v1/brake}, {@code POST /api/v1/brake/engage} and {@code POST /api/v1/brake/release},
 * each of the two with {"reason": required}. Releasing a brake that is not engaged is refused (409).
 */
final class BrakeRoutes {
    private final Store store;
    private final Gateway gateway;

    BrakeRoutes(Store store, Gateway gateway) {
        this.store = store;
        this.gateway = gateway;
    }

    void mount(JavalinDefaultRouting r) {
        r.get("/api/v1/brake", ctx -> ctx.json(Views.brake(store.read(rd -> rd.state("brake")))), Role.VIEWER);
        r.post("/api/v1/brake/engage", ctx -> change(ctx, true), Role.OPERATOR);
        r.post("/api/v1/brake/release", ctx -> change(ctx, false), Role.OPERATOR);
    }

    private void change(Context ctx, boolean engage) {
        String reason = Requests.text(Requests.body(ctx, ReasonRequest.class).reason(), "reason", 1000);
        Caller caller = Requests.caller(ctx);
        String from = Requests.from(ctx);
        List<Effect> fx = gateway.command(engage ? new Input.EngageBrake(reason, caller.name(), from)
                : new Input.ReleaseBrake(reason, caller.name(), from));
        CommandAnswers.requireDone(fx);
        ctx.json(Views.brake(store.read(rd -> rd.state("brake"))));
    }
}
