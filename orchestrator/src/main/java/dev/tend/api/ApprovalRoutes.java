package dev.tend.api;

import dev.tend.shared.ApprovalState;
import dev.tend.api.auth.Caller;
import dev.tend.api.auth.Role;
import dev.tend.api.view.ApprovalOutcome;
import dev.tend.api.view.ApprovalView;
import dev.tend.api.view.ReasonRequest;
import dev.tend.engine.Effect;
import dev.tend.engine.Input;
import dev.tend.engine.LedgerKind;
import dev.tend.store.ApprovalRow;
import dev.tend.store.Store;
import io.javalin.http.Context;
import io.javalin.router.JavalinDefaultRouting;

import java.util.List;

/**
 * {@code GET /api/v1/approvals} (state: pending by default, or approved, rejected, lapsed,
 * withdrawn, all), {@code POST /api/v1/approvals/{run}/approve},
 * {@code POST /api/v1/approvals/{run}/reject} ({"reason": required}).
 * The engine decides: it refuses (409, with its reason) an approval by whoever requested the
 * run or one no longer pending, and checks every guard again when the approval arrives.
 */
final class ApprovalRoutes {
    private final Store store;
    private final Gateway gateway;
    private final RunRoutes runs;

    ApprovalRoutes(Store store, Gateway gateway, RunRoutes runs) {
        this.store = store;
        this.gateway = gateway;
        this.runs = runs;
    }

    void mount(JavalinDefaultRouting r) {
        r.get("/api/v1/approvals", this::list, Role.VIEWER);
        r.post("/api/v1/approvals/{run}/approve", ctx -> decide(ctx, true), Role.APPROVER);
        r.post("/api/v1/approvals/{run}/reject", ctx -> decide(ctx, false), Role.APPROVER);
    }

    private void list(Context ctx) {
        String state = ctx.queryParam("state");
        if (state == null || state.isEmpty()) state = ApprovalState.PENDING.wireName();
        if (!state.equals("all") && ApprovalState.of(state).isEmpty()) {
            throw Requests.invalid("state", "state must be pending, approved, rejected, lapsed, withdrawn or all, got '" + state + "'");
        }
        ApprovalState s = state.equals("all") ? null : ApprovalState.of(state).orElseThrow();
        ctx.json(store.read(rd -> rd.approvals(s).stream().map(Views::approval).toList()));
    }

    private void decide(Context ctx, boolean approve) {
        String run = Requests.id(ctx.pathParam("run"), "run").value();
        approval(run); // a run never asked about is answered from the store, without troubling the engine (nor its ledger)
        Caller caller = Requests.caller(ctx);
        Input.Command cmd = approve ? new Input.Approve(run, caller.name(), Requests.from(ctx))
                : new Input.Reject(run, Requests.text(Requests.body(ctx, ReasonRequest.class).reason(), "reason", 1000),
                caller.name(), Requests.from(ctx));
        List<Effect> fx = gateway.command(cmd);
        CommandAnswers.requireDone(fx);
        String verdict = null;
        List<String> reasons = List.of();
        for (Effect e : fx) {
            // the guards checked again when the approval arrived: their verdict on this run
            if (e instanceof Effect.Ledger l && l.type() == LedgerKind.VERDICT && run.equals(l.fields().get("run"))) {
                verdict = String.valueOf(l.fields().get("verdict"));
                reasons = strings(l.fields().get("reasons"));
            }
        }
        ctx.json(new ApprovalOutcome(approval(run), runs.run(run), verdict, reasons));
    }

    private ApprovalView approval(String run) {
        return store.read(rd -> rd.approvals(null).stream().filter(a -> a.runId().equals(run)).findFirst())
                .map(Views::approval)
                .orElseThrow(() -> new NotFoundException("no approval was requested for run " + run));
    }

    private static List<String> strings(Object o) {
        return o instanceof List<?> l ? l.stream().map(String::valueOf).toList() : List.of();
    }
}
