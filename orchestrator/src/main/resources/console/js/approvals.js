// Pending approvals: what asks for a person, why the guards sent it here, and the decision.
import { api } from "./api.js";
import { el, replace, pill, table, time, empty, span, target } from "./dom.js";

// what each reason code means, as the server says (GET vocabulary); filled before the first list is drawn
let meanings = {};

/**
 * Each reason once: its code and what it means (GET vocabulary), or, for a code the server did
 * not explain, the guard's own sentence from the verdict that asked a person ("code: sentence").
 */
function reasonList(codes, verdict) {
  const said = new Map();
  for (const m of (verdict && verdict.messages) || []) {
    const i = m.indexOf(": ");
    if (i > 0 && !said.has(m.slice(0, i))) said.set(m.slice(0, i), m.slice(i + 2));
  }
  return el("ul", { class: "reasons" }, codes.map((c) => el("li", { dataset: { reason: c } },
    el("code", { class: "reason", text: c }), " ", meanings[c] || said.get(c) || "")));
}

function decisionControls(ctx, a, after) {
  if (!ctx.can("approver")) {
    return el("p", { class: "muted small", text: "Deciding needs the approver role." });
  }
  const reason = el("input", { type: "text", placeholder: "why not (required to reject)", class: "reject-reason" });
  const approve = el("button", {
    type: "button", class: "primary", text: "Approve", dataset: { action: "approve", run: a.run },
    onclick: () => decide(ctx, a, true, null, [approve, rejectBtn], after),
  });
  const rejectBtn = el("button", {
    type: "button", class: "danger", text: "Reject", dataset: { action: "reject", run: a.run },
    onclick: () => {
      const r = reason.value.trim();
      if (!r) {
        reason.focus();
        ctx.notify("Say why the run is rejected; the reason goes into the ledger.", "wait");
        return;
      }
      decide(ctx, a, false, r, [approve, rejectBtn], after);
    },
  });
  return el("div", { class: "decide" }, approve, reason, rejectBtn);
}

async function decide(ctx, a, yes, reason, buttons, after) {
  buttons.forEach((b) => { b.disabled = true; });
  try {
    const out = yes ? await api.approve(a.run) : await api.reject(a.run, reason);
    if (yes) {
      const v = out.verdict || "start";
      const why = out.reasons && out.reasons.length ? " (" + out.reasons.join(", ") + ")" : "";
      ctx.notify("Approved " + a.run + ": the guards, checked again, said " + v + why + "; the run is "
        + (out.run ? out.run.state : "on its way") + ".", v === "start" ? "good" : "wait");
    } else {
      ctx.notify("Rejected " + a.run + "; the run is cancelled.", "good");
    }
  } catch (err) {
    ctx.notify(err.message, "bad");
  }
  await after();
}

/** The guards' verdict that sent {@code a} to a person (a verdict names the candidate, not yet the run). */
async function askingVerdict(a) {
  try {
    const page = await api.ledger({ kind: "verdict", cluster: a.cluster, playbook: a.playbook, limit: 50 });
    const mine = page.entries.filter((e) => e.verdict === "await-approval" && (e.node || null) === (a.node || null));
    return mine.length ? mine[mine.length - 1] : null;
  } catch (err) {
    return null;
  }
}

export default {
  id: "approvals",
  title: "Pending approvals",
  mount(root, ctx) {
    const pending = el("div", { class: "approvals", id: "pending-approvals" });
    const settled = el("section", { class: "card" });
    root.append(pending, settled);
    let shown = null;
    const countdowns = new Map();

    const view = {
      async refresh() {
        const now = ctx.now();
        const vocabulary = await api.vocabulary();
        meanings = Object.fromEntries(vocabulary.reason_codes.map((r) => [r.code, r.meaning]));
        const list = await api.approvals("pending");
        const key = list.map((a) => a.run).join(",");
        if (key !== shown) {
          shown = key;
          countdowns.clear();
          const messages = await Promise.all(list.map((a) => askingVerdict(a)));
          replace(pending, list.length === 0 ? empty("Nothing waits for a person.") : list.map((a, i) => {
            const left = el("span", { class: "countdown" });
            countdowns.set(a.run, { node: left, expires: a.expires_at });
            const verdict = messages[i];
            return el("article", { class: "card approval", dataset: { run: a.run } },
              el("div", { class: "card-head" },
                el("h3", {}, el("code", { text: target(a.cluster, a.node) }), " ", el("span", { class: "muted", text: a.playbook })),
                pill("pending")),
              el("dl", { class: "facts" },
                el("dt", { text: "run" }), el("dd", {}, el("code", { text: a.run })),
                el("dt", { text: "asked by" }), el("dd", {}, a.requested_by, " at ", time(a.requested_at, now)),
                el("dt", { text: "lapses" }), el("dd", {}, time(a.expires_at, now), " ", left)),
              el("h4", { text: "Why a person is asked" }),
              reasonList(a.reasons, verdict),
              decisionControls(ctx, a, () => view.refresh()));
          }));
        }
        for (const { node, expires } of countdowns.values()) {
          node.textContent = now ? "(in " + span(Date.parse(expires) - Date.parse(now)) + ")" : "";
        }

        const all = await api.approvals("all");
        const done = all.filter((a) => a.state !== "pending")
          .sort((x, y) => (y.decided_at || "").localeCompare(x.decided_at || "")).slice(0, 15);
        replace(settled, el("h2", { text: "Settled recently" }),
          done.length === 0 ? empty("No approval was settled yet.")
            : table(["target", "playbook", "state", "by", "when", "reasons"], done.map((a) => el("tr", { dataset: { run: a.run } },
              el("td", {}, el("code", { text: target(a.cluster, a.node) })),
              el("td", { text: a.playbook }),
              el("td", {}, pill(a.state)),
              el("td", { text: a.decided_by || "—" }),
              el("td", {}, time(a.decided_at, now)),
              el("td", { class: "small", text: a.reasons.join(", ") })))));
      },
    };
    return view;
  },
};
