package dev.tend.api;

import dev.tend.api.auth.Caller;
import dev.tend.api.auth.Role;
import dev.tend.api.view.ReasonRequest;
import dev.tend.api.view.RunView;
import dev.tend.engine.Input;
import dev.tend.store.RunFilter;
import dev.tend.store.RunRow;
import dev.tend.store.Store;
import io.javalin.http.Context;
import io.javalin.router.JavalinDefaultRouting;

import java.util.ArrayList;
import java.util.List;

/**
 * {@code GET /api/v1/runs} (active, cluster, playbook, since, limit), {@code GET /api/v1/runs/{id}},
 * {@code POST /api/v1/runs/{id}/abort} ({"reason": optional}).
 */
final class RunRoutes {
    private final Store store;
    private final Gateway gateway;

    RunRoutes(Store store, Gateway gateway) {
        this.store = store;
        this.gateway = gateway;
    }

    void mount(JavalinDefaultRouting r) {
        r.get("/api/v1/runs", this::list, Role.VIEWER);
        r.get("/api/v1/runs/{id}", ctx -> ctx.json(run(ctx.pathParam("id"))), Role.VIEWER);
        r.post("/api/v1/runs/{id}/abort", this::abort, Role.OPERATOR);
    }

    private void list(Context ctx) {
        RunFilter f = RunFilter.all().withActiveOnly(Requests.flag(ctx, "active"))
                .withCluster(Requests.idParam(ctx, "cluster")).withPlaybook(Requests.idParam(ctx, "playbook"))
                .withSince(Requests.time(ctx, "since")).withLimit(Requests.limit(ctx, 100, 1000));
        ctx.json(store.read(rd -> {
            List<RunView> out = new ArrayList<>();
            for (RunRow row : rd.runs(f)) out.add(Views.run(row, rd.steps(row.runId())));
            return out;
        }));
    }

    RunView run(String id) {
        Requests.id(id, "run");
        return store.read(rd -> rd.run(id).map(row -> Views.run(row, rd.steps(id))))
                .orElseThrow(() -> new NotFoundException("no run " + id));
    }

    private void abort(Context ctx) {
        String id = ctx.pathParam("id");
        // what the store already shows is answered without troubling the engine (nor its ledger)
        RunView before = run(id);
        if (before.endedAt() != null) throw new RefusedException("run " + id + " already ended: " + before.state());
        String reason = Requests.optionalText(Requests.body(ctx, ReasonRequest.class).reason(), "reason", 1000);
        Caller caller = Requests.caller(ctx);
        CommandAnswers.requireDone(gateway.command(new Input.AbortRun(id, reason, caller.name(), Requests.from(ctx))));
        ctx.json(run(id));
    }
}
