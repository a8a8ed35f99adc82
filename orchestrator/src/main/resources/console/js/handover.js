// The handover report: what automation did in a period, computed by the server from the ledger.
import { api } from "./api.js";
import { el, replace, pill, stat, table, time, empty, target } from "./dom.js";

const PERIODS = [["last hour", 60], ["last 8 hours", 480], ["last 12 hours", 720], ["last 24 hours", 1440]];

function counts(c) {
  return [c.started, c.succeeded, c.failed, c.cancelled, c.shadowed, c.stood_down, c.held, c.denied].map((n) => el("td", { class: "num", text: n }));
}

function timeline(r) {
  const from = Date.parse(r.since);
  const to = Date.parse(r.until);
  const width = Math.max(1, to - from);
  const pos = (iso) => Math.min(100, Math.max(0, ((iso ? Date.parse(iso) : to) - from) * 100 / width));
  const bar = (start, end, cls, title) => {
    const left = pos(start);
    return el("span", { class: "bar " + cls, title, style: "left:" + left + "%;width:" + Math.max(0.6, pos(end) - left) + "%" });
  };
  const rows = r.runs.slice(-40).map((run) => el("div", { class: "lane" },
    el("span", { class: "lane-label", text: target(run.cluster, run.node) }),
    el("span", { class: "lane-track" },
      bar(run.created_at, run.ended_at, "bar-" + run.state, run.playbook + ": " + run.state + (run.note ? " — " + run.note : "")))));
  const brakes = r.brake_periods.map((b) => bar(b.engaged_at, b.released_at, "bar-brake", "brake engaged by " + b.engaged_by));
  return el("div", { class: "chart" },
    brakes.length ? el("div", { class: "lane" }, el("span", { class: "lane-label", text: "fleet brake" }),
      el("span", { class: "lane-track" }, brakes)) : null,
    rows.length ? rows : empty("No run in the period."),
    el("div", { class: "lane axis" }, el("span", { class: "lane-label" }),
      el("span", { class: "lane-track" }, el("span", { class: "tick-left", text: r.since.slice(11, 16) }),
        el("span", { class: "tick-right", text: r.until.slice(11, 16) }))));
}

