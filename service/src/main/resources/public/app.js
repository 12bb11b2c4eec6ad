// The page: builds one form per entry of tools.json, calls the API, shows a summary table,
// SVG plots, downloads and a "copy as curl" command. Everything is served by this service.

import { drawPlot } from "./plot.js";

const TOKEN_KEY = "tectomelt.token";
const MELT_FRACTION = "/v1/melt-fraction";
const LITHOLOGIES = "/v1/lithologies";
const SOLIDUS_CROSSINGS = "/v1/solidus-crossings";

const state = {
  config: null,
  paths: new Set(), // endpoint paths in this server's openapi.yaml
  lithologies: [],
  lithologiesFromServer: false,
  tool: null,
  last: null, // {tool, body, url, response, values}
};

// ---------------------------------------------------------------- small helpers

function h(tag, attrs, ...children) {
  const e = document.createElement(tag);
  for (const [k, v] of Object.entries(attrs || {})) {
    if (v === undefined || v === null || v === false) {
      continue;
    }
    if (k === "class") {
      e.className = v;
    } else if (k.startsWith("on")) {
      e.addEventListener(k.slice(2), v);
    } else {
      e.setAttribute(k, v === true ? "" : String(v));
    }
  }
  for (const c of children.flat()) {
    if (c !== undefined && c !== null && c !== false) {
      e.append(c instanceof Node ? c : String(c));
    }
  }
  return e;
}

/** Value at a dotted path ("onset.depthKm"), or undefined. */
export function getPath(obj, path) {
  let cur = obj;
  for (const part of path.split(".")) {
    if (cur === null || typeof cur !== "object" || !(part in cur)) {
      return undefined;
    }
    cur = cur[part];
  }
  return cur;
}

/** The first defined value among alternative paths. */
export function pick(obj, paths) {
  for (const p of paths || []) {
    const v = getPath(obj, p);
    if (v !== undefined && v !== null) {
      return v;
    }
  }
  return undefined;
}

function setPath(obj, path, value) {
  const parts = path.split(".");
  let cur = obj;
  for (let i = 0; i < parts.length - 1; i++) {
    if (typeof cur[parts[i]] !== "object" || cur[parts[i]] === null) {
      cur[parts[i]] = {};
    }
    cur = cur[parts[i]];
  }
  cur[parts[parts.length - 1]] = value;
}

/** Formats a number for people: fixed digits in the usual range, exponent outside it. */
export function fmt(v, digits) {
  if (typeof v !== "number" || !isFinite(v)) {
    return String(v);
  }
  const d = digits === undefined ? 3 : digits;
  const a = Math.abs(v);
  if (a !== 0 && (a >= 1e6 || a < Math.pow(10, -d))) {
    return v.toExponential(Math.max(2, Math.min(d, 4)));
  }
  return v.toFixed(d);
}

function token() {
  return sessionStorage.getItem(TOKEN_KEY) || "";
}

function headers(json) {
  const hd = { Accept: "application/json, application/problem+json" };
  if (json) {
    hd["Content-Type"] = "application/json";
  }
  const t = token();
  if (t) {
    hd.Authorization = "Bearer " + t;
  }
  return hd;
}

/**
 * The absolute URL of an API path, resolved against the page's own address, so the page also
 * works when the service is served under a path prefix behind a proxy.
 */
