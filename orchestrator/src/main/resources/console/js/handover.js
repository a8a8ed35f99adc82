// The handover report: what automation did in a period, computed by the server from the ledger.
import { api } from "./api.js";
import { el, replace, pill, stat, table, time, empty, target } from "./dom.js";

const PERIODS = [["last hour", 60], ["last 8 hours", 480], ["last 12 hours", 720], ["last 24 hours", 1440]];

function counts(c) {
  return [c.started, c.succeeded, c.failed, c.cancelled, c.shadowed, c.stood_down, c.held, c.denied].map((n) => el("td", { class: "num", text: n }));
}

const SPANS = [["where activity is", "activity"], ["the whole period", "period"]];
const MIN_WINDOW_MS = 10 * 60000;

/**
 * The span the timeline's axis covers: the whole period, or (the default) from a little before
 * the first run or brake period to a little after the last, at least ten minutes, within the period.
 */
export function windowOf(r, choice) {
  const from = Date.parse(r.since);
  const to = Date.parse(r.until);
  if (choice === "period") return [from, to];
  const clamp = (t) => Math.min(to, Math.max(from, t));
  const spans = r.runs.map((x) => [clamp(Date.parse(x.created_at)), x.ended_at ? clamp(Date.parse(x.ended_at)) : to])
    .concat(r.brake_periods.map((b) => [clamp(Date.parse(b.engaged_at)), b.released_at ? clamp(Date.parse(b.released_at)) : to]));
  if (spans.length === 0) return [from, to];
  let first = Math.min(...spans.map((x) => x[0]));
  let last = Math.max(...spans.map((x) => x[1]));
  const pad = Math.max(60000, (last - first) / 20);
  first -= pad;
  last += pad;
  const grow = MIN_WINDOW_MS - (last - first);
  if (grow > 0) {
    first -= grow / 2;
    last += grow / 2;
  }
  return [Math.max(from, first), Math.min(to, last)];
}

const hhmm = (ms) => new Date(ms).toISOString().slice(11, 16);

function timeline(r, choice) {
  const [from, to] = windowOf(r, choice);
  const width = Math.max(1, to - from);
  const pos = (iso) => Math.min(100, Math.max(0, ((iso ? Date.parse(iso) : to) - from) * 100 / width));
  // every bar at least 6 px wide (a run of seconds stays visible), its details on hover
  const bar = (start, end, cls, title, data) => {
    const left = Math.min(pos(start), 99);
    return el("span", { class: "bar " + cls, title, dataset: data,
      style: "left:" + left + "%;width:" + (pos(end) - left) + "%;min-width:6px" });
  };
  const rows = r.runs.slice(-40).map((run) => {
    const label = target(run.cluster, run.node);
    return el("div", { class: "lane" },
      el("span", { class: "lane-label", text: label, title: label }),
      el("span", { class: "lane-track" },
        bar(run.created_at, run.ended_at, "bar-" + run.state, run.run + " " + run.playbook + " on " + label + ": " + run.state
          + ", " + run.created_at.slice(11, 19) + (run.ended_at ? " to " + run.ended_at.slice(11, 19) : " on")
          + (run.note ? " — " + run.note : ""), { run: run.run })));
  });
  const brakes = r.brake_periods.map((b) => bar(b.engaged_at, b.released_at, "bar-brake",
    "fleet brake engaged by " + b.engaged_by + (b.reason ? ": " + b.reason : "")));
  const ticks = [0, 0.25, 0.5, 0.75, 1].map((f) => el("span", { class: "tick", style: "left:" + (f * 100) + "%",
    text: hhmm(from + f * width) }));
  return el("div", { class: "chart", id: "handover-timeline", dataset: { from: new Date(from).toISOString(), to: new Date(to).toISOString() } },
    brakes.length ? el("div", { class: "lane" }, el("span", { class: "lane-label", text: "fleet brake" }),
      el("span", { class: "lane-track" }, brakes)) : null,
    rows.length ? rows : empty("No run in the period."),
    el("div", { class: "lane axis" }, el("span", { class: "lane-label", text: "UTC" }), el("span", { class: "lane-track" }, ticks)));
}

/** What waits for a person, in words: only what is true of the report. */
export function attention(r) {
  const items = [];
  const n = (k, one, many) => k + " " + (k === 1 ? one : many);
  if (!r.ledger.verified) items.push("the ledger failed verify");
  if (r.pending_approvals.length) items.push(n(r.pending_approvals.length, "approval is pending", "approvals are pending"));
  if (r.runs_needing_person.length) items.push(n(r.runs_needing_person.length, "run needs a person", "runs need a person"));
  if (r.loops_stopped.length) items.push(n(r.loops_stopped.length, "loop stop waits to be cleared", "loop stops wait to be cleared"));
  const failed = (r.pages || []).filter((p) => p.outcome === "failed").length;
  if (failed) items.push(n(failed, "page was not delivered", "pages were not delivered"));
  const brake = r.brake_periods.find((b) => !b.released_at);
  if (brake) {
    items.push("the fleet brake is engaged " + (brake.engaged_by === "automatic" ? "automatically" : "by hand, by " + brake.engaged_by)
      + (brake.reason ? " (" + brake.reason + ")" : "") + ": no run starts by itself until it is released");
  }
  return items;
}

function attentionBanner(r) {
  const items = attention(r);
  if (!r.needs_attention || items.length === 0) {
    return el("p", { class: "banner banner-good", id: "handover-banner", text: "Nothing needs attention." });
  }
  const text = items.join("; ");
  return el("p", { class: "banner banner-bad", id: "handover-banner", text: "Needs attention: " + text + "." });
}

function render(r, now, span, redraw) {
  const t = r.totals;
  const pb = Object.entries(r.by_playbook);
  const remediated = Object.entries(r.nodes_remediated).flatMap(([p, runs]) => runs.map((x) => [p, x]));
  return [
    attentionBanner(r),
    el("div", { class: "stats" },
      stat("started", t.started), stat("succeeded", t.succeeded, t.succeeded ? "good" : null), stat("failed", t.failed, t.failed ? "bad" : null),
      stat("cancelled", t.cancelled), stat("stood down", t.stood_down, t.stood_down ? "wait" : null), stat("held", t.held, t.held ? "wait" : null), stat("denied", t.denied),
      stat("approvals asked", r.approvals_requested), stat("pending", r.pending_approvals.length, r.pending_approvals.length ? "wait" : null),
      stat("lapsed", r.lapsed_approvals.length, r.lapsed_approvals.length ? "bad" : null)),
    el("section", { class: "card" }, el("div", { class: "card-head" }, el("h2", { text: "Timeline" }),
      el("label", { class: "small muted" }, "show ", spanPicker(span, redraw))),
      timeline(r, span.value)),
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

function spanPicker(span, redraw) {
  span.onchange = redraw;
  return span;
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
    const span = el("select", { id: "timeline-span" }, SPANS.map(([label, v]) => el("option", { value: v, text: label })));
    let last = null;
    const draw = () => { if (last) replace(body, render(last.report, last.now, span, draw)); };
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
        last = { report: await api.handover(params()), now: ctx.now() };
        draw();
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
