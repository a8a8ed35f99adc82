// Runs: the active ones with their step progress, and the latest that ended.
import { api } from "./api.js";
import { el, replace, pill, table, time, empty, span, target, tone } from "./dom.js";

const DONE = new Set(["succeeded", "skipped"]);

/** The run's steps as the playbook plans them, each with its state so far (pending until it starts). */
function planned(run, playbooks) {
  const p = playbooks.find((x) => x.playbook === run.playbook && x.version === run.version);
  if (!p) return run.steps;
  const seen = new Map(run.steps.map((s) => [s.step, s]));
  const plan = p.steps.map((s) => seen.get(s.step) || { step: s.step, kind: s.kind, state: "pending", attempt: 0 });
  // on-failure steps appear once they run
  return plan.concat(run.steps.filter((s) => !p.steps.some((x) => x.step === s.step)));
}

function progress(run, playbooks) {
  const steps = planned(run, playbooks);
  const done = steps.filter((s) => DONE.has(s.state)).length;
  return el("div", { class: "progress" },
    el("ol", { class: "steps" }, steps.map((s) => el("li", {
      class: "step step-" + (s.state === "pending" ? "quiet" : tone(s.state)) + (s.step === run.current_step ? " step-current" : ""),
      title: s.step + ": " + s.state + (s.attempt > 1 ? " (attempt " + s.attempt + ")" : "") + (s.outcome ? " — " + s.outcome : ""),
      dataset: { step: s.step, state: s.state },
    }, el("span", { class: "step-name", text: s.step }), el("span", { class: "step-state", text: s.state })))),
    el("span", { class: "small muted", text: done + " of " + steps.length + " steps done" }));
}

function abortControl(ctx, run, after) {
  if (!ctx.can("operator")) return null;
  const button = el("button", {
    type: "button", class: "quiet-button", text: "Abort", dataset: { action: "abort", run: run.run },
    onclick: async () => {
      const answer = window.prompt("Abort " + run.run + " (" + run.playbook + " on " + target(run.cluster, run.node)
        + ")? Say why; the reason goes into the ledger.", "");
      if (answer === null) return;
      const reason = answer.trim();
      if (!reason) {
        ctx.notify("Not aborted: say why the run is aborted; the reason goes into the ledger.", "wait");
        return;
      }
      button.disabled = true;
      try {
        await api.abort(run.run, reason);
        ctx.notify("Aborted " + run.run + ".", "good");
      } catch (err) {
        ctx.notify(err.message, "bad");
      }
      await after();
    },
  });
  return button;
}

export default {
  id: "runs",
  title: "Runs",
  mount(root, ctx) {
    const active = el("div", { id: "active-runs", class: "runs" });
    const recent = el("section", { class: "card" });
    root.append(el("h2", { text: "Active" }), active, recent);
    let playbooks = null;

    const view = {
      async refresh() {
        const now = ctx.now();
        if (playbooks === null) playbooks = await api.playbooks();
        const runs = await api.runs({ active: true, limit: 200 });
        replace(active, runs.length === 0 ? empty("No run is active.") : runs.map((r) =>
          el("article", { class: "card run", dataset: { run: r.run, state: r.state } },
            el("div", { class: "card-head" },
              el("h3", {}, el("code", { text: target(r.cluster, r.node) }), " ",
                el("span", { class: "muted", text: r.playbook + " v" + r.version })),
              el("span", {}, r.shadow ? pill("shadow") : null, " ", pill(r.state, "run-state"))),
            el("p", { class: "small muted" }, el("code", { text: r.run }), " · created ", time(r.created_at, now),
              r.started_at ? [" · running for ", span(Date.parse(now) - Date.parse(r.started_at))] : null),
            r.state === "awaiting-approval" ? el("p", { class: "small", text: "Waits for an approval before its first step." }) : null,
            r.state === "paused" ? el("p", { class: "small paused-by", text: "Paused by the fleet brake at a step boundary;"
              + " it goes on with its next step once the brake is released." }) : null,
            progress(r, playbooks),
            abortControl(ctx, r, () => view.refresh()))));

        const all = await api.runs({ limit: 30 });
        const ended = all.filter((r) => r.ended_at);
        replace(recent, el("h2", { text: "Ended lately" }),
          ended.length === 0 ? empty("No run has ended yet.")
            : table(["target", "playbook", "state", "ended", "took", "outcome", "run"], ended.map((r) =>
              el("tr", { dataset: { run: r.run, state: r.state } },
                el("td", {}, el("code", { text: target(r.cluster, r.node) })),
                el("td", { text: r.playbook }),
                el("td", {}, pill(r.state, "run-state")),
                el("td", {}, time(r.ended_at, now)),
                el("td", { text: r.started_at ? span(Date.parse(r.ended_at) - Date.parse(r.started_at)) : "—" }),
                el("td", { class: "small", text: r.outcome || "" }),
                el("td", {}, el("code", { class: "small", text: r.run }))))));
      },
    };
    return view;
  },
};