export function apiUrl(path) {
  return new URL(path.replace(/^\//, ""), document.baseURI).href;
}

/** POST JSON; resolves to {ok, status, body, contentType} and never throws for HTTP errors. */
async function post(path, body) {
  const res = await fetch(apiUrl(path), { method: "POST", headers: headers(true), body: JSON.stringify(body) });
  const contentType = res.headers.get("Content-Type") || "";
  const text = await res.text();
  let parsed = null;
  try {
    parsed = text ? JSON.parse(text) : null;
  } catch (e) {
    parsed = null;
  }
  return { ok: res.ok, status: res.status, body: parsed, text, contentType };
}

// ---------------------------------------------------------------- start-up

async function init() {
  // the token box itself is run by api.js (shared with the rest of the page); this script reads
  // the same session-storage entry for its own requests and for "copy as curl"
  const [config, spec] = await Promise.all([
    fetch("tools.json").then((r) => r.json()),
    fetch("openapi.yaml").then((r) => (r.ok ? r.text() : "")).catch(() => ""),
  ]);
  state.config = config;
  state.paths = specPaths(spec);
  const version = /^\s*version:\s*(\S+)/m.exec(spec);
  if (version) {
    document.getElementById("version").textContent = "API version " + version[1] + ".";
  }
  await loadLithologies();
  renderNav();
  const wanted = location.hash.replace(/^#/, "");
  const first = config.tools.find((t) => t.id === wanted)
    || config.tools.find((t) => state.paths.has(t.endpoint))
    || config.tools[0];
  selectTool(first.id);
  window.addEventListener("hashchange", () => {
    const id = location.hash.replace(/^#/, "");
    if (state.config.tools.some((t) => t.id === id) && (!state.tool || state.tool.id !== id)) {
      selectTool(id);
    }
  });
  document.body.dataset.ready = "true";
}

/** The path keys of the OpenAPI document (two-space indented lines under "paths:"). */
export function specPaths(yaml) {
  const out = new Set();
  let inPaths = false;
  for (const line of yaml.split("\n")) {
    if (/^paths:\s*$/.test(line)) {
      inPaths = true;
      continue;
    }
    if (inPaths && /^\S/.test(line)) {
      inPaths = false;
    }
    const m = inPaths && /^ {2}(\/[^:\s]*):\s*$/.exec(line);
    if (m) {
      out.add(m[1]);
    }
  }
  return out;
}

async function loadLithologies() {
  state.lithologies = state.config.lithologies;
  if (!state.paths.has(LITHOLOGIES)) {
    return;
  }
  try {
    const res = await fetch(apiUrl(LITHOLOGIES), { headers: headers(false) });
    if (res.ok) {
      const list = await res.json();
      if (Array.isArray(list) && list.length > 0) {
        state.lithologies = list;
        state.lithologiesFromServer = true;
      }
    }
  } catch (e) {
    // keep the built-in list
  }
}

// ---------------------------------------------------------------- navigation and forms

function renderNav() {
  const nav = document.getElementById("tools");
  nav.replaceChildren();
  for (const g of state.config.groups) {
    const tools = state.config.tools.filter((t) => t.group === g.id);
    nav.append(h("h2", {}, g.label));
    const ul = h("ul");
    for (const t of tools) {
      const available = state.paths.has(t.endpoint);
      ul.append(h("li", {},
        h("a", {
          href: "#" + t.id, "data-tool": t.id, "data-available": String(available),
          class: available ? "tool" : "tool unavailable",
          title: available ? t.endpoint : t.endpoint + " is not offered by this server yet",
        }, t.label, available ? null : h("span", { class: "badge" }, "not on this server"))));
    }
    nav.append(ul);
  }
}

function selectTool(id) {
  const tool = state.config.tools.find((t) => t.id === id);
  state.tool = tool;
  if (location.hash !== "#" + id) {
    history.replaceState(null, "", "#" + id);
  }
  for (const a of document.querySelectorAll("#tools a")) {
    a.classList.toggle("current", a.dataset.tool === id);
    if (a.dataset.tool === id) {
      a.setAttribute("aria-current", "page");
    } else {
      a.removeAttribute("aria-current");
    }
  }
  renderForm(tool);
  document.getElementById("results").replaceChildren();
  document.getElementById("results").removeAttribute("data-state");
}

function lithologyOptions(field) {
  const kinds = field.kinds || ["mantle", "crust", "intrusion"];
  const list = state.lithologies.filter((l) => kinds.includes(l.kind) && (!field.hydrousOnly || l.hydrous));
  const opts = list.map((l) => ({ value: l.id, label: l.name ? `${l.name}` : l.id }));
  if (field.allowNone) {
    opts.push({ value: "", label: "none" });
  }
  return opts;
}

function fieldId(tool, i) {
  return `f-${tool.id}-${i}`;
}

function renderForm(tool) {
  const box = document.getElementById("inputs");
  const available = state.paths.has(tool.endpoint);
  const form = h("form", { id: "tool-form", "data-tool": tool.id, novalidate: true });
  form.append(h("h2", {}, tool.label));
  form.append(h("p", { class: "endpoint" }, h("code", {}, "POST " + tool.endpoint)));
  if (tool.scenario) {
    form.append(h("p", { class: "scenario" }, tool.scenario));
  }
  if (!available) {
    form.append(h("p", { class: "notice", id: "unavailable" },
      `This server does not offer ${tool.endpoint} yet; the form is shown so you can see what it will take.`));
  }
  tool.fields.forEach((f, i) => {
    const id = fieldId(tool, i);
    let control;
    if (f.type === "select" || f.type === "lithology") {
      const options = f.type === "lithology" ? lithologyOptions(f) : f.options;
      control = h("select", { id, name: f.name },
        options.map((o) => h("option", { value: o.value, selected: o.value === f.default }, o.label)));
    } else {
      control = h("input", {
        id, name: f.name, type: "text", inputmode: f.type === "list" ? "text" : "decimal",
        value: f.default === undefined ? "" : String(f.default),
        placeholder: f.optional ? "server default" : "",
        "aria-describedby": id + "-err",
      });
    }
    const row = h("div", {
      class: "field" + (f.send === false ? " page-only" : ""), "data-field": f.name, "data-index": i,
    },
    h("label", { for: id }, h("span", { class: "label-text" }, f.label),
      f.unit ? h("span", { class: "unit" }, f.unit) : null),
    control,
    f.help ? h("span", { class: "field-help" }, f.help) : null,
    h("span", { class: "field-error", id: id + "-err", "data-error-for": f.name, role: "alert" }));
    form.append(row);
  });
  form.append(h("div", { id: "form-error", class: "form-error", role: "alert" }));
  form.append(h("div", { class: "actions" },
    h("button", { type: "submit", id: "run", disabled: !available }, "Calculate"),
    h("button", { type: "button", class: "quiet", id: "reset", onclick: () => renderForm(tool) }, "Restore defaults")));
  form.addEventListener("submit", (ev) => {
    ev.preventDefault();
    run(tool, form);
  });
  form.addEventListener("change", () => applyVisibility(tool, form));
  box.replaceChildren(form);
  applyVisibility(tool, form);
}

function controlOf(tool, form, i) {
  return form.querySelector("#" + CSS.escape(fieldId(tool, i)));
}

/** Shows only the fields whose showIf condition holds; hidden fields are disabled and not sent. */
function applyVisibility(tool, form) {
  tool.fields.forEach((f, i) => {
    if (!f.showIf) {
      return;
    }
    const j = tool.fields.findIndex((g) => g.name === f.showIf.field);
    const ctl = controlOf(tool, form, j);
    const show = ctl && f.showIf.in.includes(ctl.value);
    const own = controlOf(tool, form, i);
    own.disabled = !show;
    own.closest(".field").hidden = !show;
  });
}

/** Reads the form: {body (what is sent), values (every field, page-only too), errors (local)}. */
function collect(tool, form) {
  const body = {};
  const values = {};
  const errors = [];
  tool.fields.forEach((f, i) => {
    const ctl = controlOf(tool, form, i);
    if (ctl.disabled) {
      return;
    }
    const raw = ctl.value.trim();
    let value;
    if (raw === "") {
      if (f.type !== "select" && f.type !== "lithology" && !f.optional && f.send !== false) {
        errors.push({ field: f.name, message: "is required" });
      }
      return;
    }
    if (f.type === "number" || f.type === "integer") {
      value = Number(raw);
      if (!isFinite(value)) {
        errors.push({ field: f.name, message: `"${raw}" is not a number` });
        return;
      }
      if (f.type === "integer" && !Number.isInteger(value)) {
        errors.push({ field: f.name, message: "must be a whole number" });
        return;
      }
    } else if (f.type === "curve") {
      // "T:F, T:F, ..." -> [{temperatureC, meltFraction}, ...]
      const pairs = raw.split(/[\s,;]+/).filter((x) => x !== "");
      const bad = pairs.filter((x) => !/^-?[0-9.eE+-]+:[0-9.eE+-]+$/.test(x) || !x.split(":").every((n) => isFinite(Number(n))));
      if (bad.length) {
        errors.push({ field: f.name, message: `write temperature:fraction pairs, e.g. 800:0.05 (not ${bad.join(", ")})` });
        return;
      }
      value = pairs.map((x) => {
        const [t, fr] = x.split(":").map(Number);
        return { temperatureC: t, meltFraction: fr };
      });
    } else if (f.type === "list") {
      const parts = raw.split(/[\s,;]+/).filter((s) => s !== "");
      value = parts.map(Number);
      const bad = parts.filter((s) => !isFinite(Number(s)));
      if (bad.length) {
        errors.push({ field: f.name, message: `not numbers: ${bad.join(", ")}` });
        return;
      }
    } else {
      value = raw;
    }
    values[f.name] = value;
    if (f.send !== false) {
      setPath(body, f.name, value);
    }
  });
  return { body, values, errors };
}

/** The form field an API error path belongs to: exact, without an index, or the nearest parent. */
function fieldForError(tool, path) {
  const names = tool.fields.map((f) => f.name);
  const candidates = [path, path.replace(/\[\d+\]/g, ""), path.replace(/\[\d+\].*$/, "")];
  for (const c of candidates) {
    if (names.includes(c)) {
      return c;
    }
  }
  const prefix = names.find((n) => n.startsWith(path + "."));
  return prefix || null;
}

function clearErrors(form) {
  for (const e of form.querySelectorAll(".field-error")) {
    e.textContent = "";
  }
  for (const e of form.querySelectorAll(".field.invalid")) {
    e.classList.remove("invalid");
  }
  form.querySelector("#form-error").replaceChildren();
}

function showFieldErrors(tool, form, errors) {
  const general = [];
  for (const err of errors) {
    const name = fieldForError(tool, err.field);
    const visible = name && [...form.querySelectorAll(".field")]
      .find((row) => row.dataset.field === name && !row.hidden);
    if (visible) {
      const span = visible.querySelector(".field-error");
      const text = err.field === name ? err.message : `${err.field}: ${err.message}`;
      span.textContent = span.textContent ? span.textContent + "; " + text : text;
      visible.classList.add("invalid");
    } else {
      general.push(`${err.field}: ${err.message}`);
    }
  }
  return general;
}

function showFormError(form, title, lines) {
  const box = form.querySelector("#form-error");
  box.replaceChildren(h("strong", {}, title), lines.length ? h("ul", {}, lines.map((l) => h("li", {}, l))) : null);
}

// ---------------------------------------------------------------- running a calculation

async function run(tool, form) {
  clearErrors(form);
  const { body, values, errors } = collect(tool, form);
  if (errors.length) {
    const general = showFieldErrors(tool, form, errors);
    showFormError(form, "Please correct the marked fields.", general);
    return;
  }
  const results = document.getElementById("results");
  results.dataset.state = "running";
  const button = form.querySelector("#run");
  button.disabled = true;
  let res;
  try {
    res = await post(tool.endpoint, body);
  } catch (e) {
    showFormError(form, "The service could not be reached.", [String(e.message || e)]);
    results.dataset.state = "failed";
    button.disabled = false;
    return;
  }
  button.disabled = false;
  if (!res.ok) {
    results.dataset.state = "failed";
    const p = res.body || {};
    if (res.status === 401) {
      showFormError(form, "This server asks for an access token.", ["Enter it in the access-token box at the top."]);
    } else if (res.status === 404) {
      showFormError(form, `This server does not offer ${tool.endpoint}.`, []);
    } else {
      const general = Array.isArray(p.errors) ? showFieldErrors(tool, form, p.errors) : [];
      showFormError(form, p.title || `HTTP ${res.status}`,
        [p.detail || res.text.slice(0, 300)].concat(general).filter((x) => x));
    }
    return;
  }
  state.last = { tool, body, values, url: apiUrl(tool.endpoint), response: res.body };
  await renderResults(state.last);
}

function rowsOf(response, paths) {
  const rows = pick(response, paths || []);
  return Array.isArray(rows) ? rows : [];
}

async function renderResults(last) {
  const { tool, response } = last;
  const results = document.getElementById("results");
  results.dataset.state = "drawing";
  results.replaceChildren();
  results.append(h("h2", {}, "Result: " + tool.label));
  results.append(h("p", { class: "result-caution" },
    "Research estimate from simplified published models — not a hazard, geothermal or site assessment."));

  const warnings = Array.isArray(response.warnings) ? response.warnings : [];
  if (warnings.length) {
    results.append(h("div", { class: "warnings", id: "warnings" }, h("strong", {}, "Warnings"),
      h("ul", {}, warnings.map((w) => h("li", {}, typeof w === "string" ? w : JSON.stringify(w))))));
  }

  if (typeof response.note === "string" && response.note) {
    results.append(h("p", { class: "result-note", id: "note" }, response.note));
  }
  const assumptions = Array.isArray(response.assumptions) ? response.assumptions : [];
  if (assumptions.length) {
    results.append(h("details", { class: "assumptions", id: "assumptions" },
      h("summary", {}, `Assumptions (${assumptions.length})`),
      h("ul", {}, assumptions.map((a) => h("li", {}, typeof a === "string" ? a : JSON.stringify(a))))));
  }

  const summary = h("table", { id: "summary", class: "summary" });
  for (const row of tool.summary || []) {
    const v = pick(response, row.path);
    if (v === undefined) {
      continue;
    }
    let text;
    if (row.format === "bool") {
      text = v ? "yes" : "no";
    } else if (typeof v === "number") {
      text = fmt(v * (row.scale || 1), row.digits);
    } else {
      text = String(v);
    }
    summary.append(h("tr", { "data-path": row.path.find((p) => getPath(response, p) !== undefined) },
      h("th", { scope: "row" }, row.label),
      h("td", { class: "value" }, text),
      h("td", { class: "unit" }, row.format === "bool" ? "" : row.unit || "")));
  }
  if (summary.children.length) {
    results.append(summary);
  }

  if (tool.listing) {
    const rows = rowsOf(response, tool.listing.data);
    const table = h("table", { id: "listing", class: "listing" },
      h("caption", {}, tool.listing.title),
      h("tr", {}, tool.listing.columns.map((c) => h("th", { scope: "col" }, c.unit ? `${c.label} (${c.unit})` : c.label))),
      rows.map((r) => h("tr", {}, tool.listing.columns.map((c) => {
        const v = r[c.key];
        return h("td", { "data-key": c.key }, typeof v === "number" ? fmt(v, c.digits) : String(v ?? ""));
      }))));
    results.append(rows.length ? table : h("p", { class: "empty" }, `No ${tool.listing.title.toLowerCase()}.`));
  }

  const plots = h("div", { id: "plots", class: "plots" });
  results.append(plots);

  results.append(h("div", { class: "downloads" },
    h("button", { type: "button", id: "download-csv", onclick: () => download(last, "csv") }, "Download CSV"),
    h("button", { type: "button", id: "download-json", onclick: () => download(last, "json") }, "Download JSON"),
    h("button", { type: "button", id: "copy-curl", onclick: () => copyCurl(last) }, "Copy as curl"),
    h("span", { id: "copy-status", class: "hint", role: "status" })));
  results.append(h("textarea", { id: "curl-text", class: "curl", readonly: true, rows: 4, hidden: true,
    "aria-label": "curl command" }));

  const everything = allValues(response);
  if (everything) {
    results.append(everything);
  }
  const models = Array.isArray(response.models) ? response.models : [];
  if (models.length) {
    results.append(h("div", { class: "models", id: "models" }, h("h3", {}, "Models used"),
      h("ul", {}, models.map((m) => h("li", {}, m.citation || m.id,
        m.doi ? h("span", { class: "doi" }, " doi:" + m.doi) : null)))));
  }

  for (const spec of tool.plots || []) {
    const figure = h("figure", { class: "figure", "data-plot": spec.title });
    plots.append(figure);
    await drawFigure(figure, spec, last);
  }
  results.dataset.state = "done";
}

/** Every scalar the response returned, flattened, for what the summary rows do not name. */
function allValues(response) {
  const rows = [];
  const walk = (obj, prefix) => {
    for (const [k, v] of Object.entries(obj)) {
      const p = prefix ? prefix + "." + k : k;
      if (v !== null && typeof v === "object" && !Array.isArray(v)) {
        walk(v, p);
      } else if (!Array.isArray(v)) {
        rows.push([p, v]);
      }
    }
  };
  walk(response, "");
  if (rows.length === 0) {
    return null;
  }
  return h("details", { class: "all-values", id: "all-values" },
    h("summary", {}, `All returned values (${rows.length})`),
    h("table", {}, rows.map(([k, v]) => h("tr", {}, h("th", { scope: "row" }, h("code", {}, k)),
      h("td", {}, typeof v === "number" ? String(v) : String(v))))));
}

// ---------------------------------------------------------------- plots

function sourceValue(src, last) {
  if (!src) {
    return NaN;
  }
  let v;
  if (src.request !== undefined) {
    v = last.values[src.request];
  } else if (src.response !== undefined) {
    v = pick(last.response, src.response);
  }
  return typeof v === "number" ? v * (src.scale || 1) : NaN;
}

async function drawFigure(figure, spec, last) {
  const rows = rowsOf(last.response, spec.data);
  const depthPlot = spec.type === "depth";
  const series = [];
  for (const s of spec.series) {
    const points = rows.map((r) => {
      const keep = !s.where || (typeof r[s.where] === "number" && r[s.where] > 0);
      const xv = depthPlot ? r[s.x] : r[spec.x.key];
      const yv = depthPlot ? r[spec.y.key] : r[s.y];
      if (!keep || typeof xv !== "number" || typeof yv !== "number") {
        return [NaN, NaN];
      }
      return depthPlot ? [xv * (s.scale || 1), yv] : [xv, yv * (s.scale || 1)];
    });
    series.push({ label: s.label, role: s.role, dots: s.dots, points });
  }
  if (spec.seriesFrom) {
    // one curve per element of an array (e.g. a profile per requested time), in sequence colours
    const sf = spec.seriesFrom;
    rowsOf(last.response, sf.data).forEach((e, i) => {
      const pts = Array.isArray(e[sf.points]) ? e[sf.points] : [];
      series.push({
        label: sf.label.replace(/\{(\w+)\}/g, (_, k) => (typeof e[k] === "number" ? fmt(e[k], Number.isInteger(e[k]) ? 0 : 1) : String(e[k] ?? ""))),
        role: `seq-${i % 6}`,
        points: pts.map((p) => [typeof p[sf.x] === "number" ? p[sf.x] * (sf.scale || 1) : NaN,
          typeof p[spec.y.key] === "number" ? p[spec.y.key] : NaN]),
      });
    });
  }
  const levels = (spec.levels || []).map((l) => ({ y: sourceValue(l, last), label: l.label }));
  const marks = (spec.marks || []).map((mk) => ({ x: sourceValue(mk.x, last), y: sourceValue(mk.y, last), label: mk.label }));
  if (spec.pointsFrom) {
    for (const r of rowsOf(last.response, spec.pointsFrom.data)) {
      marks.push({ x: r[spec.pointsFrom.x], y: r[spec.pointsFrom.y], label: String(r[spec.pointsFrom.label] ?? "") });
    }
  }
  const notes = [];
  let solidusDrawn = false;
  let axisRows = rows;
  if (spec.adiabat) {
    const a = await adiabatCurve(spec, last);
    if (a.rows) {
      axisRows = rows.concat(a.rows);
      const line = (key) => a.rows.map((r) => [typeof r[key] === "number" ? r[key] : NaN, r.depthKm]);
      const extra = [{ label: a.label, role: "adiabat", points: line("temperatureC") }];
      if (a.rows.some((r) => typeof r.solidusC === "number")) {
        extra.unshift({ label: `solidus (${last.values[spec.adiabat.lithology]}${wetLabel(last, spec.adiabat.water)})`,
          role: "solidus", points: line("solidusC") },
        { label: "liquidus", role: "liquidus", points: line("liquidusC") });
        solidusDrawn = true;
      }
      series.unshift(...extra);
    }
    if (a.note) {
      notes.push(a.note);
    }
  }
  if (spec.solidus && !solidusDrawn) {
    const extra = await solidusCurves(spec, rows, last);
    series.unshift(...extra.series);
    if (extra.note) {
      notes.push(extra.note);
    }
  }
  const drawn = series.filter((s) => s.points.some(([x, y]) => isFinite(x) && isFinite(y)));
  figure.replaceChildren();
  if (drawn.length === 0 && marks.every((mk) => !isFinite(mk.x))) {
    figure.append(h("p", { class: "empty" }, `${spec.title}: nothing to draw (no melting or no profile returned).`));
    return;
  }
  let y2;
  if (spec.y2) {
    const pairs = axisRows.filter((r) => typeof r[spec.y.key] === "number" && typeof r[spec.y2.key] === "number")
      .map((r) => [r[spec.y.key], r[spec.y2.key]]);
    y2 = pairs.length > 1 ? { label: spec.y2.label, unit: spec.y2.unit, pairs } : undefined;
  }
  figure.append(drawPlot({
    title: spec.title, x: spec.x, y: spec.y, invertY: depthPlot, series: drawn, levels, marks, y2,
  }));
  for (const n of notes) {
    figure.append(h("figcaption", { class: "plot-note" }, n));
  }
}

/**
 * The melt-free mantle adiabat of the request's potential temperature with the solidus and
 * liquidus along it, from the solidus-crossings endpoint (adiabat path, so the chosen lithology's
 * own thermodynamic constants), down to somewhat below the onset of melting: {rows, label, note}.
 */
async function adiabatCurve(spec, last) {
  const cfg = spec.adiabat;
  const tp = last.values[cfg.potentialTemperature];
  const lithology = last.values[cfg.lithology];
  if (typeof tp !== "number" || !lithology) {
    return {};
  }
  if (!state.paths.has(SOLIDUS_CROSSINGS)) {
    return { note: `Melt-free adiabat not drawn: this server has no ${SOLIDUS_CROSSINGS} yet.` };
  }
  const onset = pick(last.response, cfg.below);
  const deepest = Math.min(300, Math.max(150, typeof onset === "number" ? Math.ceil(onset * 1.3 / 10) * 10 : 0));
  const water = typeof last.values[cfg.water] === "number" ? last.values[cfg.water] : 0;
  const body = { lithology, path: { adiabat: { potentialTemperatureC: tp, maxDepthKm: deepest, depthStepKm: deepest / 150 } } };
  if (water > 0) {
    body.bulkWaterWtPct = water;
  }
  let res;
  try {
    res = await post(SOLIDUS_CROSSINGS, body);
  } catch (e) {
    return { note: "Melt-free adiabat not drawn: " + (e.message || e) };
  }
  if (!res.ok || !res.body || !Array.isArray(res.body.profile)) {
    return { note: "Melt-free adiabat not drawn: " + (res.body && res.body.detail ? res.body.detail : `HTTP ${res.status}`) };
  }
  return { rows: res.body.profile, label: `melt-free adiabat, Tp ${tp} °C` };
}

function wetLabel(last, waterField) {
  const w = last.values[waterField];
  return typeof w === "number" && w > 0 ? `, ${w} wt% water` : "";
}

/**
 * Solidus and liquidus of the chosen lithology at the plot's pressures, from the melt-fraction
 * endpoint in batch form: {series: [...], note}.
 */
async function solidusCurves(spec, rows, last) {
  const cfg = spec.solidus;
  const lithology = last.values[cfg.lithology];
  if (!lithology) {
    return { series: [] };
  }
  if (!state.paths.has(MELT_FRACTION)) {
    return { series: [], note: `Solidus and liquidus not drawn: this server has no ${MELT_FRACTION} yet.` };
  }
  if (!state.lithologiesFromServer) {
    await loadLithologies(); // a server that asks for a token refused it before one was entered
  }
  const water = typeof last.values[cfg.water] === "number" ? last.values[cfg.water] : 0;
  const info = state.lithologies.find((l) => l.id === lithology);
  const range = info && Array.isArray(info.pressureRangeGPa) ? info.pressureRangeGPa : [0, Infinity];
  let samples = [];
  if (cfg.pressureRangeGPa) {
    const lo = Math.max(cfg.pressureRangeGPa[0], range[0]);
    const hi = Math.min(cfg.pressureRangeGPa[1], range[1]);
    const t = typeof last.values[cfg.temperature] === "number" ? last.values[cfg.temperature] : 1200;
    for (let i = 0; i <= 60; i++) {
      const p = lo + (hi - lo) * i / 60;
      samples.push({ y: p, pressureGPa: p, temperatureC: t });
    }
  } else {
    const temperatureKey = (spec.series[0] || {}).x || "temperatureC";
    const usable = rows.filter((r) => typeof r.pressureGPa === "number" && r.pressureGPa >= range[0]
      && r.pressureGPa <= range[1] && typeof r[spec.y.key] === "number");
    const stride = Math.max(1, Math.ceil(usable.length / 150));
    samples = usable.filter((_, i) => i % stride === 0 || i === usable.length - 1).map((r) => ({
      y: r[spec.y.key], pressureGPa: r.pressureGPa,
      temperatureC: typeof r[temperatureKey] === "number" ? r[temperatureKey] : 1200,
    }));
  }
  if (samples.length === 0) {
    return { series: [], note: "Solidus and liquidus not drawn: no pressures within the model's range." };
  }
  const body = { lithology, points: samples.map((s) => ({ pressureGPa: s.pressureGPa, temperatureC: s.temperatureC })) };
  if (water > 0) {
    body.bulkWaterWtPct = water;
  }
  let res;
  try {
    res = await post(MELT_FRACTION, body);
  } catch (e) {
    return { series: [], note: "Solidus and liquidus not drawn: " + (e.message || e) };
  }
  const results = res.ok && res.body && Array.isArray(res.body.results) ? res.body.results : null;
  if (!results) {
    const why = res.body && res.body.detail ? res.body.detail : `HTTP ${res.status}`;
    return { series: [], note: "Solidus and liquidus not drawn: " + why };
  }
  return {
    series: [
      { label: `solidus (${lithology}${wetLabel(last, cfg.water)})`, role: "solidus",
        points: results.map((r, i) => [r.solidusC, samples[i].y]) },
      { label: "liquidus", role: "liquidus", points: results.map((r, i) => [r.liquidusC, samples[i].y]) },
    ],
  };
}

// ---------------------------------------------------------------- downloads and curl

function csvCell(v) {
  if (v === undefined || v === null) {
    return "";
  }
  const s = typeof v === "object" ? JSON.stringify(v) : String(v);
  return /[",\n\r]/.test(s) ? '"' + s.replace(/"/g, '""') + '"' : s;
}

/** The result as CSV: the tool's main table, or every scalar as field,value rows. */
export function toCsv(tool, response) {
  const rows = rowsOf(response, tool.table);
  if (rows.length) {
    const cols = [];
    const flat = rows.map((r) => {
      const o = {};
      const walk = (obj, prefix) => {
        for (const [k, v] of Object.entries(obj)) {
          const p = prefix ? prefix + "." + k : k;
          if (v !== null && typeof v === "object" && !Array.isArray(v)) {
            walk(v, p);
          } else {
            o[p] = v;
            if (!cols.includes(p)) {
              cols.push(p);
            }
          }
        }
      };
      walk(r, "");
      return o;
    });
    return [cols.join(",")].concat(flat.map((o) => cols.map((c) => csvCell(o[c])).join(","))).join("\n") + "\n";
  }
  const lines = ["field,value"];
  const walk = (obj, prefix) => {
    for (const [k, v] of Object.entries(obj)) {
      const p = prefix ? prefix + "." + k : k;
      if (v !== null && typeof v === "object" && !Array.isArray(v)) {
        walk(v, p);
      } else if (!Array.isArray(v)) {
        lines.push(csvCell(p) + "," + csvCell(v));
      }
    }
  };
  walk(response, "");
  return lines.join("\n") + "\n";
}

function download(last, kind) {
  const text = kind === "csv" ? toCsv(last.tool, last.response) : JSON.stringify(last.response, null, 2) + "\n";
  const blob = new Blob([text], { type: kind === "csv" ? "text/csv" : "application/json" });
  const a = h("a", { href: URL.createObjectURL(blob), download: `tectomelt-${last.tool.id}.${kind}` });
  document.body.append(a);
  a.click();
  setTimeout(() => {
    URL.revokeObjectURL(a.href);
    a.remove();
  }, 1000);
}

function shellQuote(s) {
  return "'" + s.replace(/'/g, "'\\''") + "'";
}

/** A curl command that sends the same request; a token is referenced, never copied. */
export function curlCommand(url, body, withToken) {
  const lines = [`curl -sS -X POST ${shellQuote(url)}`, `  -H 'Content-Type: application/json'`];
  if (withToken) {
    lines.push(`  -H "Authorization: Bearer $TECTOMELT_TOKEN"`);
  }
  lines.push(`  -d ${shellQuote(JSON.stringify(body))}`);
  return lines.join(" \\\n");
}

async function copyCurl(last) {
  const text = curlCommand(last.url, last.body, token() !== "");
  const area = document.getElementById("curl-text");
  const status = document.getElementById("copy-status");
  area.value = text;
  area.hidden = false;
  let copied = false;
  try {
    if (navigator.clipboard && window.isSecureContext) {
      await navigator.clipboard.writeText(text);
      copied = true;
    }
  } catch (e) {
    copied = false;
  }
  if (!copied) {
    area.focus();
    area.select();
    try {
      copied = document.execCommand("copy");
    } catch (e) {
      copied = false;
    }
  }
  status.textContent = copied ? "Copied." : "Select the command below and copy it.";
  if (token()) {
    status.textContent += " It reads the token from $TECTOMELT_TOKEN.";
  }
}

init().catch((e) => {
  document.getElementById("tools").replaceChildren(h("p", { class: "form-error" }, "The page failed to start: " + e.message));
});