function render(r, now) {
  const t = r.totals;
  const pb = Object.entries(r.by_playbook);
  const remediated = Object.entries(r.nodes_remediated).flatMap(([p, runs]) => runs.map((x) => [p, x]));
  return [
    el("p", { class: r.needs_attention ? "banner banner-bad" : "banner banner-good",
      text: r.needs_attention ? "Something waits for a person: see the pending approvals, runs, loops or the brake below."
        : "Nothing waits for a person." }),
    el("div", { class: "stats" },
      stat("started", t.started), stat("succeeded", t.succeeded, "good"), stat("failed", t.failed, t.failed ? "bad" : null),
      stat("cancelled", t.cancelled), stat("stood down", t.stood_down, t.stood_down ? "wait" : null), stat("held", t.held, t.held ? "wait" : null), stat("denied", t.denied),
      stat("approvals asked", r.approvals_requested), stat("pending", r.pending_approvals.length, r.pending_approvals.length ? "wait" : null),
      stat("lapsed", r.lapsed_approvals.length, r.lapsed_approvals.length ? "bad" : null)),
    el("section", { class: "card" }, el("h2", { text: "Timeline" }), timeline(r)),
    el("section", { class: "card" }, el("h2", { text: "By playbook" }), pb.length === 0 ? empty("No playbook did anything.")
        : table(["playbook", "started", "succeeded", "failed", "cancelled", "shadowed", "stood down", "held", "denied"],
          pb.map(([name, c]) => el("tr", {}, el("td", { text: name }), counts(c))))),
    el("section", { class: "card" }, el("h2", { text: "Held and denied by reason" }), r.by_reason.length === 0 ? empty("No guard held or denied.")
      : table(["reason code", "held", "denied"], r.by_reason.map((x) => el("tr", {},
        el("td", {}, el("code", { text: x.code })), el("td", { class: "num", text: x.held }), el("td", { class: "num", text: x.denied }))))),
    el("section", { class: "card" }, el("h2", { text: "Nodes remediated" }), remediated.length === 0 ? empty("None.")
      : table(["target", "playbook", "ended", "actions"], remediated.map(([p, x]) => el("tr", {},
        el("td", {}, el("code", { text: target(x.cluster, x.node) })), el("td", { text: p }), el("td", {}, time(x.ended_at, now)),
        el("td", { class: "small", text: x.actions.join(", ") }))))),
    el("section", { class: "card" }, el("h2", { text: "Approvals pending or lapsed" }),
      r.pending_approvals.length + r.lapsed_approvals.length === 0 ? empty("None.")
        : table(["target", "playbook", "state", "asked", "lapses"], r.pending_approvals.concat(r.lapsed_approvals).map((a) =>
          el("tr", {}, el("td", {}, el("code", { text: target(a.cluster, a.node) })), el("td", { text: a.playbook }),
            el("td", {}, pill(a.state)), el("td", {}, time(a.requested_at, now)), el("td", {}, time(a.expires_at, now)))))),
    el("section", { class: "card" }, el("h2", { text: "Waiting for a person" }),
      r.runs_needing_person.length + r.loops_stopped.length === 0 ? empty("No run and no loop stop.")
        : el("ul", { class: "plain" },
          r.runs_needing_person.map((x) => el("li", {}, pill("needs-human"), " ", el("code", { text: target(x.cluster, x.node) }),
            " ", x.playbook, x.note ? " — " + x.note : "")),
          r.loops_stopped.map((x) => el("li", {}, pill("loop"), " ", el("code", { text: target(x.cluster, x.node) }),
            " ", x.playbook, " stopped ", time(x.stopped_at, now))))),
    el("section", { class: "card" }, el("h2", { text: "Fleet brake" }), r.brake_periods.length === 0 ? empty("Not engaged in the period.")
      : table(["engaged", "by", "reason", "released", "by"], r.brake_periods.map((b) => el("tr", {},
        el("td", {}, time(b.engaged_at, now)), el("td", { text: b.engaged_by }), el("td", { text: b.reason || "" }),
        el("td", {}, b.released_at ? time(b.released_at, now) : pill("engaged")), el("td", { text: b.released_by || "" }))))),
    el("section", { class: "card", id: "ledger-status" }, el("h2", { text: "Ledger" }),
      el("p", {}, pill(r.ledger.verified ? "verified" : "broken"), " ", r.ledger.verify_message),
      el("p", { class: "small muted" }, r.ledger.entries + " entries, " + r.ledger.entries_in_period + " in the period; head ",
        el("code", { text: r.ledger.head_hash }))),
  ];
}

export default {
  id: "handover",
  title: "Handover",
  mount(root, ctx) {
    const period = el("select", { id: "handover-period" }, PERIODS.map(([label, min]) => el("option", { value: String(min), text: label })),
      el("option", { value: "custom", text: "from … to …" }));
    period.value = "720";
    const since = el("input", { id: "handover-since", type: "text", placeholder: "since, RFC 3339", hidden: true });
    const until = el("input", { id: "handover-until", type: "text", placeholder: "until (default now)", hidden: true });
    period.addEventListener("change", () => { since.hidden = until.hidden = period.value !== "custom"; });
    const printable = el("button", { type: "button", class: "quiet-button", text: "Open the printable page",
      onclick: async () => {
        try {
          const html = await api.handoverHtml(params());
          window.open(URL.createObjectURL(new Blob([html], { type: "text/html" })), "_blank");
        } catch (err) {
          ctx.notify(err.message, "bad");
        }
      } });
    const body = el("div", { id: "handover-report" });
    const form = el("form", { class: "filters card", onsubmit: (e) => { e.preventDefault(); load(); } },
      el("label", {}, "period", period, since, until), el("button", { type: "submit", class: "primary", text: "Show" }), printable);
    root.append(form, body);
    let loaded = false;

    function params() {
      if (period.value === "custom") return { since: since.value.trim(), until: until.value.trim() };
      const now = ctx.now();
      return { since: new Date(Date.parse(now) - Number(period.value) * 60000).toISOString(), until: now };
    }

    async function load() {
      try {
        const r = await api.handover(params());
        replace(body, render(r, ctx.now()));
      } catch (err) {
        ctx.notify(err.message, "bad");
      }
    }

    return {
      // the report verifies the whole ledger: computed when asked, not on every refresh
      async refresh() {
        if (loaded) return;
        loaded = true;
        await load();
      },
    };
  },
};
