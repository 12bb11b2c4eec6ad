// The normalised trace-element diagram of POST /v1/melt-composition: the pooled melt and a few
// instantaneous melts on a log axis, elements along a categorical axis in diagram order, and an
// analysis the user pastes, normalised by the same reference and drawn over them.
//
//   compositionPlot(response, runs, analysis)  the plot spec (for plot.js) and its notes
//   parseAnalysis(text, elements)             pasted lines -> {values, problems}
//   normaliseAnalysis(values, reference)      ppm -> multiples of the reference
//   analysisBox(onChange)                     the paste box (its text survives a new result)
//
// app.js calls these for a plot of type "composition" in tools.json.

import { OVERLAY_COLOURS, PALETTE, fmtValue } from "./plot.js";

/**
 * The order of an extended normalised diagram: by decreasing incompatibility in mantle melting,
 * the rare-earth elements in atomic order with Sr, Zr, Hf, Ti and Y among them (a convention of
 * the trade; common practice). The same order as the engine's Element enum and the spec's
 * `elements` default, which PageBrowserTest compares against.
 */
export const DIAGRAM_ORDER = ["Rb", "Ba", "Th", "U", "Nb", "Ta", "La", "Ce", "Pr", "Sr", "Nd", "Zr", "Hf", "Sm", "Eu",
  "Ti", "Gd", "Tb", "Dy", "Ho", "Y", "Er", "Tm", "Yb", "Lu"];

/** How many instantaneous melts (from the onset up to the top) the diagram draws beside the pooled melt. */
export const INSTANTANEOUS_CURVES = 4;

/** Decades shown below the highest value: a depleted late fractional melt would otherwise squash the rest. */
export const DECADES_SHOWN = 4;

const REFERENCE_NAMES = {
  "ci-chondrite-sun-mcdonough1989": "CI chondrite",
  "primitive-mantle-sun-mcdonough1989": "primitive mantle",
};

/** The pasted text, kept while results come and go, and its parse against the diagram on show. */
const pasted = { text: "", parsed: null };

/** The elements of a response in diagram order (whatever order they were asked for in). */
export function diagramElements(elements) {
  const known = DIAGRAM_ORDER.filter((e) => elements.includes(e));
  return known.concat(elements.filter((e) => !DIAGRAM_ORDER.includes(e)));
}

/** The element a written symbol means ("la", "LA", "La" -> "La"), or null. */
function symbolOf(word) {
  const w = String(word).trim();
  if (!/^[A-Za-z]{1,2}$/.test(w)) {
    return null;
  }
  const s = w.charAt(0).toUpperCase() + w.slice(1).toLowerCase();
  return DIAGRAM_ORDER.includes(s) ? s : null;
}

function numberOf(word) {
  const w = String(word).trim();
  return /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(w) ? Number(w) : NaN;
}

/**
 * Reads a pasted analysis in ppm: one element per line ("La 3.2", "La,3.2", "La: 3.2", "La 3.2
 * ppm", tab-separated from a spreadsheet), an optional header line ("element,ppm"), lines starting
 * with # as comments; or two lines, element symbols across and their values below. Every line
 * that cannot be used is reported with the reason; nothing is dropped silently.
 * @param elements the elements on the diagram (an element outside them is reported, not drawn)
 * @returns {values: {symbol: ppm}, problems: [{line, text, reason}]}
 */
