// The page: builds one form per entry of tools.json, calls the API, shows a summary table,
// SVG plots, downloads and a "copy as curl" command. Everything is served by this service.

import { mountPlot, wrapText, PALETTE, OVERLAY_COLOURS, breakJumps, dataDomain, niceScale, saveBlob, shortCitation, interpolate } from "./plot.js";
import { attachSweep, initRuns, isRunsHash, routeRuns } from "./runs.js";
import { analysisBox, compositionPlot } from "./composition.js";

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
  version: "", // the service's version, from /v1/health
  pinned: {}, // tool id -> [run, ...]: results kept for comparison
  plots: [], // mounted plot handles of the result on show
  overlays: {}, // "tool/plot title" -> {lithologies: [ids], isopleths, cpxOut}
};

/** At most this many runs are drawn together in a comparison. */
export const MAX_COMPARED = 6;

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

/** Value at a dotted path ("onset.depthKm"; "profile.last.x" is x of an array's last element), or undefined. */
export function getPath(obj, path) {
  let cur = obj;
  for (const part of path.split(".")) {
    if (part === "last" && Array.isArray(cur)) {
      if (!cur.length) {
        return undefined;
      }
      cur = cur[cur.length - 1];
      continue;
    }
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
  await Promise.all([loadLithologies(), loadVersion(spec)]);
  renderNav();
  watchPlotWidths();
  const wanted = location.hash.replace(/^#/, "");
  const first = config.tools.find((t) => t.id === wanted)
    || config.tools.find((t) => state.paths.has(t.endpoint))
    || config.tools[0];
  if (state.paths.has("/v1/runs")) {
    initRuns({ apiUrl, headers });
  }
  selectTool(first.id);
  // the Runs view (runs.js) owns #/runs and #/runs/{id}: a run's link opens its page
  if (isRunsHash(wanted)) {
    history.replaceState(null, "", "#" + wanted);
    routeRuns();
  }
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

async function loadVersion(spec) {
  const fromSpec = /^\s*version:\s*(\S+)/m.exec(spec);
  state.version = fromSpec ? fromSpec[1] : "";
  try {
    const res = await fetch(apiUrl("/v1/health"), { headers: headers(false) });
    if (res.ok) {
      const body = await res.json();
      if (body && body.version) {
        state.version = String(body.version);
      }
    }
  } catch (e) {
    // keep the spec's version
  }
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
  clearResults();
}

/** Removes the result on show (it no longer belongs to the form's inputs). */
function clearResults() {
  const results = document.getElementById("results");
  results.replaceChildren();
  results.removeAttribute("data-stale");
  state.plots = [];
  state.last = null;
}

/** Marks the result on show as computed from earlier inputs. */
function markStale() {
  const results = document.getElementById("results");
  if (!state.last || results.dataset.stale === "true" || !results.firstChild) {
    return;
  }
  results.dataset.stale = "true";
  results.prepend(h("p", { class: "stale-note", id: "stale-note", role: "status" },
    "The inputs have changed since this result was computed; it does not belong to them. Press Calculate to update it."));
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
    h("button", { type: "button", class: "quiet", id: "reset", onclick: () => {
      renderForm(tool);
      clearResults();
    } }, "Restore defaults")));
  form.addEventListener("submit", (ev) => {
    ev.preventDefault();
    run(tool, form);
  });
  form.addEventListener("change", () => {
    applyVisibility(tool, form);
    markStale();
  });
  form.addEventListener("input", () => markStale());
  box.replaceChildren(form);
  applyVisibility(tool, form);
  if (available && state.paths.has("/v1/runs")) {
    attachSweep(tool, form, () => collect(tool, form));
  }
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
    } else if (f.valueType === "boolean") {
      value = raw === "true";
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

/** A field's label without its parenthesised remarks ("Mantle temperature (optional)" -> "Mantle temperature"). */
function shortLabel(f) {
  return f.label.replace(/\s*\(.*\)\s*$/, "").replace(/^…\s*/, "");
}

/**
 * An API field path in the form's words: "lithosphere.mantleTemperatureC" becomes "Mantle
 * temperature", "depthsKm[0]" becomes "Depths, value 1".
 */
export function fieldWords(tool, path) {
  const visible = tool.fields.filter((f) => f.send !== false);
  const exact = visible.find((f) => f.name === path);
  if (exact) {
    return shortLabel(exact);
  }
  const m = /^(.*)\[(\d+)\](.*)$/.exec(path);
  if (m) {
    const base = visible.find((f) => f.name === m[1]);
    if (base) {
      return `${shortLabel(base)}, value ${Number(m[2]) + 1}${m[3] ? " (" + m[3].replace(/^\./, "") + ")" : ""}`;
    }
  }
  return path;
}

/** Replaces every API field name in an error message by the form's label for it. */
export function inFormWords(tool, message) {
  const names = [...new Set(tool.fields.filter((f) => f.send !== false).map((f) => f.name))]
    .sort((a, b) => b.length - a.length);
  let out = String(message);
  for (const n of names) {
    const re = new RegExp("(^|[^A-Za-z0-9_.])" + n.replace(/[.]/g, "\\.") + "(\\[\\d+\\])?(?![A-Za-z0-9_])", "g");
    out = out.replace(re, (all, pre, idx) => pre + "“" + fieldWords(tool, n + (idx || "")) + "”");
  }
  return out;
}

function showFieldErrors(tool, form, errors) {
  const general = [];
  for (const raw of errors) {
    const err = { field: raw.field, message: inFormWords(tool, raw.message) };
    const name = fieldForError(tool, err.field);
    const visible = name && [...form.querySelectorAll(".field")]
      .find((row) => row.dataset.field === name && !row.hidden);
    if (visible) {
      const span = visible.querySelector(".field-error");
      const text = err.field === name ? err.message : `${fieldWords(tool, err.field)}: ${err.message}`;
      span.textContent = span.textContent ? span.textContent + "; " + text : text;
      visible.classList.add("invalid");
    } else {
      general.push(`${fieldWords(tool, err.field)}: ${err.message}`);
    }
  }
  return general;
}

function showFormError(form, title, lines) {
  const box = form.querySelector("#form-error");
  box.replaceChildren(...[h("strong", {}, title), lines.length ? h("ul", {}, lines.map((l) => h("li", {}, l))) : null]
    .filter((n) => n !== null));
}

// ---------------------------------------------------------------- running a calculation

async function run(tool, form) {
  clearErrors(form);
  const { body, values, errors } = collect(tool, form);
  const results = document.getElementById("results");
  if (errors.length) {
    clearResults();
    results.dataset.state = "failed";
    const general = showFieldErrors(tool, form, errors);
    showFormError(form, "Please correct the marked fields.", general);
    return;
  }
  results.dataset.state = "running";
  const button = form.querySelector("#run");
  button.disabled = true;
  let res;
  try {
    res = await post(tool.endpoint, body);
  } catch (e) {
    clearResults();
    showFormError(form, "The service could not be reached.", [String(e.message || e)]);
    results.dataset.state = "failed";
    button.disabled = false;
    return;
  }
  button.disabled = false;
  if (!res.ok) {
    clearResults();
    results.dataset.state = "failed";
    const p = res.body || {};
    if (res.status === 401) {
      showFormError(form, "This server asks for an access token.", ["Enter it in the access-token box at the top."]);
    } else if (res.status === 404) {
      showFormError(form, `This server does not offer ${tool.endpoint}.`, []);
    } else {
      const general = Array.isArray(p.errors) ? showFieldErrors(tool, form, p.errors) : [];
      showFormError(form, p.title || `HTTP ${res.status}`,
        [p.detail ? inFormWords(tool, p.detail) : res.text.slice(0, 300)].concat(general).filter((x) => x));
    }
    return;
  }
  const last = { tool, body, values, url: apiUrl(tool.endpoint), response: res.body, at: new Date() };
  const cp = tool.counterpart;
  if (cp && cp.when.in.includes(String(values[cp.when.field]))) {
    // the same request with one case switched (e.g. conduction beside convection), shown beside it
    results.dataset.state = "running";
    button.disabled = true;
    last.counterpart = await counterpartRun(tool, body);
    button.disabled = false;
  }
  state.last = last;
  await renderResults(state.last);
}

/** Runs the tool's counterpart request (tools.json "counterpart": set and drop fields): {label, body, response} or {label, error}. */
async function counterpartRun(tool, body) {
  const cp = tool.counterpart;
  const alt = JSON.parse(JSON.stringify(body));
  for (const path of cp.drop || []) {
    const parts = path.split(".");
    const parent = parts.slice(0, -1).reduce((o, k) => (o && typeof o === "object" ? o[k] : undefined), alt);
    if (parent && typeof parent === "object") {
      delete parent[parts[parts.length - 1]];
    }
  }
  for (const [path, v] of Object.entries(cp.set || {})) {
    setPath(alt, path, v);
  }
  try {
    const r = await post(tool.endpoint, alt);
    if (r.ok) {
      return { label: cp.label, body: alt, response: r.body };
    }
    const p = r.body || {};
    return { label: cp.label, body: alt, error: p.detail || p.title || `HTTP ${r.status}` };
  } catch (e) {
    return { label: cp.label, body: alt, error: String(e.message || e) };
  }
}

/** The response a summary row reads: the run's own, or its counterpart's for a "counterpart" row (null if none). */
function rowResponse(row, run) {
  if (!row.counterpart) {
    return run.response;
  }
  return run.counterpart && run.counterpart.response ? run.counterpart.response : null;
}

function rowsOf(response, paths) {
  const rows = pick(response, paths || []);
  return Array.isArray(rows) ? rows : [];
}

function lithologyInfo(id) {
  return state.lithologies.find((l) => l.id === id);
}

/** A lithology's name for legends: "Peridotite (Katz, Spiegelman & Langmuir 2003)", not its id. */
export function lithologyName(id) {
  const l = lithologyInfo(id);
  const name = l && l.name ? l.name : String(id || "");
  return name.replace(/,\s*(dry and hydrous|dry or hydrous|dry)\s*$/i, "").replace(/\s*\((dry|dry or hydrous)\)\s*$/i, "")
    .replace(/\(([^()]*\d{4})\)/, (all, authors) => {
      // "(Katz, Spiegelman & Langmuir 2003)" -> "(Katz et al. 2003)"
      const m = /^(.*?)\s+(\d{4})$/.exec(authors.trim());
      return m ? `(${shortCitation(m[1].replace(/\s*&\s*/g, ", ") + " (" + m[2] + ")").replace(/^(\S+) & (\S+) (\d{4})$/, "$1 & $2 $3")})` : all;
    });
}

/** Whether a summary row applies to this run (e.g. water and clinopyroxene rows only for mantle rock). */
function rowApplies(row, values) {
  const w = row.when;
  if (!w) {
    return true;
  }
  if (w.field && !w.in.includes(String(values[w.field]))) {
    return false; // e.g. the residue's water only for the fractional modes
  }
  const info = lithologyInfo(values[w.lithology]);
  if (!info) {
    return true;
  }
  if (w.kinds && !w.kinds.includes(info.kind)) {
    return false;
  }
  if (w.hydrous !== undefined && Boolean(info.hydrous) !== w.hydrous) {
    return false;
  }
  return true;
}

/** A duration given in kyr, in the unit the trade would write: yr, kyr or Myr. */
export function timeInUnits(kyr) {
  const a = Math.abs(kyr);
  if (a < 1) {
    return { value: kyr * 1000, unit: "yr", digits: a * 1000 >= 100 ? 0 : 1 };
  }
  if (a < 1000) {
    return { value: kyr, unit: "kyr", digits: a >= 100 ? 0 : 1 };
  }
  return { value: kyr / 1000, unit: "Myr", digits: 2 };
}

/** The text, unit and raw value of one summary row for a response, or null when it does not apply. */
function summaryCell(row, response, values) {
  const v = pick(response, row.path);
  if (!rowApplies(row, values)) {
    return null;
  }
  if (v === undefined) {
    // "nullText": what a null answer means (e.g. no water can start melting), shown instead of leaving the row out
    return row.nullText && row.path.some((p) => getPath(response, p) === null)
      ? { text: row.nullText, unit: "", value: null } : null;
  }
  if (row.labels && typeof v === "string" && row.labels[v]) {
    return { text: row.labels[v], unit: "", value: v };
  }
  if (row.requires) {
    const r = pick(response, row.requires);
    if (typeof r === "number" && r <= 0) {
      return { text: "no melt", unit: "", value: v };
    }
  }
  if (row.format === "bool") {
    return { text: v ? "yes" : "no", unit: "", value: v };
  }
  if (row.format === "time-kyr" && typeof v === "number") {
    const t = timeInUnits(v);
    return { text: fmt(t.value, t.digits), unit: t.unit, value: v };
  }
  if (typeof v === "number") {
    return { text: fmt(v * (row.scale || 1), row.digits), unit: row.unit || "", value: v };
  }
  return { text: String(v), unit: row.unit || "", value: v };
}

/** A listing cell: numbers with the column's scale and digits, lithology ids by name, "empty" for a null. */
function listingText(c, v) {
  if (v === null || v === undefined) {
    return c.empty || "";
  }
  if (typeof v === "number") {
    return fmt(v * (c.scale || 1), c.digits);
  }
  return c.format === "lithology" ? lithologyName(v) : String(v);
}

async function renderResults(last) {
  const { tool, response } = last;
  const results = document.getElementById("results");
  results.dataset.state = "drawing";
  results.replaceChildren();
  results.removeAttribute("data-stale");
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

  if (last.counterpart && last.counterpart.error) {
    results.append(h("p", { class: "result-note", id: "counterpart-error" },
      `The ${last.counterpart.label} run for comparison failed: ${last.counterpart.error}`));
  }
  const summary = h("table", { id: "summary", class: "summary" });
  for (const row of tool.summary || []) {
    const source = rowResponse(row, last);
    const cell = source ? summaryCell(row, source, last.values) : null;
    if (!cell) {
      continue;
    }
    const found = row.path.find((p) => getPath(source, p) !== undefined);
    summary.append(h("tr", { "data-path": row.counterpart ? "counterpart:" + found : found },
      h("th", { scope: "row" }, row.label),
      h("td", { class: "value" }, cell.text),
      h("td", { class: "unit" }, cell.unit)));
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
        const v = getPath(r, c.key);
        return h("td", { "data-key": c.key }, listingText(c, v));
      }))));
    results.append(rows.length ? table : h("p", { class: "empty" }, `No ${tool.listing.title.toLowerCase()}.`));
  }

  const compare = h("section", { id: "compare", class: "compare", "aria-label": "Comparison" });
  results.append(compare);
  const plots = h("div", { id: "plots", class: "plots" });
  results.append(plots);

  results.append(h("div", { class: "downloads" },
    h("button", { type: "button", id: "pin", onclick: () => pinCurrent() }, "Pin for comparison"),
    h("button", { type: "button", id: "download-csv", onclick: () => download(last, "csv") }, "Download CSV"),
    h("button", { type: "button", id: "download-json", onclick: () => download(last, "json") }, "Download JSON"),
    h("button", { type: "button", id: "copy-curl", onclick: () => copyCurl(last) }, "Copy as curl"),
    h("label", { class: "density" }, "PNG density ",
      h("select", { id: "png-density" }, [1, 2, 3, 4].map((d) => h("option", { value: d, selected: d === 2 }, `${d}×`)))),
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

  renderCompare(tool);
  await drawFigures(last);
  // the result may have changed the page's layout (a scroll bar): fit the plots before saying done
  await new Promise((r) => requestAnimationFrame(() => r()));
  fitPlotWidths();
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

// ---------------------------------------------------------------- comparison

function sameRun(a, b) {
  return JSON.stringify(a.body) === JSON.stringify(b.body);
}

/** The runs of the current tool drawn together: the pinned ones and the one on show, at most MAX_COMPARED. */
function comparedRuns(tool) {
  const pinned = state.pinned[tool.id] || [];
  const runs = pinned.slice();
  if (state.last && state.last.tool.id === tool.id && !pinned.some((p) => sameRun(p, state.last))) {
    runs.push(state.last);
  }
  return runs.slice(-MAX_COMPARED);
}

/** The fields whose values differ between runs (page-only fields too), in form order. */
function differingFields(tool, runs) {
  const seen = new Set();
  return tool.fields.filter((f) => {
    if (seen.has(f.name)) {
      return false;
    }
    const vals = runs.map((r) => JSON.stringify(r.values[f.name] ?? null));
    const differs = new Set(vals).size > 1;
    if (differs) {
      seen.add(f.name);
    }
    return differs;
  });
}

function valueText(f, v) {
  if (v === undefined || v === null) {
    return "default";
  }
  if (f.type === "lithology") {
    return lithologyName(v);
  }
  if (f.type === "select") {
    const o = (f.options || []).find((x) => String(x.value) === String(v));
    return o ? o.label : String(v);
  }
  if (Array.isArray(v)) {
    return v.map((x) => (typeof x === "object" ? Object.values(x).join(":") : x)).join(", ");
  }
  return String(v);
}

/** What names a run among the others: "Tp 1350 °C" (its values of the differing fields). */
function runLabel(run, differing, index) {
  if (!differing.length) {
    return `run ${index + 1}`;
  }
  return differing.map((f) => `${f.short || shortLabel(f)} ${valueText(f, run.values[f.name])}${f.unit && !["–", ""].includes(f.unit) && typeof run.values[f.name] === "number" ? " " + f.unit : ""}`).join(", ");
}

/** "Tp 1300 / 1350 / 1400 °C": the differing values side by side, for the legend's heading. */
function compareTitle(runs, differing) {
  return "Runs: " + differing.map((f) => {
    const vals = runs.map((r) => valueText(f, r.values[f.name]));
    const unit = f.unit && !["–"].includes(f.unit) && runs.every((r) => typeof r.values[f.name] === "number") ? " " + f.unit : "";
    return `${f.short || shortLabel(f)} ${vals.join(" / ")}${unit}`;
  }).join("; ");
}

function pinCurrent() {
  const last = state.last;
  if (!last) {
    return;
  }
  const list = state.pinned[last.tool.id] || (state.pinned[last.tool.id] = []);
  if (!list.some((p) => sameRun(p, last))) {
    list.push(last);
    while (list.length > MAX_COMPARED) {
      list.shift();
    }
  }
  renderCompare(last.tool);
  drawFigures(last);
}

function unpin(tool, run) {
  state.pinned[tool.id] = (state.pinned[tool.id] || []).filter((p) => p !== run);
  renderCompare(tool);
  if (state.last) {
    drawFigures(state.last);
  }
}

/** The side-by-side table of the compared runs: differing inputs and the key outputs. */
function renderCompare(tool) {
  const box = document.getElementById("compare");
  if (!box) {
    return;
  }
  const runs = comparedRuns(tool);
  const pinned = state.pinned[tool.id] || [];
  const pinButton = document.getElementById("pin");
  if (pinButton) {
    const isPinned = state.last && pinned.some((p) => sameRun(p, state.last));
    pinButton.disabled = Boolean(isPinned);
    pinButton.textContent = isPinned ? "Pinned" : "Pin for comparison";
  }
  if (pinned.length === 0 || runs.length < 2) {
    box.replaceChildren(pinned.length ? h("p", { class: "hint", id: "compare-hint" },
      `${pinned.length} run pinned: change an input and press Calculate to draw it beside the new result (up to ${MAX_COMPARED} runs).`) : "");
    return;
  }
  const differing = differingFields(tool, runs);
  const head = h("tr", { class: "run-head" }, h("th", { scope: "col" }, "Run"), runs.map((r, i) => h("th", { scope: "col", "data-run": i },
    h("span", { class: "swatch", style: `background: ${PALETTE[i % PALETTE.length]}` }), " ",
    runLabel(r, differing, i), r === state.last && !pinned.includes(r) ? " (on show)" : "",
    pinned.includes(r) ? h("button", { type: "button", class: "quiet unpin", onclick: () => unpin(tool, r),
      "aria-label": "Unpin " + runLabel(r, differing, i) }, "Unpin") : null)));
  const rows = [];
  for (const f of differing) {
    rows.push(h("tr", { class: "input-row", "data-field": f.name }, h("th", { scope: "row" }, shortLabel(f) + (f.unit ? ` (${f.unit})` : "")),
      runs.map((r) => h("td", {}, valueText(f, r.values[f.name])))));
  }
  for (const row of tool.summary || []) {
    const cells = runs.map((r) => (rowResponse(row, r) ? summaryCell(row, rowResponse(row, r), r.values) : null));
    if (cells.every((c) => c === null)) {
      continue;
    }
    const unit = (cells.find((c) => c && c.unit) || {}).unit;
    rows.push(h("tr", { class: "output-row", "data-path": row.path[0] }, h("th", { scope: "row" }, row.label + (unit ? ` (${unit})` : "")),
      cells.map((c) => h("td", { class: "value" }, c ? c.text : "–"))));
  }
  box.replaceChildren(h("h3", {}, `Comparison of ${runs.length} runs`),
    h("table", { id: "compare-table", class: "compare-table" }, h("caption", { class: "visually-hidden" }, "Differing inputs and key outputs of the compared runs"),
      head, rows),
    h("p", { class: "actions-inline" }, h("button", { type: "button", class: "quiet", id: "compare-clear", onclick: () => {
      state.pinned[tool.id] = [];
      renderCompare(tool);
      if (state.last) {
        drawFigures(state.last);
      }
    } }, "Clear the comparison")));
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

const EXTRA_KEYS = [["temperatureC", "T", "°C", 1, 0], ["meltFraction", "F", "%", 100, 1], ["pressureGPa", "P", "GPa", 1, 2]];

function extrasOf(r, skip) {
  return EXTRA_KEYS.filter(([k]) => !skip.includes(k) && typeof r[k] === "number")
    .map(([k, name, unit, scale, d]) => `${name} ${(r[k] * scale).toFixed(d)} ${unit}`).join(", ");
}

/** The curves a plot draws from one run's response (its data, not the solidus or adiabat overlays). */
function dataSeries(spec, run) {
  const rows = rowsOf(run.response, spec.data);
  const depthPlot = spec.type === "depth";
  const series = [];
  for (const s of spec.series) {
    let points = rows.map((r) => {
      const keep = !s.where || (typeof r[s.where] === "number" && r[s.where] > 0);
      const xv = depthPlot ? r[s.x] : r[spec.x.key];
      const yv = depthPlot ? r[spec.y.key] : r[s.y];
      if (!keep || typeof xv !== "number" || typeof yv !== "number") {
        return [NaN, NaN];
      }
      return depthPlot ? [xv * (s.scale || 1), yv] : [xv, yv * (s.scale || 1)];
    });
    if (s.breakAtJumps) {
      points = breakJumps(points, depthPlot ? 0 : 1);
    }
    const extras = s.breakAtJumps ? undefined : rows.map((r) => extrasOf(r, [depthPlot ? s.x : s.y, spec.y.key, spec.x.key, spec.y2 ? spec.y2.key : ""]));
    series.push({ label: s.label, role: s.role, dots: s.dots, points, extras });
    if (s.counterpart && run.counterpart && run.counterpart.response) {
      // the same quantity from the counterpart run (e.g. the conducting case beside the convecting one)
      const other = rowsOf(run.counterpart.response, spec.data).map((r) => {
        const xv = depthPlot ? r[s.x] : r[spec.x.key];
        const yv = depthPlot ? r[spec.y.key] : r[s.y];
        if (typeof xv !== "number" || typeof yv !== "number") {
          return [NaN, NaN];
        }
        return depthPlot ? [xv * (s.scale || 1), yv] : [xv, yv * (s.scale || 1)];
      });
      series.push({ label: s.counterpart.label, role: s.counterpart.role, points: other, counterpart: true });
    }
  }
  if (spec.seriesFrom) {
    // one curve per element of an array (e.g. a profile per requested time), in sequence colours
    const sf = spec.seriesFrom;
    rowsOf(run.response, sf.data).forEach((e, i) => {
      const pts = Array.isArray(e[sf.points]) ? e[sf.points] : [];
      series.push({
        label: sf.label.replace(/\{(\w+)\}/g, (_, k) => (typeof e[k] === "number" ? fmt(e[k], Number.isInteger(e[k]) ? 0 : 1) : String(e[k] ?? ""))),
        role: `seq-${i % 6}`,
        points: pts.map((p) => [typeof p[sf.x] === "number" ? p[sf.x] * (sf.scale || 1) : NaN,
          typeof p[spec.y.key] === "number" ? p[spec.y.key] : NaN]),
      });
    });
  }
  return series;
}

/**
 * The depths a plot's curves are "affected" over (where they leave their own typical value, e.g.
 * melt above zero or a thermal halo around a sill), padded; null when nothing stands out.
 */
export function affectedDepths(series) {
  let lo = Infinity, hi = -Infinity, xmin = Infinity, xmax = -Infinity;
  for (const s of series) {
    for (const [x] of s.points) {
      if (isFinite(x)) {
        xmin = Math.min(xmin, x);
        xmax = Math.max(xmax, x);
      }
    }
  }
  const tol = 0.02 * (xmax - xmin);
  for (const s of series) {
    const xs = s.points.map((p) => p[0]).filter((x) => isFinite(x)).sort((a, b) => a - b);
    if (!xs.length) {
      continue;
    }
    const typical = xs[Math.floor(xs.length / 2)];
    for (const [x, y] of s.points) {
      if (isFinite(x) && isFinite(y) && Math.abs(x - typical) > tol) {
        lo = Math.min(lo, y);
        hi = Math.max(hi, y);
      }
    }
  }
  if (!(hi >= lo)) {
    return null;
  }
  const pad = Math.max(1, 0.25 * (hi - lo));
  return [Math.max(0, lo - pad), hi + pad];
}

function overlayKey(tool, spec) {
  return tool.id + "/" + spec.title;
}

function overlaysFor(tool, spec) {
  const k = overlayKey(tool, spec);
  if (!state.overlays[k]) {
    state.overlays[k] = { lithologies: [], isopleths: true, cpxOut: true };
  }
  return state.overlays[k];
}

/** Builds what one figure draws for the result on show (and the compared runs): {plot, notes, pressurePairs}. */
async function figureSpec(spec, last, runs) {
  const depthPlot = spec.type === "depth";
  const compared = runs.length > 1;
  const differing = compared ? differingFields(last.tool, runs) : [];
  if (spec.type === "composition") {
    // a normalised trace-element diagram (composition.js) with the user's pasted analysis over it
    const c = compositionPlot(last.response, runs.map((run, i) => ({ response: run.response, label: runLabel(run, differing, i) })));
    c.plot.legendTitle = compared ? compareTitle(runs, differing) : undefined;
    return { plot: c.plot, notes: c.notes, drawn: c.plot.series, marks: [], hasGrid: false, pressurePairs: null, analysis: true };
  }
  const series = [];
  runs.forEach((run, i) => {
    const own = dataSeries(spec, run);
    if (!compared) {
      series.push(...own);
      return;
    }
    const name = runLabel(run, differing, i);
    for (const s of own) {
      series.push(Object.assign(s, {
        label: own.length > 1 ? `${s.label}, ${name}` : name,
        color: PALETTE[i % PALETTE.length], run: i,
      }));
    }
  });
  const rows = rowsOf(last.response, spec.data);
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
        extra.unshift({ label: `solidus, ${lithologyName(last.values[spec.adiabat.lithology])}${wetLabel(last, spec.adiabat.water)}`,
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
  let grid = null;
  if (spec.solidus && !solidusDrawn) {
    const extra = await solidusCurves(spec, rows, last);
    series.unshift(...extra.series);
    if (extra.note) {
      notes.push(extra.note);
    }
    grid = extra.grid || null;
  }
  // depth ↔ pressure pairs of this plot, for the second axis and for extra melting curves
  let pressurePairs = null;
  const pkey = spec.y2 ? spec.y2.key : "pressureGPa";
  if (spec.y.key === "pressureGPa") {
    pressurePairs = "identity";
  } else {
    const pairs = axisRows.filter((r) => typeof r[spec.y.key] === "number" && typeof r[pkey] === "number")
      .map((r) => [r[spec.y.key], r[pkey]]);
    pressurePairs = pairs.length > 1 ? pairs.sort((a, b) => a[0] - b[0]) : null;
  }
  const overlays = overlaysFor(last.tool, spec);
  if (grid) {
    if (overlays.isopleths) {
      series.push(...grid.isopleths);
    }
    if (overlays.cpxOut && grid.cpxOut) {
      series.push(grid.cpxOut);
    }
  }
  if (overlays.lithologies.length && pressurePairs && isTemperaturePlot(spec)) {
    const extra = await extraSolidi(overlays.lithologies, pressurePairs, spec);
    series.push(...extra.series);
    notes.push(...extra.notes);
  }
  let y2;
  if (spec.y2 && Array.isArray(pressurePairs)) {
    y2 = { label: spec.y2.label, unit: spec.y2.unit, pairs: pressurePairs };
  }
  const drawn = series.filter((s) => s.points.some(([x, y]) => isFinite(x) && isFinite(y)));
  const plot = {
    title: spec.title, x: Object.assign({}, spec.x), y: Object.assign({}, spec.y), invertY: depthPlot,
    series: drawn, levels, marks, y2, legendTitle: compared ? compareTitle(runs, differing) : undefined,
  };
  if (spec.zoom === "affected") {
    const own = drawn.filter((s) => s.role && s.role.startsWith("seq-") || s.run !== undefined || spec.series.some((t) => t.label === s.label));
    const range = affectedDepths(own.length ? own : drawn);
    if (range) {
      plot.y.domain = range;
      plot.zoomed = true;
    }
  }
  return { plot, notes, drawn, marks, hasGrid: Boolean(grid), pressurePairs };
}

function isTemperaturePlot(spec) {
  return spec.type === "depth" && /temperature/i.test(spec.x.label);
}

/** Every figure of the result: built, given a shared depth axis, mounted with its tools. */
async function drawFigures(last) {
  const plotsBox = document.getElementById("plots");
  if (!plotsBox) {
    return;
  }
  const token = {};
  state.drawing = token;
  const runs = comparedRuns(last.tool);
  const built = [];
  for (const spec of last.tool.plots || []) {
    built.push({ spec, fig: await figureSpec(spec, last, runs.length ? runs : [last]) });
  }
  if (state.drawing !== token) {
    return; // a newer drawing started meanwhile
  }
  // panels of one result share their depth axis (a plot zoomed to the affected depths keeps its own)
  const groups = {};
  for (const b of built) {
    if (b.spec.type === "depth" && !b.fig.plot.zoomed && b.fig.drawn.length) {
      (groups[b.spec.y.key] = groups[b.spec.y.key] || []).push(b.fig.plot);
    }
  }
  for (const plots of Object.values(groups)) {
    if (plots.length > 1) {
      const doms = plots.map((p) => dataDomain(p).y);
      const range = [Math.min(...doms.map((d) => d[0])), Math.max(...doms.map((d) => d[1]))];
      const s = niceScale(range[0], range[1], 6);
      for (const p of plots) {
        p.y.domain = [s.lo, s.hi];
      }
    }
  }
  plotsBox.replaceChildren();
  state.plots = [];
  for (const { spec, fig } of built) {
    const figure = h("figure", { class: "figure", "data-plot": spec.title });
    plotsBox.append(figure);
    if (fig.drawn.length === 0 && fig.marks.every((mk) => !isFinite(mk.x))) {
      figure.append(h("p", { class: "empty" }, `${spec.title}: nothing to draw (no melting or no profile returned).`));
      for (const n of fig.notes) {
        figure.append(h("figcaption", { class: "plot-note" }, n));
      }
      continue;
    }
    mountFigure(figure, spec, fig, last);
  }
  document.getElementById("results").dataset.plots = String(state.plots.length);
}

/** Draws one figure again (its overlays changed), keeping its shared depth axis and its tools. */
async function redrawFigure(spec) {
  const entry = state.plots.find((p) => p.spec === spec);
  const last = state.last;
  if (!entry || !last) {
    return;
  }
  const token = {};
  entry.pending = token;
  const fig = await figureSpec(spec, last, comparedRuns(last.tool).length ? comparedRuns(last.tool) : [last]);
  if (entry.pending !== token || state.last !== last) {
    return; // a later change of the overlays is being drawn
  }
  if (entry.sharedY && !fig.plot.zoomed) {
    fig.plot.y.domain = entry.sharedY;
  }
  entry.holder.replaceChildren();
  const width = Math.floor(entry.figure.clientWidth || 480);
  entry.handle = mountPlot(entry.holder, fig.plot, { width, readout: entry.readout, titleLines: titleRoom(last.tool, width) });
  entry.notes.replaceChildren(...fig.notes.map((n) => h("figcaption", { class: "plot-note" }, n)));
  entry.figure.dataset.overlays = String(fig.plot.series.filter((x) => x.role === "extra").length);
  if (entry.analysis) {
    entry.analysis.refresh();
    entry.figure.dataset.analysis = String(fig.plot.series.filter((x) => x.analysis).length);
  }
}

/** Title lines to leave room for, so that the frames of panels side by side stay level. */
function titleRoom(tool, width) {
  return Math.min(2, Math.max(1, ...(tool.plots || []).map((p) => wrapText(p.title, 14, width - 72).length)));
}

function slug(s) {
  return String(s).toLowerCase().replace(/[^a-z0-9]+/g, "-").replace(/^-|-$/g, "");
}

/** The small provenance line of an exported figure: service version, models, date. */
export function provenanceLine(last) {
  const p = last.response && last.response.provenance;
  let version = state.version;
  let models = (Array.isArray(last.response.models) ? last.response.models : []).map((m) => shortCitation(m.citation || m.id));
  if (p && typeof p === "object") {
    version = p.serviceVersion || p.version || version;
    if (Array.isArray(p.models) && p.models.length) {
      models = p.models.map((m) => (typeof m === "string" ? m : shortCitation(m.citation || m.id || "")));
    }
  }
  const when = (last.at || new Date()).toISOString().slice(0, 10);
  return `tectomelt ${version || "?"} · ${last.tool.endpoint} · ${when} · models: ${[...new Set(models)].join("; ") || "none"}`;
}

function mountFigure(figure, spec, fig, last) {
  const holder = h("div", { class: "plot-holder" });
  const readout = h("output", { class: "readout", "aria-live": "off",
    "data-hint": "Point at the plot for its values; drag to pan, shift+drag to zoom a box, double-click for the full view." });
  const tools = h("div", { class: "plot-tools", role: "toolbar", "aria-label": spec.title + " tools" });
  const notes = h("div", { class: "plot-notes" });
  figure.append(tools, holder, readout);
  const width = Math.floor(figure.clientWidth || 480);
  const handle = mountPlot(holder, fig.plot, { width, readout, titleLines: titleRoom(last.tool, width) });
  const entry = { figure, handle, spec, holder, readout, notes,
    sharedY: spec.type === "depth" && !fig.plot.zoomed ? fig.plot.y.domain : null };
  state.plots.push(entry);
  const file = `tectomelt-${last.tool.id}-${slug(spec.title)}`;
  const density = () => Number((document.getElementById("png-density") || {}).value || 2);
  tools.append(
    h("button", { type: "button", class: "quiet small", "data-act": "zoom-in", onclick: () => handle.zoom(1.5) }, "Zoom in"),
    h("button", { type: "button", class: "quiet small", "data-act": "zoom-out", onclick: () => handle.zoom(1 / 1.5) }, "Zoom out"),
    h("button", { type: "button", class: "quiet small", "data-act": "reset", onclick: () => handle.reset() }, "Full view"),
    h("button", { type: "button", class: "quiet small", "data-act": "svg", onclick: () => {
      const mk = handle.markup(provenanceLine(last));
      saveBlob(new Blob([mk.text], { type: "image/svg+xml" }), file + ".svg");
    } }, "SVG"),
    h("button", { type: "button", class: "quiet small", "data-act": "png", onclick: async () => {
      try {
        saveBlob(await handle.png(provenanceLine(last), density()), file + ".png");
      } catch (e) {
        readout.textContent = String(e.message || e);
      }
    } }, "PNG"));
  const chooser = overlayChooser(spec, fig, last);
  if (chooser) {
    figure.append(chooser);
  }
  figure.append(notes);
  if (fig.analysis) {
    entry.analysis = analysisBox(() => redrawFigure(spec), h);
    figure.append(entry.analysis);
    figure.dataset.analysis = String(fig.plot.series.filter((x) => x.analysis).length);
  }
  notes.append(...fig.notes.map((n) => h("figcaption", { class: "plot-note" }, n)));
}

/** Check boxes for extra melting curves: other lithologies' solidi, F isopleths, clinopyroxene-out. */
function overlayChooser(spec, fig, last) {
  const tool = last.tool;
  const o = overlaysFor(tool, spec);
  const redraw = () => redrawFigure(spec);
  const boxes = [];
  if (fig.hasGrid) {
    boxes.push(h("label", {}, h("input", { type: "checkbox", "data-overlay": "isopleths", checked: o.isopleths,
      onchange: (ev) => {
        o.isopleths = ev.target.checked;
        redraw();
      } }), " melt-fraction isopleths"));
    const info = lithologyInfo(last.values[spec.solidus.lithology]);
    if (!info || info.kind === "mantle") {
      boxes.push(h("label", {}, h("input", { type: "checkbox", "data-overlay": "cpx-out", checked: o.cpxOut,
        onchange: (ev) => {
          o.cpxOut = ev.target.checked;
          redraw();
        } }), " clinopyroxene-out curve"));
    }
  }
  if (fig.pressurePairs && isTemperaturePlot(spec) && state.paths.has(MELT_FRACTION)) {
    const own = [spec.solidus && last.values[spec.solidus.lithology], spec.adiabat && last.values[spec.adiabat.lithology]];
    for (const l of state.lithologies.filter((x) => !own.includes(x.id))) {
      boxes.push(h("label", {}, h("input", { type: "checkbox", "data-overlay": "solidus", value: l.id,
        checked: o.lithologies.includes(l.id), onchange: (ev) => {
          o.lithologies = ev.target.checked ? o.lithologies.concat(l.id) : o.lithologies.filter((x) => x !== l.id);
          redraw();
        } }), " solidus of " + lithologyName(l.id)));
    }
  }
  if (!boxes.length) {
    return null;
  }
  const open = o.lithologies.length > 0 || fig.hasGrid;
  return h("details", { class: "overlays", open }, h("summary", {}, "Melting curves to draw"),
    h("div", { class: "overlay-list" }, boxes));
}

/** Solidi of other lithologies at the plot's pressures (within each one's range): {series, notes}. */
async function extraSolidi(ids, pairs, spec) {
  const series = [], notes = [];
  const jobs = ids.map(async (id, k) => {
    const info = lithologyInfo(id);
    const range = info && Array.isArray(info.pressureRangeGPa) ? info.pressureRangeGPa : [0, Infinity];
    let samples;
    if (pairs === "identity") {
      samples = [];
      for (let i = 0; i <= 40; i++) {
        const p = range[0] + (Math.min(range[1], 6) - range[0]) * i / 40;
        samples.push({ y: p, p });
      }
    } else {
      const pmax = Math.max(...pairs.map((q) => q[1]));
      const lo = range[0], hi = Math.min(range[1], pmax);
      const inverse = pairs.map(([a, b]) => [b, a]);
      samples = [];
      for (let i = 0; i <= 40 && hi > lo; i++) {
        const p = lo + (hi - lo) * i / 40;
        const y = interpolate(inverse, p);
        if (isFinite(y)) {
          samples.push({ y, p });
        }
      }
    }
    if (!samples.length) {
      notes.push(`Solidus of ${lithologyName(id)} not drawn: its model covers ${range[0]}–${range[1]} GPa, outside this plot.`);
      return;
    }
    const { results, error } = await meltBatch(id, 0, samples.map((s) => ({ pressureGPa: s.p, temperatureC: 800 })));
    if (!results) {
      notes.push(`Solidus of ${lithologyName(id)} not drawn: ${error}`);
      return;
    }
    series[k] = { label: `solidus, ${lithologyName(id)}`, role: "extra", color: OVERLAY_COLOURS[k % OVERLAY_COLOURS.length],
      points: results.map((r, i) => [r.solidusC, samples[i].y]) };
  });
  await Promise.all(jobs);
  return { series: series.filter(Boolean), notes };
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
 * One batch call of the melt-fraction endpoint: {results} (one per point, in order) or {error}
 * saying why there are none.
 */
async function meltBatch(lithology, water, points) {
  const body = { lithology, points };
  if (water > 0) {
    body.bulkWaterWtPct = water;
  }
  let res;
  try {
    res = await post(MELT_FRACTION, body);
  } catch (e) {
    return { error: String(e.message || e) };
  }
  if (res.ok && res.body && Array.isArray(res.body.results)) {
    return { results: res.body.results };
  }
  return { error: res.body && res.body.detail ? res.body.detail : `HTTP ${res.status}` };
}

/** Where along a row of increasing temperatures a quantity first reaches `level` (linear), or NaN. */
function firstCrossing(temps, vals, level) {
  for (let i = 1; i < temps.length; i++) {
    if (vals[i - 1] < level && vals[i] >= level) {
      return temps[i - 1] + (temps[i] - temps[i - 1]) * (level - vals[i - 1]) / (vals[i] - vals[i - 1]);
    }
  }
  return NaN;
}

/**
 * Solidus and liquidus of the chosen lithology at the plot's pressures, from the melt-fraction
 * endpoint in batch form: {series: [...], note, grid}. On a P–T diagram (pressureRangeGPa) it also
 * samples a P–T grid in one batch for the F isopleths and the clinopyroxene-out curve.
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
  const info = lithologyInfo(lithology);
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
  const { results, error } = await meltBatch(lithology, water,
    samples.map((s) => ({ pressureGPa: s.pressureGPa, temperatureC: s.temperatureC })));
  if (!results) {
    return { series: [], note: "Solidus and liquidus not drawn: " + error };
  }
  const name = lithologyName(lithology);
  const out = [{ label: `solidus, ${name}${wetLabel(last, cfg.water)}`, role: "solidus",
    points: results.map((r, i) => [r.solidusC, samples[i].y]) }];
  if (results.some((r) => typeof r.liquidusC === "number")) {
    out.push({ label: "liquidus", role: "liquidus", points: results.map((r, i) => [typeof r.liquidusC === "number" ? r.liquidusC : NaN, samples[i].y]) });
  }
  const grid = cfg.pressureRangeGPa ? await meltGrid(lithology, water, samples, results) : null;
  return { series: out, grid };
}

/** F isopleths and the clinopyroxene-out curve on a P–T diagram, from one batch over a grid. */
async function meltGrid(lithology, water, samples, edge) {
  const solidi = edge.map((r) => r.solidusC).filter((x) => isFinite(x));
  const liquidi = edge.map((r) => r.liquidusC).filter((x) => typeof x === "number");
  const tLo = Math.floor((Math.min(...solidi) - 20) / 10) * 10;
  const tHi = liquidi.length ? Math.max(...liquidi) : Math.max(...solidi) + 400;
  const nT = 90, ps = samples.filter((_, i) => i % 3 === 0).map((s) => s.pressureGPa);
  const temps = [];
  for (let j = 0; j <= nT; j++) {
    temps.push(tLo + (tHi - tLo) * j / nT);
  }
  const points = [];
  for (const p of ps) {
    for (const t of temps) {
      points.push({ pressureGPa: p, temperatureC: t });
    }
  }
  const { results } = await meltBatch(lithology, water, points);
  if (!results) {
    return null;
  }
  const levels = [0.1, 0.2, 0.3, 0.4, 0.5];
  const isopleths = [];
  const rowsF = ps.map((_, i) => results.slice(i * temps.length, (i + 1) * temps.length));
  levels.forEach((lv, k) => {
    const pts = ps.map((p, i) => [firstCrossing(temps, rowsF[i].map((r) => r.meltFraction), lv), p]);
    if (pts.some(([x]) => isFinite(x))) {
      isopleths.push({ label: k === 0 ? `melt fraction ${levels.map((l) => l * 100).join(", ")} %` : `F ${lv * 100} %`,
        role: "isopleth", points: pts, legend: k === 0, isopleth: lv });
    }
  });
  let cpxOut = null;
  const cpx = ps.map((p, i) => [firstCrossing(temps, rowsF[i].map((r) => (r.cpxExhausted ? 1 : 0)), 0.5), p]);
  if (cpx.some(([x]) => isFinite(x))) {
    cpxOut = { label: "clinopyroxene out", role: "cpx-out", points: cpx };
  }
  return { isopleths, cpxOut };
}

/** Redraws every plot whose figure changed width (text stays at its size). */
function fitPlotWidths() {
  if (window.matchMedia && window.matchMedia("print").matches) {
    return; // a printed page scales the figures as drawn
  }
  for (const { figure, handle } of state.plots) {
    const w = Math.floor(figure.clientWidth);
    if (w > 0 && Math.abs(w - handle.svg.frame.W) > 2) {
      handle.redraw(w, { titleLines: state.last ? titleRoom(state.last.tool, w) : 1 });
    }
  }
}

/** Redraws the plots at their new widths when the page is resized (text stays at its size). */
function watchPlotWidths() {
  if (typeof ResizeObserver === "undefined") {
    return;
  }
  let pending = null;
  const ro = new ResizeObserver(() => {
    clearTimeout(pending);
    pending = setTimeout(() => {
      fitPlotWidths();
    }, 80);
  });
  ro.observe(document.getElementById("results"));
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

async function download(last, kind) {
  const name = `tectomelt-${last.tool.id}.${kind}`;
  if (kind === "csv" && last.tool.csv === "service") {
    // the service's own CSV of the same request (Accept: text/csv), e.g. one column per element
    const status = document.getElementById("copy-status");
    try {
      const res = await fetch(apiUrl(last.tool.endpoint), { method: "POST", body: JSON.stringify(last.body),
        headers: Object.assign(headers(true), { Accept: "text/csv" }) });
      const text = await res.text();
      if (!res.ok || !/text\/csv/.test(res.headers.get("Content-Type") || "")) {
        throw new Error(`HTTP ${res.status}`);
      }
      saveBlob(new Blob([text], { type: "text/csv" }), name);
      status.textContent = "";
    } catch (e) {
      status.textContent = "The CSV could not be fetched from the service: " + String(e.message || e);
    }
    return;
  }
  const text = kind === "csv" ? toCsv(last.tool, last.response) : JSON.stringify(last.response, null, 2) + "\n";
  saveBlob(new Blob([text], { type: kind === "csv" ? "text/csv" : "application/json" }), name);
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
