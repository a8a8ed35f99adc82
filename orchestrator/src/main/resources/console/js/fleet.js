// Fleet overview: how much of the fleet is unhealthy, where, the fleet brake, and pages not delivered.
import { api } from "./api.js";
import { el, replace, pill, stat, table, time, ago, empty, target, span } from "./dom.js";

function brakeForm(ctx, engaged, after) {
  const reason = el("input", { id: "brake-reason", type: "text", placeholder: "reason (written to the ledger)", required: true });
  const button = el("button", {
    id: engaged ? "brake-release" : "brake-engage", type: "submit", class: engaged ? "primary" : "danger",
    text: engaged ? "Release the brake" : "Engage the brake",
  });
  return el("form", {
    class: "inline-form",
    onsubmit: async (e) => {
      e.preventDefault();
      const r = reason.value.trim();
      if (!r) return;
      button.disabled = true;
      try {
        const b = engaged ? await api.releaseBrake(r) : await api.engageBrake(r);
        ctx.notify(b.engaged ? "The fleet brake is engaged: no automatic starts until it is released." : "The fleet brake is released.",
          b.engaged ? "bad" : "good");
        await after();
      } catch (err) {
        ctx.notify(err.message, "bad");
        button.disabled = false;
      }
    },
  }, reason, button);
}

/** How unhealthy: within what the cluster tolerates (the API's "impaired"), beyond it, or not in the topology. */
function grade(health) {
  if (health === "impaired") return el("span", { class: "small muted grade", text: "within tolerance: fewer nodes out than it bears" });
  if (health === "unknown-target") return el("span", { class: "small muted grade", text: "not in the topology" });
  return el("span", { class: "small grade", text: "beyond tolerance or a cluster-level signal" });
}

export default {
  id: "fleet",
  title: "Fleet overview",
  mount(root, ctx) {
    const stats = el("div", { class: "stats" });
    const brake = el("section", { class: "card", id: "brake" });
    const zones = el("div", { class: "zones" });
    const clusters = el("section", { class: "card" });
    const pages = el("section", { class: "card", id: "pages" });
    root.append(stats, brake, pages, el("h2", { text: "Unhealthy clusters by zone" }), zones, clusters);
    let brakeShown = null;

    const view = {
      async refresh() {
        const h = await api.health();
        const now = h.at;
        const pct = (h.unhealthy_fraction * 100).toFixed(1) + "%";
        // event time is the newest transition's own time; it trails server time (events travel, and late ones must still count)
        const behind = h.event_time && now ? Date.parse(now) - Date.parse(h.event_time) : null;
        replace(stats,
          stat("clusters in " + (h.fleet || "the fleet"), h.clusters),
          stat("unhealthy clusters (" + pct + ")", h.unhealthy, h.unhealthy > 0 ? "wait" : "good"),
          stat("active runs", h.active_runs),
          stat("event time (newest transition)", h.event_time ? h.event_time.slice(11, 19) : "—", null,
            behind === null ? "no transition yet"
              : behind > 1000 ? span(behind) + " behind server time: confirm-for and flapping count in event time"
                : "level with server time"));

        const b = h.brake;
        // the form is rebuilt only when the brake changes, so typing a reason survives a refresh
        const key = b.engaged + "|" + b.since;
        if (key !== brakeShown) {
          brakeShown = key;
          replace(brake,
            el("div", { class: "card-head" },
              el("h2", { text: "Fleet brake" }),
              pill(b.engaged ? "engaged" : "released", "brake-state")),
            b.engaged
              ? el("p", {}, "Engaged ", time(b.since, now), " (" + ago(b.since, now) + ") by ", el("strong", { text: b.by || "?" }),
                b.manual ? " by hand" : " automatically", b.reason ? ": " + b.reason : "",
                ". No run starts by itself while it holds.")
              : el("p", { class: "muted", text: "Released: automation may start runs, guards permitting." }),
            b.engaged && h.active_runs > 0
              ? el("p", { class: "small", text: "Runs already under way pause at their next step boundary and go on once it is released." }) : null,
            ctx.can("operator") ? brakeForm(ctx, b.engaged, () => view.refresh())
              : el("p", { class: "muted small", text: "Engaging or releasing the brake needs the operator role." }));
        }

        replace(zones, h.zones.length === 0 ? empty("No topology yet.") : h.zones.map((z) =>
          el("section", { class: "zone card", dataset: { zone: z.zone } },
            el("div", { class: "card-head" }, el("h3", { text: z.zone }),
              el("span", { class: "muted zone-nodes", text: z.nodes + " node" + (z.nodes === 1 ? "" : "s") })),
            el("p", { class: "small muted zone-detail", text: "nodes of " + z.clusters + " cluster" + (z.clusters === 1 ? "" : "s")
              + (z.clusters === h.clusters && h.clusters > 1 ? " (every cluster has nodes here)" : "") + "; "
              + z.impaired_nodes + " in breach or silent" }),
            z.unhealthy.length === 0 ? el("p", { class: "calm", text: "all healthy" })
              : el("ul", { class: "chips" }, z.unhealthy.map((c) => el("li", { class: "chip", text: c }))))));

        const rows = h.unhealthy_clusters.map((c) => el("tr", { dataset: { cluster: c.cluster } },
          el("td", {}, el("strong", { text: c.cluster })),
          el("td", {}, pill("unhealthy", "cluster-health"), " ", grade(c.health)),
          el("td", { text: c.zones.join(", ") }),
          el("td", {}, el("ul", { class: "plain" }, c.signals.map((s) => el("li", {},
            el("code", { text: target(c.cluster, s.node) }), s.unknown_target ? el("span", { class: "muted small", text: " (not in the topology: never remediated)" }) : null,
            " ", s.signal, " ", pill(s.state), " ",
            el("span", { class: "muted small" }, "since ", time(s.since, now))))))));
        replace(clusters, el("h2", { text: "Signals in breach or silent" }),
          rows.length === 0 ? empty("Every cluster is healthy.") : table(["cluster", "state", "zones", "signals"], rows));

        // pages that have not reached anyone yet (still being tried, or given up) first, then the latest delivered
        const undelivered = await api.pages({ state: "undelivered" });
        const delivered = await api.pages({ state: "delivered", limit: 10 });
        const pageRow = (p) => el("tr", { dataset: { page: p.id } },
          el("td", {}, el("code", { text: p.id })),
          el("td", { text: p.kind || "" }),
          el("td", { text: p.channel }),
          el("td", {}, pill(p.state)),
          el("td", { text: p.message || "" }),
          el("td", { class: "small" }, p.attempts + " attempt" + (p.attempts === 1 ? "" : "s"),
            p.last_answer ? el("div", { class: "muted", text: p.last_answer }) : "",
            p.next_at ? el("div", { class: "muted" }, "next ", time(p.next_at, now)) : ""));
        replace(pages,
          el("div", { class: "card-head" }, el("h2", { text: "Pages" }),
            pill(undelivered.length === 0 ? "all delivered" : undelivered.length + " not delivered", "pages-state")),
          undelivered.length === 0 ? el("p", { class: "muted", text: "Every page reached its channel." })
            : table(["page", "kind", "channel", "state", "message", "delivery"], undelivered.map(pageRow)),
          delivered.length > 0 && el("h3", { text: "Latest delivered" }),
          delivered.length > 0 && table(["page", "kind", "channel", "state", "message", "delivery"], delivered.map(pageRow)));
      },
    };
    return view;
  },
};
