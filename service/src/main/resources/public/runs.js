// The "Runs" view of the page: start a sweep of a tool's form as a run (POST /v1/runs), the
// group's runs with their progress (#/runs), and one run's page (#/runs/{id}: a link a colleague
// can open) with its table, a CSV download and a plot of each output against the swept field
// (one line per value of a second axis). app.js calls initRuns() once and attachSweep() per form.
import { drawPlot, fmtValue, injectPlotCss, PALETTE, saveBlob } from "./plot.js";

const state = { env: null, timer: null, shown: null };

function h(tag, attrs, ...children) {
  const e = document.createElement(tag);
  for (const [k, v] of Object.entries(attrs || {})) {
    if (v === null || v === undefined || v === false) {
      continue;
    }
    if (k.startsWith("on") && typeof v === "function") {
      e.addEventListener(k.slice(2), v);
    } else {
      e.setAttribute(k, v === true ? "" : String(v));
    }
  }
  for (const c of children.flat()) {
    if (c !== null && c !== undefined && c !== false) {
      e.append(c instanceof Node ? c : document.createTextNode(String(c)));
    }
  }
  return e;
}

/** True for the hashes this view owns: #/runs and #/runs/{id}. */
export function isRunsHash(hash) {
  return /^\/runs(\/[^/]+)?$/.test(String(hash || "").replace(/^#/, ""));
}

/** The operation a tool's endpoint serves: its last path segment (/v1/settings/mid-ocean-ridge → mid-ocean-ridge). */
export function operationOf(endpoint) {
  const parts = String(endpoint).split("/").filter((p) => p !== "");
  return parts[parts.length - 1];
}

/** The values of an evenly spaced axis, both ends included. */
export function axisValues(from, to, steps) {
  const out = [];
  for (let k = 0; k < steps; k++) {
    out.push(k === steps - 1 ? to : from + (to - from) * k / (steps - 1));
  }
  return out;
}

async function call(method, path, body) {
  const init = { method, headers: state.env.headers(body !== undefined) };
  if (body !== undefined) {
    init.body = JSON.stringify(body);
  }
  const res = await fetch(state.env.apiUrl(path), init);
  const text = await res.text();
  let parsed = null;
  try {
    parsed = text ? JSON.parse(text) : null;
  } catch (e) {
    parsed = null;
  }
  return { ok: res.ok, status: res.status, body: parsed, text, headers: res.headers };
}

function problemText(r) {
  const p = r.body || {};
  const errors = (p.errors || []).map((e) => `${e.field}: ${e.message}`);
  return [p.detail || `HTTP ${r.status}`, ...errors].join("\n");
}

const RUNS_CSS = `
.runs-view { padding: 0 1rem 1rem; }
.runs-table { border-collapse: collapse; margin: 0.5rem 0; font-size: 0.92rem; }
.runs-table th, .runs-table td { border-bottom: 1px solid #ddd6c8; padding: 0.2rem 0.6rem; text-align: left; }
.runs-table td.problem { color: #9b2c1f; }
.run-progress progress { width: 8rem; vertical-align: middle; }
.run-plots { display: flex; flex-wrap: wrap; gap: 1rem; }
details.sweep { margin: 1rem 0; }
details.sweep fieldset { border: 1px solid #ddd6c8; margin: 0.4rem 0; }
details.sweep label { margin-right: 0.6rem; }
.sweep-status { white-space: pre-line; color: #9b2c1f; }
`;

/** Sets up the view: its section, its nav entry and its hash routes. */
export function initRuns(env) {
  state.env = env;
  if (!document.getElementById("runs-css")) {
    document.head.append(h("style", { id: "runs-css" }, RUNS_CSS));
  }
  const nav = document.getElementById("tools");
  if (nav && !document.getElementById("runs-nav")) {
    nav.prepend(h("ul", { id: "runs-nav", class: "runs-nav" },
      h("li", {}, h("a", { href: "#/runs", class: "tool", "data-runs": "list" }, "Runs (sweeps kept on the server)"))));
  }
  if (!document.getElementById("runs-view")) {
    const view = h("section", { id: "runs-view", class: "runs-view", "aria-label": "Runs", hidden: true });
    document.getElementById("workbench").after(view);
  }
  window.addEventListener("hashchange", routeRuns);
}

/** Shows the runs view for #/runs and #/runs/{id}, the forms otherwise. */
export function routeRuns() {
  const hash = location.hash.replace(/^#/, "");
  const view = document.getElementById("runs-view");
  const workbench = document.getElementById("workbench");
  clearTimeout(state.timer);
  // style.display, not the hidden attribute: the page's stylesheet gives the workbench its own display
  if (!isRunsHash(hash)) {
    view.hidden = true;
    workbench.style.display = "";
    state.shown = null;
    return;
  }
  view.hidden = false;
  workbench.style.display = "none";
  const id = hash.split("/")[2];
  if (id) {
    showRun(decodeURIComponent(id));
  } else {
    showList();
  }
}

// ---------------------------------------------------------------- starting a sweep from a form

/**
 * Adds "Sweep this form as a run" under a tool's form: one or two numeric fields, each swept
 * from/to in n steps; the rest of the form is the base request.
 */
export function attachSweep(tool, form, collect) {
  const numeric = tool.fields.filter((f) => (f.type === "number" || f.type === "integer") && f.send !== false);
  if (!numeric.length || !state.env) {
    return;
  }
  const options = (withNone) => [withNone ? h("option", { value: "" }, "(none)") : null,
    ...numeric.map((f) => h("option", { value: f.name }, f.label + (f.unit ? ` (${f.unit})` : "")))];
  const axis = (n, withNone) => h("fieldset", { class: "sweep-axis", "data-axis": n },
    h("legend", {}, n === 1 ? "Swept field" : "Second field (one line per value)"),
    h("select", { name: `sweep${n}-field`, "aria-label": `field ${n}` }, options(withNone)),
    h("label", {}, "from ", h("input", { name: `sweep${n}-from`, inputmode: "decimal", size: 7 })),
    h("label", {}, "to ", h("input", { name: `sweep${n}-to`, inputmode: "decimal", size: 7 })),
    h("label", {}, "steps ", h("input", { name: `sweep${n}-steps`, inputmode: "numeric", size: 4, value: n === 1 ? "11" : "3" })));
  const status = h("p", { class: "sweep-status", role: "status" });
  const box = h("details", { class: "sweep", id: "sweep-box" },
    h("summary", {}, "Sweep this form as a run"),
    h("p", { class: "hint" }, "The other fields keep the values above. The server checks every point first, "
      + "computes them in the background and keeps the run for the group."),
    axis(1, false), axis(2, true),
    h("label", { class: "sweep-label" }, "Label ", h("input", { name: "sweep-label", size: 32, value: tool.label })),
    h("div", { class: "actions" }, h("button", { type: "button", id: "sweep-start" }, "Start run")),
    status);
  const fill = (n) => {
    const name = box.querySelector(`[name=sweep${n}-field]`).value;
    const f = numeric.find((x) => x.name === name);
    const d = f && Number(f.default);
    if (f && isFinite(d)) {
      box.querySelector(`[name=sweep${n}-from]`).value = String(d === 0 ? 0 : +(d * 0.9).toPrecision(4));
      box.querySelector(`[name=sweep${n}-to]`).value = String(d === 0 ? 1 : +(d * 1.1).toPrecision(4));
    }
  };
  box.querySelectorAll("select").forEach((s, i) => s.addEventListener("change", () => fill(i + 1)));
  fill(1);
  box.querySelector("#sweep-start").addEventListener("click", async () => {
    const { body, errors } = collect();
    if (errors.length) {
      status.textContent = "Fix the form first: " + errors.map((e) => `${e.field} ${e.message}`).join("; ");
      return;
    }
    const sweep = {};
    for (const n of [1, 2]) {
      const field = box.querySelector(`[name=sweep${n}-field]`).value;
      if (!field) {
        continue;
      }
      sweep[field] = {
        from: Number(box.querySelector(`[name=sweep${n}-from]`).value),
        to: Number(box.querySelector(`[name=sweep${n}-to]`).value),
        steps: Number(box.querySelector(`[name=sweep${n}-steps]`).value),
      };
      deletePath(body, field);
    }
    const label = box.querySelector("[name=sweep-label]").value.trim();
    status.textContent = "Starting…";
    const r = await call("POST", "/v1/runs", { operation: operationOf(tool.endpoint), request: body, sweep, label: label || undefined });
    if (r.status !== 202) {
      status.textContent = problemText(r);
      return;
    }
    status.textContent = "";
    location.hash = "#/runs/" + r.body.id;
  });
  form.after(box);
}

function deletePath(obj, path) {
  const parts = path.split(".");
  let o = obj;
  for (let i = 0; i < parts.length - 1 && o; i++) {
    o = o[parts[i]];
  }
  if (o) {
    delete o[parts[parts.length - 1]];
  }
}

// ---------------------------------------------------------------- the list

function progressBar(run) {
  const p = run.progress;
  return h("span", { class: "run-progress" },
    h("progress", { max: p.total, value: p.done, "aria-label": `${p.done} of ${p.total} points` }),
    ` ${p.done}/${p.total}` + (p.failed ? ` (${p.failed} with a problem)` : ""));
}

async function showList() {
  const view = document.getElementById("runs-view");
  state.shown = "list";
  const r = await call("GET", "/v1/runs?limit=50");
  if (state.shown !== "list") {
    return;
  }
  if (!r.ok) {
    view.replaceChildren(h("h2", {}, "Runs"), h("p", { class: "form-error" }, problemText(r)));
    return;
  }
  const rows = r.body.runs.map((run) => h("tr", { "data-run": run.id, "data-status": run.status },
    h("td", {}, h("a", { href: "#/runs/" + run.id }, run.label || run.id)),
    h("td", {}, run.operation), h("td", {}, run.owner),
    h("td", { class: "run-status" }, run.status), h("td", {}, progressBar(run)),
    h("td", {}, new Date(run.createdAt).toLocaleString())));
  view.replaceChildren(
    h("p", {}, h("a", { href: "#", id: "runs-back" }, "← Calculations")),
    h("h2", {}, "Runs"),
    h("p", { class: "hint" }, `${r.body.total} run(s) on this server, newest first. Start one from a tool's form `
      + "(\"Sweep this form as a run\")."),
    h("table", { id: "runs-table", class: "runs-table" },
      h("thead", {}, h("tr", {}, ["run", "operation", "owner", "status", "progress", "started"].map((c) => h("th", {}, c)))),
      h("tbody", {}, rows)));
  if (r.body.runs.some((x) => x.status === "queued" || x.status === "running")) {
    state.timer = setTimeout(() => state.shown === "list" && showList(), 1000);
  }
}

// ---------------------------------------------------------------- one run

async function showRun(id) {
  const view = document.getElementById("runs-view");
  state.shown = id;
  const r = await call("GET", "/v1/runs/" + encodeURIComponent(id));
  if (state.shown !== id) {
    return;
  }
  if (!r.ok) {
    view.replaceChildren(h("h2", {}, "Run"), h("p", { class: "form-error", id: "run-error" }, problemText(r)),
      h("p", {}, h("a", { href: "#/runs" }, "All runs")));
    return;
  }
  const run = r.body;
  const res = await call("GET", `/v1/runs/${encodeURIComponent(id)}/results?format=json`);
  if (state.shown !== id) {
    return;
  }
  const rows = res.ok ? res.body : [];
  const inputs = Object.keys(run.sweep || {});
  const outputs = run.outputs || [];
  const table = h("table", { id: "run-results", class: "runs-table" },
    h("thead", {}, h("tr", {}, ["index", ...inputs, ...outputs, "problem"].map((c) => h("th", {}, c)))),
    h("tbody", {}, rows.map((row) => h("tr", { "data-index": row.index },
      h("td", {}, row.index),
      inputs.map((f) => h("td", { "data-col": f }, fmtValue(row.inputs[f]))),
      outputs.map((f) => h("td", { "data-col": f }, row.outputs ? fmtValue(row.outputs[f]) : "")),
      h("td", { class: "problem" }, row.problem ? row.problem.detail : "")))));
  const csv = h("button", { type: "button", id: "run-csv", onclick: async () => {
    const c = await call("GET", `/v1/runs/${encodeURIComponent(id)}/results?format=csv`);
    if (c.ok) {
      saveBlob(new Blob([c.text], { type: "text/csv" }), `run-${id}.csv`);
    }
  } }, "Download CSV");
  const plots = h("div", { id: "run-plots", class: "run-plots" });
  view.replaceChildren(
    h("p", {}, h("a", { href: "#/runs" }, "← All runs"), " · ", h("a", { href: "#" }, "Calculations")),
    h("h2", {}, run.label || run.id),
    h("p", { class: "run-meta" }, `${run.operation} · owner ${run.owner} · `,
      h("span", { id: "run-status", "data-status": run.status }, run.status), " · ", progressBar(run),
      run.statusReason ? ` · ${run.statusReason}` : ""),
    h("p", { class: "hint" }, "Link for a colleague: ", h("code", {}, location.href)),
    h("div", { class: "actions" }, csv),
    plots, table);
  injectPlotCss(document);
  const width = Math.min(640, Math.max(300, (view.clientWidth || 700) - 20));
  for (const spec of runPlots(run, rows)) {
    plots.append(drawPlot(spec, { width }));
  }
  if (run.status === "queued" || run.status === "running") {
    state.timer = setTimeout(() => state.shown === id && showRun(id), 1000);
  }
}

/**
 * One plot per output against the first swept field, one line per value of the second (when
 * the sweep has two axes); points with a problem leave a gap.
 */
export function runPlots(run, rows) {
  const axes = Object.keys(run.sweep || {});
  if (!axes.length) {
    return [];
  }
  const [x, second] = axes;
  const groups = new Map();
  for (const row of rows) {
    const key = second === undefined ? "" : row.inputs[second];
    if (!groups.has(key)) {
      groups.set(key, []);
    }
    groups.get(key).push(row);
  }
  return (run.outputs || []).map((out) => ({
    title: `${out} against ${x}` + (second ? `, one line per ${second}` : ""),
    x: { label: x }, y: { label: out },
    series: [...groups.entries()].map(([key, rs], i) => ({
      label: second === undefined ? out : `${second} = ${fmtValue(key)}`,
      role: "path", color: PALETTE[i % PALETTE.length],
      points: rs.map((row) => [row.inputs[x], row.outputs && row.outputs[out] !== null ? row.outputs[out] : NaN]),
    })),
  }));
}
