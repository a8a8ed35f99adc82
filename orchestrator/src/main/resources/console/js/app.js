// The console's shell: sign-in, the page menu, and a quiet refresh of the open page.
import { api, setToken, token } from "./api.js";
import { replace } from "./dom.js";
import fleet from "./fleet.js";
import approvals from "./approvals.js";
import runs from "./runs.js";
import ledger from "./ledger.js";
import handover from "./handover.js";

const PAGES = { fleet, approvals, runs, ledger, handover };
const REFRESH_MS = 3000;

const $ = (id) => document.getElementById(id);
let me = null;
let current = null;
let timer = null;
let serverNow = null;

const ctx = {
  get me() { return me; },
  can: (role) => !!me && me.roles.includes(role),
  now: () => serverNow,
  notify(message, toneName) {
    const n = $("notice");
    n.textContent = message;
    n.className = "notice notice-" + (toneName || "good");
    n.hidden = false;
  },
  clearNotice() { $("notice").hidden = true; },
  async refreshClock() {
    const h = await api.health();
    serverNow = h.at;
    const demo = h.time_scale && h.time_scale > 1;
    $("server-time").textContent = h.at ? (demo ? "demo time " : "server time ") + h.at.slice(0, 19).replace("T", " ") + "Z" : "";
    const label = $("time-scale");
    label.hidden = !demo;
    label.textContent = demo ? "accelerated " + Math.round(h.time_scale) + "× the wall clock" : "";
    const n = await api.approvals("pending");
    const c = $("approval-count");
    c.textContent = String(n.length);
    c.hidden = n.length === 0;
    return h;
  },
};

function showLogin(message) {
  stop();
  $("app").hidden = true;
  $("login").hidden = false;
  const p = $("login-problem");
  p.textContent = message || "";
  p.hidden = !message;
  $("token").focus();
}

async function signIn(value) {
  try {
    me = await api.me(value);
  } catch (err) {
    me = null;
    setToken(null);
    showLogin(err.status === 401 ? "This server does not accept that token." : err.message);
    return;
  }
  setToken(value);
  $("login").hidden = true;
  $("app").hidden = false;
  $("who-name").textContent = me.name;
  $("who-roles").textContent = me.roles.join(", ");
  document.body.dataset.roles = me.roles.join(" ");
  if (!location.hash) location.hash = "#fleet"; // opens the page through hashchange
  else open();
}

function stop() {
  if (timer) clearInterval(timer);
  timer = null;
  current = null;
}

let opened = 0;
async function open() {
  if (!me) return;
  stop();
  const generation = ++opened;
  const id = (location.hash || "#fleet").slice(1).split("?")[0];
  const page = PAGES[id] || fleet;
  document.querySelectorAll("nav a[data-page]").forEach((a) => a.classList.toggle("here", a.dataset.page === page.id));
  $("page-title").textContent = page.title;
  ctx.clearNotice();
  const root = replace($("page"));
  root.dataset.page = page.id;
  try {
    await ctx.refreshClock();
  } catch (err) {
    if (err.status === 401) return showLogin("The token is no longer accepted; sign in again.");
  }
  if (generation !== opened) return; // another page was opened meanwhile
  const view = page.mount(root, ctx);
  current = view;
  await refresh(view);
  timer = setInterval(() => refresh(view), REFRESH_MS);
}

let busy = false;
async function refresh(view) {
  if (busy || view !== current) return;
  busy = true;
  try {
    await ctx.refreshClock();
    await view.refresh();
  } catch (err) {
    if (err.status === 401) showLogin("The token is no longer accepted; sign in again.");
    else ctx.notify(err.message, "bad");
  } finally {
    busy = false;
  }
}

$("login-form").addEventListener("submit", (e) => {
  e.preventDefault();
  const v = $("token").value.trim();
  $("token").value = "";
  if (v) signIn(v);
});
$("sign-out").addEventListener("click", () => {
  setToken(null);
  me = null;
  showLogin();
});
window.addEventListener("hashchange", open);

if (token()) signIn(token());
else showLogin();
