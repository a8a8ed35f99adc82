// The ledger timeline: every verdict, run, step, approval and operator command, filtered.
import { api } from "./api.js";
import { el, replace, pill, time, empty, target } from "./dom.js";

const SINCE = [["15m", 15], ["1h", 60], ["6h", 360], ["24h", 1440], ["everything", 0]];
const INSTANT = /^\d{4}-\d\d-\d\dT\d\d:\d\d/;
const SHOWN = new Set(["seq", "at", "kind", "cluster", "node", "playbook", "run", "hash"]);

function summary(e, now) {
  const parts = [];
  for (const [k, v] of Object.entries(e)) {
    if (SHOWN.has(k) || v === null || v === undefined) continue;
    if (Array.isArray(v) && v.length === 0) continue;
    let value;
    if (typeof v === "string" && INSTANT.test(v)) value = time(v, now);
    else if (Array.isArray(v) && v.every((x) => typeof x !== "object")) value = v.join(", ");
    else value = typeof v === "object" ? JSON.stringify(v) : String(v);
    parts.push(el("span", { class: "field" }, el("span", { class: "field-key", text: k.replace(/_/g, " ") }), " ", value));
  }
  return parts;
}

function entryTone(e) {
  if (e.kind === "verdict") return e.verdict;
  if (e.kind === "run-ended") return e.state;
  return e.kind;
}

export default {
  id: "ledger",
  title: "Ledger",
  mount(root, ctx) {
    // the kinds come from the server (GET vocabulary), so the filter offers every kind it writes
    const kind = el("select", { id: "filter-kind", name: "kind" }, el("option", { value: "", text: "any kind" }));
    let kindsShown = false;
    async function showKinds() {
      if (kindsShown) return;
      const v = await api.vocabulary();
      if (kindsShown) return;
      kind.append(...v.ledger_kinds.map((k) => el("option", { value: k.kind, text: k.kind })));
      kindsShown = true;
    }
    const cluster = el("input", { id: "filter-cluster", name: "cluster", type: "text", placeholder: "e.g. fares-3" });
    const playbook = el("input", { id: "filter-playbook", name: "playbook", type: "text", placeholder: "e.g. replace-silent-node" });
    const since = el("select", { id: "filter-since", name: "since" },
      SINCE.map(([label, min]) => el("option", { value: String(min), text: label === "everything" ? label : "last " + label })),
      el("option", { value: "custom", text: "since a time…" }));
    since.value = "60";
    const sinceText = el("input", { id: "filter-since-time", type: "text", placeholder: "2027-03-14T22:00:00Z", hidden: true });
    since.addEventListener("change", () => { sinceText.hidden = since.value !== "custom"; });
    const form = el("form", {
      class: "filters card",
      onsubmit: (e) => { e.preventDefault(); view.refresh().catch((err) => ctx.notify(err.message, "bad")); },
    },
    el("label", {}, "kind", kind), el("label", {}, "cluster", cluster), el("label", {}, "playbook", playbook),
    el("label", {}, "since", since, sinceText), el("button", { type: "submit", class: "primary", text: "Show" }));
    const head = el("p", { class: "small muted" });
    const list = el("ol", { class: "timeline", id: "timeline" });
    root.append(form, head, list);

    function sinceValue() {
      if (since.value === "custom") return sinceText.value.trim();
      const min = Number(since.value);
      const now = ctx.now();
      if (!min || !now) return "";
      return new Date(Date.parse(now) - min * 60000).toISOString();
    }

    const view = {
      async refresh() {
        await showKinds();
        const now = ctx.now();
        const page = await api.ledger({ kind: kind.value, cluster: cluster.value.trim(), playbook: playbook.value.trim(),
          since: sinceValue(), limit: 300 });
        replace(head, page.entries.length + " entries", page.truncated ? " (the newest 300; narrow the filters for older ones)" : "",
          " · ledger head #" + page.head_seq + " ", el("code", { title: page.head_hash, text: page.head_hash.slice(0, 16) + "…" }));
        const entries = page.entries.slice().reverse();
        replace(list, entries.length === 0 ? empty("No entry matches.") : entries.map((e) =>
          el("li", { class: "entry entry-" + e.kind, dataset: { seq: e.seq, kind: e.kind } },
            el("span", { class: "entry-time" }, time(e.at, now)),
            el("span", { class: "entry-dot dot-" + pillTone(e) }),
            el("div", { class: "entry-body" },
              el("div", {}, pill(e.kind === "verdict" ? "verdict: " + e.verdict : e.kind, "kind"), " ",
                e.cluster ? el("code", { text: target(e.cluster, e.node) }) : null, " ",
                e.playbook ? el("span", { class: "muted", text: e.playbook }) : null),
              el("div", { class: "fields small" }, summary(e, now))))));
      },
    };
    return view;
  },
};

function pillTone(e) {
  const t = entryTone(e);
  return ["start", "succeeded", "approval-granted", "brake-released"].includes(t) ? "good"
    : ["deny", "failed", "step-failed", "step-timed-out", "brake-engaged", "run-needs-human", "approval-lapsed"].includes(t) ? "bad"
      : ["hold", "await-approval", "approval-requested"].includes(t) ? "wait" : "quiet";
}