export function parseAnalysis(text, elements) {
  const values = {};
  const problems = [];
  const lines = String(text || "").split(/\r?\n/).map((t, i) => ({ line: i + 1, text: t.trim() }))
    .filter((l) => l.text !== "" && !l.text.startsWith("#"));
  const split = (t) => t.split(/[\s,;:=\t]+/).filter((w) => w !== "");
  let pairs = [];
  // across: a line of symbols and a line of as many numbers
  if (lines.length >= 2) {
    const head = split(lines[0].text), vals = split(lines[1].text);
    if (head.length >= 2 && head.every((w) => symbolOf(w)) && vals.length === head.length) {
      pairs = head.map((w, k) => ({ line: lines[1].line, text: `${w} ${vals[k]}`, symbol: w, value: vals[k], extra: [] }));
      lines.slice(2).forEach((l) => problems.push({ line: l.line, text: l.text,
        reason: "the analysis was read across (symbols on one line, values below); this further line is not used" }));
    }
  }
  if (!pairs.length) {
    lines.forEach((l, k) => {
      const w = split(l.text);
      if (k === 0 && w.every((x) => !isFinite(numberOf(x))) && w.some((x) => /^(element|elements|symbol|ppm|name|value|conc)/i.test(x))) {
        return; // a header line
      }
      pairs.push({ line: l.line, text: l.text, symbol: w[0], value: w[1], extra: w.slice(2) });
    });
  }
  for (const p of pairs) {
    const bad = (reason) => problems.push({ line: p.line, text: p.text, reason });
    const s = symbolOf(p.symbol);
    if (!s) {
      bad(`“${p.symbol}” is not one of the elements the service models (${DIAGRAM_ORDER.join(", ")})`);
      continue;
    }
    if (p.value === undefined) {
      bad(`no value after ${s}; write the element and its concentration in ppm, e.g. “${s} 3.2”`);
      continue;
    }
    if (p.extra.length && !(p.extra.length === 1 && /^ppm$/i.test(p.extra[0]))) {
      bad(`more than an element and one value in ppm (“${p.extra.join(" ")}” left over)`);
      continue;
    }
    if (/^</.test(p.value)) {
      bad(`${s} is below a detection limit (${p.value}); it cannot be drawn on a log axis`);
      continue;
    }
    const v = numberOf(p.value);
    if (!isFinite(v)) {
      bad(`“${p.value}” is not a number`);
      continue;
    }
    if (!(v > 0)) {
      bad(`${s} ${p.value}: a concentration must be above 0 ppm to be drawn on a log axis`);
      continue;
    }
    if (s in values) {
      bad(`${s} is given twice; the first value (${values[s]} ppm) is kept`);
      continue;
    }
    if (elements && !elements.includes(s)) {
      bad(`${s} was not computed for this result (not among the elements asked for), so it has no place on the diagram`);
      continue;
    }
    values[s] = v;
  }
  return { values, problems };
}

/** Divides each concentration by the reference's (both ppm); elements without a reference are left out. */
export function normaliseAnalysis(values, reference) {
  const out = {};
  for (const [s, v] of Object.entries(values)) {
    if (reference && typeof reference[s] === "number" && reference[s] > 0) {
      out[s] = v / reference[s];
    }
  }
  return out;
}

function pointsOf(categories, byElement) {
  return categories.map((s, i) => {
    const v = byElement ? byElement[s] : undefined;
    return [i, typeof v === "number" && v > 0 ? v : NaN];
  });
}

/** The profile points whose instantaneous melts are drawn: the onset, the top and evenly between. */
export function instantaneousPicks(profile, n) {
  const melting = profile.map((p, i) => ({ p, i })).filter(({ p }) => p.instantaneousNormalised);
  if (melting.length <= n) {
    return melting.map(({ i }) => i);
  }
  const out = [];
  for (let k = 0; k < n; k++) {
    out.push(melting[Math.round(k * (melting.length - 1) / (n - 1))].i);
  }
  return [...new Set(out)];
}

/** The reference's name for the axis title ("CI chondrite"). */
export function referenceName(response) {
  const t = (response.tables || []).find((x) => x.kind === "normalisation");
  return t ? (REFERENCE_NAMES[t.id] || t.id) : "reference";
}

/**
 * The diagram for a result (and, for a comparison, the pooled melts of the pinned runs).
 * @param response the melt-composition response on show
 * @param runs the runs compared ([] or one for a single result): [{response, label}]
 * @returns {plot, notes, analysis: {values, problems, shown}}
 */
