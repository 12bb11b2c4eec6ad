// The "Runs" view of the page: start a sweep of a tool's form as a run (POST /v1/runs), the
// group's runs with their progress (#/runs), and one run's page (#/runs/{id}: a link a colleague
// can open) with its table, a CSV download and a plot of each output against the swept field
// (one line per value of a second axis). A run with a study (uncertainty, inversion) shows its
// summaries instead: a histogram per output with its percentiles, a band per output along a
// sweep, or the posterior density with its intervals, each with a CSV built from the JSON shown.
// app.js calls initRuns() once and attachSweep() per form.
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
.study-figure { margin: 0; max-width: 660px; }
.study-figure figcaption { font-size: 0.9rem; margin: 0.2rem 0 0.6rem; }
.study-figure figcaption p { margin: 0.15rem 0; }
.study-counts { margin: 0.5rem 0; }
.study-counts ul { margin: 0.2rem 0; padding-left: 1.2rem; font-size: 0.88rem; }
.study-warnings { color: #7a4a00; }
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
  const table = run.study ? studyTable(run, rows) : h("table", { id: "run-results", class: "runs-table" },
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
  if (run.study) {
    showStudy(run, rows, plots, width);
  } else {
    for (const spec of runPlots(run, rows)) {
      plots.append(drawPlot(spec, { width }));
    }
  }
  if (run.status === "queued" || run.status === "running") {
    state.timer = setTimeout(() => state.shown === id && showRun(id), 1000);
  }
}

/** The rows grouped by their value of the second swept field (one group when there is none), in order. */
function bySecondAxis(rows, second) {
  const groups = new Map();
  for (const row of rows) {
    const key = second === undefined ? "" : row.inputs[second];
    if (!groups.has(key)) {
      groups.set(key, []);
    }
    groups.get(key).push(row);
  }
  return groups;
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
  const groups = bySecondAxis(rows, second);
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

// ---------------------------------------------------------------- a run with a study

const PCT = [["p2_5", "2.5 %"], ["p16", "16 %"], ["p50", "median"], ["p84", "84 %"], ["p97_5", "97.5 %"]];

/** "forward", "posterior" or "sampling": what the run's study computes. */
export function studyKind(run) {
  const st = run.study || {};
  return st.solve ? (st.solve.method || "posterior") : "forward";
}

/**
 * The statistics of one row, per quantity: a forward study's summaries (per output), an
 * inversion's estimate or summary of the solved field. {} for a row still pending or with a problem.
 */
export function rowStats(row) {
  const st = row.study;
  if (!st) {
    return {};
  }
  if (st.study === "forward") {
    return st.summaries || {};
  }
  if (st.study === "posterior") {
    return st.estimate ? { [st.field]: st.estimate } : {};
  }
  return st.summary ? { [st.field]: st.summary } : {};
}

/** The quantities a study summarises, in the run's order: its outputs, or the solved field. */
export function studyQuantities(run) {
  return studyKind(run) === "forward" ? (run.outputs || []) : [run.study.solve.field];
}

function unitOf(u) {
  return u && u !== "1" ? u : undefined;
}

function csvCell(v) {
  if (v === null || v === undefined || (typeof v === "number" && !isFinite(v))) {
    return "";
  }
  const t = String(v);
  return /[",\n]/.test(t) ? `"${t.replace(/"/g, '""')}"` : t;
}

/** CSV text from a header and rows of values (numbers at full precision). */
export function csvText(header, rows) {
  return [header, ...rows].map((r) => r.map(csvCell).join(",")).join("\n") + "\n";
}

/**
 * A histogram of one summary (its 20 bins as bars) with the percentiles as vertical lines; null
 * when every sample gave the same value (no width to draw). Also the CSV of its bins.
 */
export function histogramView(name, summary) {
  const hist = summary.histogram || {};
  const e = hist.edges || [], c = hist.counts || [];
  if (e.length < 2 || !(e[e.length - 1] > e[0])) {
    return null;
  }
  return {
    spec: {
      title: `${name}: ${summary.n} samples`,
      x: { label: name, unit: unitOf(summary.unit) }, y: { label: "samples per bin" },
      series: [{ label: `samples (${c.length} bins)`, role: "path", bars: true, barWidth: e[1] - e[0],
        points: c.map((k, i) => [(e[i] + e[i + 1]) / 2, k]) }],
      xLevels: PCT.map(([key, label]) => ({ x: summary[key], label, strong: key === "p50" })),
    },
    csv: csvText([`${name}.binFrom`, `${name}.binTo`, "samples"], c.map((k, i) => [e[i], e[i + 1], k])),
  };
}

/** Splits [x, a, b] triples into runs of consecutive finite ones (a band is not drawn across a gap). */
function finiteRuns(triples) {
  const out = [];
  let cur = [];
  for (const t of triples) {
    if (t.every((v) => isFinite(v))) {
      cur.push(t);
    } else if (cur.length) {
      out.push(cur);
      cur = [];
    }
  }
  if (cur.length) {
    out.push(cur);
  }
  return out;
}

/**
 * A quantity against the first swept field: the median as a line with the 16–84 % and
 * 2.5–97.5 % ranges as bands around it, one set per value of a second swept field. Also the CSV
 * of the statistics per sweep point.
 */
export function bandView(run, rows, name) {
  const [x, second] = Object.keys(run.sweep || {});
  const groups = bySecondAxis(rows, second);
  let unit;
  const series = [];
  [...groups.entries()].forEach(([key, rs], i) => {
    const color = PALETTE[i % PALETTE.length];
    const suffix = second === undefined ? "" : `, ${second} = ${fmtValue(key)}`;
    const stats = rs.map((row) => [row.inputs[x], rowStats(row)[name] || {}]);
    for (const [, st] of stats) {
      unit = unit || st.unit;
    }
    for (const [lo, hi, label, opacity] of [["p2_5", "p97_5", "2.5–97.5 % range", 0.14], ["p16", "p84", "16–84 % range", 0.3]]) {
      finiteRuns(stats.map(([v, st]) => [v, st[lo], st[hi]])).forEach((seg, k) => series.push({
        label: label + suffix, role: "path", color, opacity, points: [], legend: k === 0 ? undefined : false,
        band: { lower: seg.map((t) => [t[0], t[1]]), upper: seg.map((t) => [t[0], t[2]]) },
      }));
    }
    series.push({ label: "median" + suffix, role: "path", color,
      points: stats.map(([v, st]) => [v, isFinite(st.p50) ? st.p50 : NaN]) });
  });
  const keys = ["mean", "sd", "p2_5", "p16", "p50", "p84", "p97_5", "n"];
  const cols = [x, ...(second === undefined ? [] : [second])];
  return {
    spec: {
      title: `${name}: median, 68 % and 95 % ranges` + (second ? `, one set per ${second}` : ""),
      x: { label: x }, y: { label: name, unit: unitOf(unit) }, series,
    },
    csv: csvText([...cols, ...keys.map((k) => `${name}.${k}`)],
      rows.map((row) => [...cols.map((c) => row.inputs[c]), ...keys.map((k) => (rowStats(row)[name] || {})[k])])),
  };
}

function interpolateAt(xs, ys, v) {
  for (let i = 1; i < xs.length; i++) {
    if (v <= xs[i]) {
      const f = (v - xs[i - 1]) / (xs[i] - xs[i - 1]);
      return ys[i - 1] + f * (ys[i] - ys[i - 1]);
    }
  }
  return ys[ys.length - 1];
}

/** The area under the density between lo and hi, as a band from zero. */
function areaUnder(grid, density, lo, hi) {
  const pts = [[lo, interpolateAt(grid, density, lo)]];
  grid.forEach((g, i) => {
    if (g > lo && g < hi) {
      pts.push([g, density[i]]);
    }
  });
  pts.push([hi, interpolateAt(grid, density, hi)]);
  return { lower: pts.map(([g]) => [g, 0]), upper: pts };
}

/**
 * A posterior: its density over the solved field with the 95 % and 68 % intervals shaded under
 * it and the mean as a line; then the observed output along the grid with the observation ± sd.
 * Also the CSV of the grid (density and the relations).
 */
export function posteriorViews(run, st) {
  const field = st.field, grid = st.grid || [], density = st.density || [], est = st.estimate || {};
  const views = [{
    spec: {
      title: `Posterior of ${field}`,
      x: { label: field }, y: { label: `density (per unit of ${field})` },
      series: [
        { label: `95 % interval ${fmtValue(est.p2_5)}–${fmtValue(est.p97_5)}`, role: "path", opacity: 0.16, points: [],
          band: areaUnder(grid, density, est.p2_5, est.p97_5), interval: "95" },
        { label: `68 % interval ${fmtValue(est.p16)}–${fmtValue(est.p84)}`, role: "path", opacity: 0.34, points: [],
          band: areaUnder(grid, density, est.p16, est.p84), interval: "68" },
        { label: "posterior density", role: "path", points: grid.map((g, i) => [g, density[i]]) },
      ],
      xLevels: [{ x: est.mean, label: `mean ${fmtValue(est.mean)}`, strong: true }],
    },
  }];
  const observed = (run.study && run.study.observed) || {};
  const relation = st.relation || {};
  for (const [out, obs] of Object.entries(observed)) {
    const rel = relation[out];
    if (!rel) {
      continue;
    }
    views.push({
      spec: {
        title: `${out} of the model and the observation`,
        x: { label: field }, y: { label: out },
        series: [
          { label: `observed ${fmtValue(obs.value)} ± ${fmtValue(obs.sd)}`, role: "melt", opacity: 0.2, points: [],
            band: { lower: grid.map((g) => [g, obs.value - obs.sd]), upper: grid.map((g) => [g, obs.value + obs.sd]) } },
          { label: `${out} of the model (mean over the nuisance draws)`, role: "path", points: grid.map((g, i) => [g, rel[i]]) },
        ],
        levels: [{ y: obs.value, label: "observed" }],
        xLevels: ((st.roots || {})[out] || []).map((r) => ({ x: r, label: `meets it at ${fmtValue(r)}` })),
      },
    });
  }
  const rels = Object.keys(relation);
  views[0].csv = csvText([field, "posteriorDensity", ...rels.map((r) => `${r}.mean`)],
    grid.map((g, i) => [g, density[i], ...rels.map((r) => relation[r][i])]));
  return views;
}

function countList(title, counts, cls) {
  const entries = Object.entries(counts || {}).filter(([, n]) => n > 0);
  if (!entries.length) {
    return null;
  }
  return h("div", { class: cls },
    h("p", {}, title),
    h("ul", {}, entries.map(([k, n]) => h("li", { "data-reason": k }, `${n} × ${k}`))));
}

/** What the study counted at one point: samples drawn, computed, failed (with reasons), out of range, absent. */
function studyCounts(st) {
  const failed = st.failed || 0;
  const out = Object.values(st.outOfRange || {}).reduce((a, b) => a + b, 0);
  let line;
  if (st.study === "forward") {
    line = `${st.samples} samples drawn (seed ${st.seed}): ${st.evaluated} computed, `
      + `${failed} failed in the model, ${out} drawn outside a field's range and not computed.`;
  } else if (st.study === "sampling") {
    line = `${st.samples} draws (seed ${st.seed}): ${st.solved} solved; no root in [min, max]: `
      + `${st.noRootAbove} with the observation above the relation, ${st.noRootBelow} below; `
      + `${st.severalRoots} with several roots; ${failed} failed in the model, ${out} out of range.`;
  } else {
    line = `${(st.grid || []).length} grid points (seed ${st.seed}): ${st.evaluations} evaluations, `
      + `${failed} failed in the model, ${out} drawn outside a field's range.`
      + ` Probability in the first grid cell ${fmtValue(st.massAtMin)}, in the last ${fmtValue(st.massAtMax)}.`;
  }
  return h("div", { class: "study-counts", id: "study-counts", "data-failed": failed, "data-out-of-range": out },
    h("p", {}, line),
    countList("Failed in the model, by reason:", st.failureReasons, "study-failures"),
    countList("Drawn outside the field's range (not computed), by field:", st.outOfRange, "study-out-of-range"),
    countList("Samples without the output (it does not exist there, e.g. no melting):", st.absent, "study-absent"),
    (st.warnings || []).length ? h("ul", { class: "study-warnings" }, st.warnings.map((w) => h("li", {}, w))) : null);
}

function csvButton(name, text, what) {
  return h("button", { type: "button", class: "study-csv", "data-csv": name,
    onclick: () => saveBlob(new Blob([text], { type: "text/csv" }), name) }, `CSV of this ${what}`);
}

function figure(view, width, id, what, caption) {
  return h("figure", { class: "study-figure", "data-view": id },
    drawPlot(view.spec, { width }),
    h("figcaption", {}, caption, view.csv ? csvButton(`${id}.csv`, view.csv, what) : null));
}

function statLine(st, unit) {
  const u = unitOf(unit) ? ` ${unit}` : "";
  return h("p", { class: "study-stats" },
    `mean ${fmtValue(st.mean)} ± ${fmtValue(st.sd)}${u} (± 1 sd), median ${fmtValue(st.p50)}; `
    + `68 % in ${fmtValue(st.p16)}–${fmtValue(st.p84)}, 95 % in ${fmtValue(st.p2_5)}–${fmtValue(st.p97_5)}`
    + (st.n !== undefined ? ` (n = ${st.n})` : ""));
}

/** Draws a study's views into `plots`: histograms (no sweep), bands (a sweep) or a posterior. */
function showStudy(run, rows, plots, width) {
  const id = run.id;
  const swept = Object.keys(run.sweep || {}).length > 0;
  const done = rows.filter((r) => r.study);
  if (!done.length) {
    const problem = rows.find((r) => r.problem);
    plots.append(h("p", { class: problem ? "form-error" : "hint" },
      problem ? problem.problem.detail : "The study is being computed; its figures appear when the first point is done."));
    return;
  }
  if (swept) {
    for (const q of studyQuantities(run)) {
      plots.append(figure(bandView(run, rows, q), width, `run-${id}-${q}-band`, "band",
        h("p", {}, `${done.length} of ${rows.length} sweep points done.`)));
    }
    return;
  }
  const st = done[0].study;
  plots.before(studyCounts(st));
  if (st.study === "posterior") {
    const est = st.estimate || {};
    posteriorViews(run, st).forEach((view, i) => plots.append(figure(view, width,
      i === 0 ? `run-${id}-posterior` : `run-${id}-relation-${i}`, "posterior",
      i === 0 ? h("p", { class: "study-stats" }, `mean ${fmtValue(est.mean)}, sd ${fmtValue(est.sd)}, mode ${fmtValue(est.mode)}; `
        + `68 % interval ${fmtValue(est.p16)}–${fmtValue(est.p84)}, 95 % interval ${fmtValue(est.p2_5)}–${fmtValue(est.p97_5)} `
        + "(uniform prior over the grid).") : null)));
    return;
  }
  const stats = rowStats(done[0]);
  for (const q of studyQuantities(run)) {
    const summary = stats[q];
    if (!summary) {
      plots.append(h("p", { class: "hint", "data-view": `no-${q}` }, `${q}: no sample gave it (see the counts above).`));
      continue;
    }
    const view = histogramView(q, summary);
    if (!view) {
      plots.append(h("p", { class: "hint", "data-view": `flat-${q}` },
        `${q}: every one of ${summary.n} samples gave ${fmtValue(summary.mean)}${unitOf(summary.unit) ? " " + summary.unit : ""}.`));
      continue;
    }
    plots.append(figure(view, width, `run-${id}-${q}-histogram`, "histogram", statLine(summary, summary.unit)));
  }
}

/** The results of a study, one row per sweep point and quantity: its statistics, or its state. */
function studyTable(run, rows) {
  const inputs = Object.keys(run.sweep || {});
  const keys = ["mean", "sd", "p2_5", "p16", "p50", "p84", "p97_5"];
  const body = [];
  for (const row of rows) {
    const cells = (extra) => h("tr", { "data-index": row.index }, h("td", {}, row.index),
      inputs.map((f) => h("td", { "data-col": f }, fmtValue(row.inputs[f]))), extra);
    const stats = rowStats(row);
    if (!row.study) {
      body.push(cells(h("td", { colspan: keys.length + 2, class: row.problem ? "problem" : "" },
        row.problem ? row.problem.detail : row.pending ? `computing: ${row.pending.done} of ${row.pending.total} blocks` : "")));
      continue;
    }
    for (const q of studyQuantities(run)) {
      const st = stats[q] || {};
      body.push(cells([h("td", { "data-col": "quantity" }, q), h("td", {}, unitOf(st.unit) || ""),
        ...keys.map((k) => h("td", { "data-col": k }, fmtValue(st[k])))]));
    }
  }
  return h("table", { id: "run-results", class: "runs-table" },
    h("thead", {}, h("tr", {}, ["index", ...inputs, "quantity", "unit", "mean", "sd", "2.5 %", "16 %", "median", "84 %", "97.5 %"]
      .map((c) => h("th", {}, c)))),
    h("tbody", {}, body));
}
