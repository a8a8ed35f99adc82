// The console's only way to the server: JSON over /api/v1 with the bearer token kept in
// sessionStorage (gone when the tab closes). The server checks every role; the console only
// hides what a token may not do.

const TOKEN_KEY = "tend.token";

export class ApiError extends Error {
  constructor(status, body) {
    super((body && body.message) || ("the server answered " + status));
    this.status = status;
    this.code = body && body.error;
    this.body = body;
  }
}

export function token() {
  return sessionStorage.getItem(TOKEN_KEY);
}

export function setToken(value) {
  if (value) sessionStorage.setItem(TOKEN_KEY, value);
  else sessionStorage.removeItem(TOKEN_KEY);
}

function query(params) {
  const q = new URLSearchParams();
  for (const [k, v] of Object.entries(params || {})) {
    if (v !== undefined && v !== null && v !== "") q.set(k, String(v));
  }
  const s = q.toString();
  return s ? "?" + s : "";
}

async function send(method, path, params, body, withToken) {
  const headers = { "Accept": "application/json" };
  const t = withToken === undefined ? token() : withToken;
  if (t) headers["Authorization"] = "Bearer " + t;
  const init = { method, headers, cache: "no-store" };
  if (body !== undefined) {
    headers["Content-Type"] = "application/json";
    init.body = JSON.stringify(body);
  }
  const res = await fetch("api/v1/" + path + query(params), init);
  const text = await res.text();
  let json = null;
  try {
    json = text ? JSON.parse(text) : null;
  } catch (notJson) {
    json = null;
  }
  if (!res.ok) throw new ApiError(res.status, json);
  return json === null ? text : json;
}

let vocabulary = null;

export const api = {
  me: (withToken) => send("GET", "me", null, undefined, withToken),
  // the server's ledger kinds and reason codes; they do not change while it runs, so asked once
  vocabulary: () => {
    if (!vocabulary) vocabulary = send("GET", "vocabulary").catch((err) => { vocabulary = null; throw err; });
    return vocabulary;
  },
  health: () => send("GET", "health"),
  approvals: (state) => send("GET", "approvals", { state }),
  approve: (run) => send("POST", "approvals/" + encodeURIComponent(run) + "/approve", null, {}),
  reject: (run, reason) => send("POST", "approvals/" + encodeURIComponent(run) + "/reject", null, { reason }),
  runs: (params) => send("GET", "runs", params),
  playbooks: () => send("GET", "playbooks"),
  abort: (run, reason) => send("POST", "runs/" + encodeURIComponent(run) + "/abort", null, reason ? { reason } : {}),
  engageBrake: (reason) => send("POST", "brake/engage", null, { reason }),
  releaseBrake: (reason) => send("POST", "brake/release", null, { reason }),
  ledger: (params) => send("GET", "ledger", params),
  pages: (params) => send("GET", "pages", params),
  handover: (params) => send("GET", "handover", params),
  handoverHtml: async (params) => {
    const res = await fetch("api/v1/handover" + query(Object.assign({}, params, { format: "html" })),
      { headers: { "Authorization": "Bearer " + token() }, cache: "no-store" });
    if (!res.ok) {
      let body = null;
      try { body = await res.json(); } catch (e) { body = null; }
      throw new ApiError(res.status, body);
    }
    return res.text();
  },
};