export function compositionPlot(response, runs) {
  const categories = diagramElements(response.elements || []);
  const ref = referenceName(response);
  const series = [];
  const notes = [];
  const compared = runs.length > 1;
  if (compared) {
    runs.forEach((run, i) => {
      const p = run.response.pooled;
      series.push({ label: `pooled melt, ${run.label}`, role: "path", color: PALETTE[i % PALETTE.length], dots: true, run: i,
        points: pointsOf(categories, p ? p.meltNormalised : null) });
    });
  } else {
    const profile = Array.isArray(response.profile) ? response.profile : [];
    const picks = instantaneousPicks(profile, INSTANTANEOUS_CURVES);
    picks.forEach((idx, k) => {
      const p = profile[idx];
      series.push({ label: `instantaneous melt at ${p.depthKm.toFixed(0)} km (F ${(100 * p.meltFraction).toFixed(1)} %)`,
        role: `seq-${k % 6}`, points: pointsOf(categories, p.instantaneousNormalised) });
    });
    if (response.pooled) {
      series.push({ label: `pooled melt (mean F ${(100 * response.pooled.meanMeltFraction).toFixed(1)} %, ${response.pooled.regime})`,
        role: "path", dots: true, points: pointsOf(categories, response.pooled.meltNormalised) });
    } else {
      notes.push("No melt is made, so there is no pooled melt to draw.");
    }
  }
  const parsed = parseAnalysis(pasted.text, categories);
  const own = normaliseAnalysis(parsed.values, response.normalisationPpm);
  const shown = Object.keys(own).length;
  if (shown) {
    series.push({ label: `your analysis (${shown} element${shown === 1 ? "" : "s"})`, role: "extra", color: OVERLAY_COLOURS[0],
      dots: true, analysis: true, points: pointsOf(categories, own) });
  }
  pasted.parsed = Object.assign(parsed, { shown });
  const values = series.flatMap((s) => s.points.map((p) => p[1])).filter((v) => isFinite(v) && v > 0);
  const plot = {
    title: "Melts normalised to " + ref,
    x: { label: "Element (most incompatible first)", categories },
    y: { label: `Sample / ${ref}`, log: true },
    series: series.filter((s) => s.points.some(([, y]) => isFinite(y))),
    levels: [], marks: [],
  };
  if (values.length) {
    const hi = Math.max(...values), lo = Math.min(...values);
    const floor = Math.max(lo, hi / Math.pow(10, DECADES_SHOWN));
    plot.y.domain = [Math.pow(10, Math.floor(Math.log10(floor) + 1e-9)), Math.pow(10, Math.ceil(Math.log10(hi) - 1e-9))];
    if (lo < plot.y.domain[0]) {
      notes.push(`Values below ${fmtValue(plot.y.domain[0])} × ${ref} (late instantaneous melts of the most incompatible `
        + "elements) lie under the frame; zoom out or download the CSV for them.");
    }
  }
  notes.push(`Normalised to ${ref}; your analysis is divided by the same values (normalisationPpm of the response). `
    + "No crystallisation after melting is modelled: erupted lavas are usually richer by the fraction crystallised.");
  return { plot, notes, analysis: pasted.parsed };
}

/**
 * The paste box under the diagram. `onChange` is called (to redraw) when the user overlays or
 * clears an analysis; the box reports every line it could not use.
 */
export function analysisBox(onChange, h) {
  const area = h("textarea", { id: "analysis-text", rows: 6, spellcheck: "false", "aria-describedby": "analysis-help analysis-problems",
    placeholder: "La 3.2\nCe 9.1\nSm 2.6\nYb 2.9" });
  area.value = pasted.text;
  const problems = h("div", { id: "analysis-problems", class: "analysis-problems", role: "status", "aria-live": "polite" });
  const show = () => {
    const p = pasted.parsed;
    problems.replaceChildren();
    if (!p || !pasted.text.trim()) {
      return;
    }
    const head = p.shown ? `${p.shown} element${p.shown === 1 ? "" : "s"} drawn.` : "Nothing could be drawn.";
    problems.append(h("p", { class: "analysis-count", "data-shown": String(p.shown) }, head));
    if (p.problems.length) {
      problems.append(h("p", { class: "analysis-bad-head" }, `${p.problems.length} line${p.problems.length === 1 ? "" : "s"} not used:`),
        h("ul", { class: "analysis-bad" }, p.problems.map((q) => h("li", { "data-line": String(q.line) },
          `line ${q.line} (“${q.text}”): ${q.reason}`))));
    }
  };
  const box = h("section", { class: "analysis", id: "analysis", "aria-labelledby": "analysis-title" },
    h("h3", { id: "analysis-title" }, "Compare with your analysis"),
    h("label", { for: "analysis-text" }, "Measured concentrations (ppm), one element per line"),
    h("p", { class: "hint", id: "analysis-help" },
      "“La 3.2”, “La,3.2” or CSV with a header “element,ppm”; or symbols across one line and values below. "
      + "It is divided by the diagram's reference and drawn over the model melts; it stays in this tab only."),
    area,
    h("div", { class: "actions" },
      h("button", { type: "button", id: "analysis-overlay", onclick: () => {
        pasted.text = area.value;
        onChange();
      } }, "Overlay"),
      h("button", { type: "button", class: "quiet", id: "analysis-clear", onclick: () => {
        pasted.text = "";
        area.value = "";
        onChange();
      } }, "Clear")),
    problems);
  box.refresh = show;
  show();
  return box;
}
