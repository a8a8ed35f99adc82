// Small DOM helpers. Server text is always set as text, never parsed as markup.

export function el(tag, props, ...children) {
  const node = document.createElement(tag);
  for (const [k, v] of Object.entries(props || {})) {
    if (v === undefined || v === null || v === false) continue;
    if (k === "class") node.className = v;
    else if (k === "text") node.textContent = v;
    else if (k.startsWith("on")) node.addEventListener(k.slice(2), v);
    else if (k === "dataset") Object.assign(node.dataset, v);
    else if (k === "style") node.style.cssText = String(v); // CSSOM, which the content-security policy allows
    else node.setAttribute(k, v === true ? "" : String(v));
  }
  append(node, children);
  return node;
}

function append(node, children) {
  for (const c of children) {
    if (c === undefined || c === null || c === false) continue;
    if (Array.isArray(c)) append(node, c);
    else node.append(c instanceof Node ? c : document.createTextNode(String(c)));
  }
}

export function replace(node, ...children) {
  node.replaceChildren();
  append(node, children);
  return node;
}

/** A state word as a coloured pill; the colour follows how much attention the state needs. */
export function pill(state, extra) {
  return el("span", { class: "pill pill-" + tone(state) + (extra ? " " + extra : ""), text: state });
}

export function tone(state) {
  switch (state) {
    case "succeeded": case "clear": case "released": case "approved": case "start": case "verified": case "delivered":
    case "all delivered":
      return "good";
    case "running":
      return "active";
    case "pending": case "awaiting-approval": case "impaired": case "hold": case "paused": case "approval":
    case "stood-down": case "unknown-target": case "within tolerance":
      return "wait";
    case "failed": case "timed-out": case "needs-human": case "unhealthy": case "deny": case "engaged": case "silent":
    case "beyond tolerance":
    case "breach": case "rejected": case "lapsed": case "broken":
      return "bad";
    default:
      return "quiet";
  }
}

export function target(cluster, node) {
  return node ? cluster + "/" + node : cluster;
}

/** An instant as HH:MM:SS UTC (with the date when it is not the day of {@code now}); the full time on hover. */
export function time(iso, now) {
  if (!iso) return el("span", { class: "muted", text: "—" });
  const d = iso.replace("T", " ");
  const day = d.slice(0, 10);
  const clock = d.slice(11, 19);
  const sameDay = now && now.slice(0, 10) === day;
  return el("time", { datetime: iso, title: iso, text: sameDay ? clock : day + " " + clock });
}

/** "4m 10s" from milliseconds. */
export function span(ms) {
  if (ms < 0) ms = 0;
  const s = Math.round(ms / 1000);
  if (s < 60) return s + "s";
  const m = Math.floor(s / 60);
  if (m < 60) return m + "m " + (s % 60) + "s";
  const h = Math.floor(m / 60);
  if (h < 48) return h + "h " + (m % 60) + "m";
  return Math.floor(h / 24) + "d " + (h % 24) + "h";
}

export function ago(iso, now) {
  if (!iso || !now) return "";
  return span(Date.parse(now) - Date.parse(iso)) + " ago";
}

export function empty(message) {
  return el("p", { class: "empty", text: message });
}

export function problem(err) {
  return el("p", { class: "problem", role: "alert", text: err && err.message ? err.message : String(err) });
}

export function stat(label, value, toneName, note) {
  return el("div", { class: "stat" + (toneName ? " stat-" + toneName : "") },
    el("span", { class: "stat-value", text: String(value) }),
    el("span", { class: "stat-label", text: label }),
    note ? el("span", { class: "stat-note", text: note }) : null);
}

export function table(headers, rows, cls) {
  return el("table", { class: cls || "grid" },
    el("thead", {}, el("tr", {}, headers.map((h) => el("th", { text: h })))),
    el("tbody", {}, rows));
}
