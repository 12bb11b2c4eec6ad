// Small SVG plotting for the page and for every view that draws curves (results, runs,
// uncertainty bands, posteriors, trace-element diagrams). No library: plain SVG elements.
//
//   drawPlot(spec, options)   one plot as an <svg>, drawn at its real pixel width
//   mountPlot(holder, spec, options)
//                             the same plot made interactive: zoom, pan, cursor readout,
//                             export as SVG / PNG; returns a handle (see below)
//   svgMarkup(svg, provenance) a standalone SVG document (styles inlined, provenance line)
//   pngBlob(markup, w, h, density) the same figure rasterised at a pixel density
//   PALETTE                   six run colours for comparisons; ROLES for curve meanings
//
// The spec and handle are documented in DEVELOPERS.md ("Plotting module").

const SVG_NS = "http://www.w3.org/2000/svg";

/** Roles name what a curve means; PLOT_CSS gives each role its stroke and dash. */
export const ROLES = ["path", "adiabat", "melting", "solidus", "liquidus", "melt", "productivity", "isopleth",
  "cpx-out", "extra"];

/**
 * Six colours for the runs of a comparison (and for extra curves), chosen for this page: dark
 * enough on white for thin lines, apart in lightness as well as hue.
 */
export const PALETTE = ["#1f4e8c", "#c0571b", "#2e8b57", "#8b3a8f", "#9a7d0a", "#3d3d3d"];

/** Colours for extra curves drawn over a result (other rocks' solidi), apart from the role colours. */
export const OVERLAY_COLOURS = ["#0f7f95", "#b8326a", "#6d8b18", "#7a4b2a", "#4361c2", "#d4860b"];

/** The plot styles: injected once into the page and copied into every exported SVG. */
export const PLOT_CSS = `
svg.plot { background: #fff; font-family: system-ui, "DejaVu Sans", Arial, sans-serif; }
svg.plot .plot-title { font-size: 14px; font-weight: 600; fill: #1d2327; }
svg.plot .plot-frame { fill: none; stroke: #8c8577; stroke-width: 1; }
svg.plot .grid { stroke: #ece7dc; stroke-width: 1; }
svg.plot .tick { font-size: 12px; fill: #4f5a61; }
svg.plot .axis-title { font-size: 12.5px; fill: #1d2327; }
svg.plot .tick-mark { stroke: #8c8577; stroke-width: 1; }
svg.plot .curve { fill: none; stroke-width: 2; stroke-linejoin: round; stroke-linecap: round; }
svg.plot .role-path { stroke: #22577a; }
svg.plot .role-adiabat { stroke: #6f7f89; stroke-dasharray: 1.5 4; }
svg.plot .role-melting { stroke: #c8553d; stroke-width: 4.5; stroke-opacity: 0.85; }
svg.plot .role-solidus { stroke: #5b3f8c; stroke-dasharray: 7 4; }
svg.plot .role-liquidus { stroke: #a07c00; stroke-dasharray: 2 3; stroke-width: 2.2; }
svg.plot .role-melt { stroke: #b5483a; }
svg.plot .role-productivity { stroke: #2f7d6d; }
svg.plot .role-isopleth { stroke: #b5483a; stroke-width: 1; stroke-dasharray: 4 3; stroke-opacity: 0.8; }
svg.plot .role-cpx-out { stroke: #2f7d6d; stroke-width: 1.8; stroke-dasharray: 9 3 2 3; }
svg.plot .role-extra { stroke-width: 1.8; stroke-dasharray: 6 3; }
svg.plot .role-seq-0 { stroke: #e3a857; }
svg.plot .role-seq-1 { stroke: #d07a3a; }
svg.plot .role-seq-2 { stroke: #b04f2e; }
svg.plot .role-seq-3 { stroke: #7f3a3f; }
svg.plot .role-seq-4 { stroke: #4d2f4f; }
svg.plot .role-seq-5 { stroke: #22263f; }
svg.plot .dot { stroke: none; fill: #22577a; }
svg.plot .band { stroke: none; fill: #22577a; fill-opacity: 0.2; }
svg.plot .bar { stroke: #fff; stroke-width: 0.5; fill: #22577a; fill-opacity: 0.75; }
svg.plot .band.role-melt, svg.plot .bar.role-melt { fill: #b5483a; }
svg.plot .band.role-solidus, svg.plot .bar.role-solidus { fill: #5b3f8c; }
svg.plot .level { stroke: #7d776b; stroke-dasharray: 3 3; stroke-width: 1; }
svg.plot .xlevel { stroke: #4a453c; stroke-width: 1.2; stroke-dasharray: 4 3; }
svg.plot .xlevel-strong { stroke: #1d2327; stroke-width: 1.8; stroke-dasharray: none; }
svg.plot .level-label, svg.plot .mark-label, svg.plot .curve-label { font-size: 11.5px; fill: #4a453c;
  paint-order: stroke; stroke: #fff; stroke-width: 3px; stroke-linejoin: round; }
svg.plot .mark { fill: #fff; stroke: #1d2327; stroke-width: 1.6; }
svg.plot .legend-text { font-size: 12px; fill: #1d2327; }
svg.plot .legend-head { font-size: 12px; fill: #4f5a61; font-style: italic; }
svg.plot .provenance { font-size: 10px; fill: #5d6970; }
svg.plot .crosshair { stroke: #1d2327; stroke-width: 0.8; stroke-dasharray: 2 2; pointer-events: none; }
svg.plot .nearest { fill: none; stroke: #1d2327; stroke-width: 1.5; pointer-events: none; }
svg.plot .zoom-box { fill: rgba(31, 78, 140, 0.08); stroke: #1f4e8c; stroke-width: 1; pointer-events: none; }
svg.plot .hit { fill: transparent; cursor: crosshair; }
`;

const FONT = { title: 14, tick: 12, axis: 12.5, legend: 12, label: 11.5, provenance: 10 };

function el(name, attrs, text) {
  const e = document.createElementNS(SVG_NS, name);
  for (const [k, v] of Object.entries(attrs || {})) {
    if (v !== undefined && v !== null) {
      e.setAttribute(k, String(v));
    }
  }
  if (text !== undefined) {
    e.textContent = text;
  }
  return e;
}

/** A generous estimate of a text's width in px (system sans-serif); used to keep labels apart. */
export function textWidth(text, size) {
  let w = 0;
  for (const ch of String(text)) {
    w += /[mwMW%@]/.test(ch) ? 0.9 : /[il.,:;'|!()\[\] ]/.test(ch) ? 0.34 : /[A-Z0-9°]/.test(ch) ? 0.66 : 0.58;
  }
  return w * size + 2;
}

/** Splits a text into lines no wider than maxW (by the estimate above); a single long word stays whole. */
export function wrapText(text, size, maxW) {
  const words = String(text).split(/\s+/).filter((w) => w !== "");
  const lines = [];
  let cur = "";
  for (const w of words) {
    const next = cur ? cur + " " + w : w;
    if (cur && textWidth(next, size) > maxW) {
      lines.push(cur);
      cur = w;
    } else {
      cur = next;
    }
  }
  if (cur) {
    lines.push(cur);
  }
  return lines.length ? lines : [""];
}

function niceStep(span, n) {
  const raw = span / Math.max(1, n);
  const mag = Math.pow(10, Math.floor(Math.log10(raw)));
  const f = raw / mag;
  return (f < 1.5 ? 1 : f < 3 ? 2 : f < 7 ? 5 : 10) * mag;
}

/** "Nice" tick values covering [lo, hi] with about n intervals. */
export function ticks(lo, hi, n) {
  if (!(hi > lo)) {
    return [lo];
  }
  return ticksWithStep(lo, hi, niceStep(hi - lo, n));
}

function ticksWithStep(lo, hi, step) {
  const out = [];
  const first = Math.ceil(lo / step - 1e-9);
  for (let i = first; i * step <= hi + step * 1e-9; i++) {
    const v = i * step;
    out.push(Math.abs(v) < step * 1e-9 ? 0 : Number(v.toPrecision(12)));
  }
  return out;
}

/**
 * An axis for the values [lo, hi]: its ends are ticks (so no axis stops on an unlabelled value),
 * with about n intervals. Returns {lo, hi, step, ticks}.
 */
export function niceScale(lo, hi, n) {
  if (!isFinite(lo) || !isFinite(hi)) {
    lo = 0;
    hi = 1;
  }
  if (hi - lo < 1e-12 * Math.max(1, Math.abs(lo))) {
    const pad = Math.abs(lo) > 0 ? Math.abs(lo) * 0.1 : 1;
    lo -= pad;
    hi += pad;
  }
  let step = niceStep(hi - lo, n);
  let a = Math.floor(lo / step + 1e-9) * step, b = Math.ceil(hi / step - 1e-9) * step;
  // rounding out can double the intervals; take the next step up if it does
  if ((b - a) / step > n * 1.8) {
    step = niceStep((b - a), n * 0.7);
    a = Math.floor(lo / step + 1e-9) * step;
    b = Math.ceil(hi / step - 1e-9) * step;
  }
  return { lo: a, hi: b, step, ticks: ticksWithStep(a, b, step) };
}

/** Extends [lo, hi] to tick boundaries (kept for callers of the first version). */
export function niceRange(lo, hi, n) {
  const s = niceScale(lo, hi, n);
  return [s.lo, s.hi];
}

function fmtTick(v, step) {
  const decimals = Math.max(0, -Math.floor(Math.log10(step) + 1e-9));
  return v.toFixed(Math.min(decimals, 6));
}

/** A number for a readout, to about 4 significant digits. */
export function fmtValue(v) {
  if (v === null || v === undefined) {
    return ""; // an absent quantity (an output that does not exist for this point)
  }
  if (!isFinite(v)) {
    return String(v);
  }
  const a = Math.abs(v);
  if (a !== 0 && (a >= 1e6 || a < 1e-3)) {
    return v.toExponential(2);
  }
  const d = a >= 100 ? 0 : a >= 10 ? 1 : a >= 1 ? 2 : 3;
  return v.toFixed(d);
}

function axisTitle(a) {
  return a.unit ? `${a.label} (${a.unit})` : a.label;
}

/** Linear interpolation in a table of [a, b] pairs sorted by a; NaN outside it. */
export function interpolate(pairs, a) {
  for (let i = 1; i < pairs.length; i++) {
    const [a0, b0] = pairs[i - 1], [a1, b1] = pairs[i];
    if ((a >= a0 && a <= a1) || (a <= a0 && a >= a1)) {
      return a1 === a0 ? b0 : b0 + (b1 - b0) * (a - a0) / (a1 - a0);
    }
  }
  return NaN;
}

/**
 * Breaks a curve where it jumps: a step between neighbours much larger than the steps around it
 * (a discontinuity such as productivity at clinopyroxene exhaustion) becomes a gap, so no line is
 * drawn across it. Points are [x, y]; the jump is looked for in the coordinate `axis` (0 or 1).
 */
export function breakJumps(points, axis) {
  const k = axis === undefined ? 0 : axis;
  const finite = points.filter((p) => isFinite(p[0]) && isFinite(p[1]));
  if (finite.length < 4) {
    return points;
  }
  const vals = finite.map((p) => p[k]);
  const span = Math.max(...vals) - Math.min(...vals);
  const steps = [];
  for (let i = 1; i < points.length; i++) {
    const a = points[i - 1][k], b = points[i][k];
    steps.push(isFinite(a) && isFinite(b) ? Math.abs(b - a) : NaN);
  }
  const out = [points[0]];
  for (let i = 1; i < points.length; i++) {
    const s = steps[i - 1];
    const around = [steps[i - 3], steps[i - 2], steps[i], steps[i + 1]].filter((x) => isFinite(x));
    const typical = around.length ? around.reduce((p, q) => p + q, 0) / around.length : 0;
    if (isFinite(s) && s > 0.12 * span && s > 6 * typical) {
      out.push([NaN, NaN]);
    }
    out.push(points[i]);
  }
  return out;
}

function finitePoints(series) {
  const out = [];
  for (const s of series) {
    const all = s.points.concat(s.band ? s.band.lower.concat(s.band.upper) : [], s.bars ? s.points.map((q) => [q[0], 0]) : []);
    for (const p of all) {
      if (isFinite(p[0]) && isFinite(p[1])) {
        out.push(p);
      }
    }
  }
  return out;
}

/**
 * One axis: linear (ticks at nice steps, ends on ticks), logarithmic (`log: true`, ticks at
 * decades, with 2 and 5 when the range is short) or categorical (`categories: [names]`, one tick
 * per name at 0, 1, 2 …). Works in "axis units" t (log10 of the value on a log axis).
 * Returns {lo, hi (in t), t(v), v(t), ticks: [{t, label}]}.
 */
export function axisScale(a, lo, hi, n, viewport) {
  if (a && Array.isArray(a.categories)) {
    const c = a.categories;
    const r = viewport || [-0.5, c.length - 0.5];
    const ticks = c.map((name, i) => ({ t: i, label: String(name) })).filter((k) => k.t >= r[0] - 1e-9 && k.t <= r[1] + 1e-9);
    return { lo: r[0], hi: r[1], t: (v) => v, v: (t) => t, ticks, kind: "categories" };
  }
  if (a && a.log) {
    const tlo = viewport ? viewport[0] : Math.floor(Math.log10(lo > 0 ? lo : 1e-3) + 1e-9);
    let thi = viewport ? viewport[1] : Math.ceil(Math.log10(hi > 0 ? hi : 1) - 1e-9);
    if (!viewport && thi <= tlo) {
      thi = tlo + 1;
    }
    const ticks = [];
    const short = thi - tlo <= 2.01;
    for (let k = Math.floor(tlo) - 1; k <= Math.ceil(thi); k++) {
      for (const f of short ? [1, 2, 5] : [1]) {
        const t = k + Math.log10(f);
        if (t >= tlo - 1e-9 && t <= thi + 1e-9) {
          ticks.push({ t, label: Number((f * Math.pow(10, k)).toPrecision(3)).toString() });
        }
      }
    }
    return { lo: tlo, hi: thi, t: (v) => (v > 0 ? Math.log10(v) : NaN), v: (t) => Math.pow(10, t), ticks, kind: "log" };
  }
  const s = viewport ? { lo: viewport[0], hi: viewport[1], step: niceStep(viewport[1] - viewport[0], n) } : niceScale(lo, hi, n);
  const tk = s.ticks || ticksWithStep(s.lo, s.hi, s.step);
  return { lo: s.lo, hi: s.hi, t: (v) => v, v: (t) => t, ticks: tk.map((v) => ({ t: v, label: fmtTick(v, s.step) })), kind: "linear" };
}

/**
 * The data ranges a plot of `spec` shows by default: {x: [lo, hi], y: [lo, hi]} before rounding
 * to ticks. A depth axis starts at the surface unless the spec gives y.domain.
 */
export function dataDomain(spec) {
  const logX = spec.x && spec.x.log, logY = spec.y && spec.y.log;
  const pts = finitePoints(spec.series).filter((p) => (!logX || p[0] > 0) && (!logY || p[1] > 0));
  const xs = pts.map((p) => p[0]), ys = pts.map((p) => p[1]);
  for (const mk of spec.marks || []) {
    if (isFinite(mk.x) && isFinite(mk.y)) {
      xs.push(mk.x);
      ys.push(mk.y);
    }
  }
  for (const lv of spec.levels || []) {
    if (isFinite(lv.y)) {
      ys.push(lv.y);
    }
  }
  for (const lv of spec.xLevels || []) {
    if (isFinite(lv.x) && (!logX || lv.x > 0)) {
      xs.push(lv.x);
    }
  }
  let x = [Math.min(...xs), Math.max(...xs)], y = [Math.min(...ys), Math.max(...ys)];
  // a curve lying on the frame is hard to see: leave a little room, but never cross zero for it
  const pad = (r) => {
    const d = 0.03 * (r[1] - r[0]);
    return [r[0] >= 0 && r[0] - d < 0 ? 0 : r[0] - d, r[1] <= 0 && r[1] + d > 0 ? 0 : r[1] + d];
  };
  if (!logX && !(spec.x && spec.x.categories)) {
    x = pad(x);
  }
  if (!spec.invertY && !logY) {
    y = pad(y);
  }
  // a mark on the frame would be cut in half: leave it some room
  const xSpan = x[1] - x[0] || Math.abs(x[0]) || 1;
  for (const mk of spec.marks || []) {
    if (isFinite(mk.x)) {
      if (mk.x - x[0] < 0.04 * xSpan) {
        x[0] = Math.min(x[0], mk.x - 0.05 * xSpan);
      }
      if (x[1] - mk.x < 0.04 * xSpan) {
        x[1] = Math.max(x[1], mk.x + 0.05 * xSpan);
      }
    }
  }
  if (spec.invertY) {
    y[0] = Math.min(0, y[0]);
  }
  if (spec.x && spec.x.domain) {
    x = spec.x.domain.slice();
  }
  if (spec.y && spec.y.domain) {
    y = spec.y.domain.slice();
  }
  return { x, y };
}

/**
 * Places a label of size w×h at the first of the candidate boxes that covers no curve and no
 * other label (the least covered one when none is free). Boxes are {x, y, w, h} (y is the top).
 */
function placeLabel(candidates, obstacles, placed, frame) {
  let best = null, bestScore = Infinity;
  candidates.forEach((c, order) => {
    let score = order * 0.01;
    if (c.x < frame.x0 || c.x + c.w > frame.x1 || c.y < frame.y0 || c.y + c.h > frame.y1) {
      score += 1000;
    }
    for (const [px, py] of obstacles) {
      if (px >= c.x - 2 && px <= c.x + c.w + 2 && py >= c.y - 2 && py <= c.y + c.h + 2) {
        score += 10;
      }
    }
    for (const b of placed) {
      if (c.x < b.x + b.w && c.x + c.w > b.x && c.y < b.y + b.h && c.y + c.h > b.y) {
        score += 500;
      }
    }
    if (score < bestScore) {
      bestScore = score;
      best = c;
    }
  });
  placed.push(best);
  return best;
}

/** Points every few px along the drawn curves, in screen coordinates, for label placement. */
function curveSamples(screenSeries) {
  const out = [];
  for (const pts of screenSeries) {
    for (let i = 0; i < pts.length; i++) {
      const p = pts[i];
      if (!p) {
        continue;
      }
      out.push(p);
      const q = pts[i + 1];
      if (q) {
        const n = Math.min(200, Math.ceil(Math.hypot(q[0] - p[0], q[1] - p[1]) / 4));
        for (let j = 1; j < n; j++) {
          out.push([p[0] + (q[0] - p[0]) * j / n, p[1] + (q[1] - p[1]) * j / n]);
        }
      }
    }
  }
  return out;
}

/**
 * Draws one plot.
 * @param spec {title, x: {label, unit, domain?}, y: {label, unit, domain?}, invertY,
 *   series: [{label, role, color?, points: [[x, y]], dots?, extras?: [string per point]}],
 *   levels: [{y, label}], xLevels: [{x, label, strong?}] (vertical lines: percentiles, a mean),
 *   marks: [{x, y, label}], y2: {label, unit, pairs: [[y, value]]}, legendTitle?;
 *   a band series may give `opacity` (its fill's opacity, default 0.2)}
 * @param options {width (px, default 480), plotHeight (px; by default from the width), viewport: {x, y},
 *   provenance: string drawn as a small last line, titleLines: room for this many title lines
 *   (so that panels side by side keep their frames level)}
 * @returns an <svg> element whose `frame` property maps data to pixels (for interaction)
 */
export function drawPlot(spec, options) {
  const opt = options || {};
  const W = Math.max(260, Math.round(opt.width || 480));
  const series = spec.series || [];
  const pwGuess = W - 64 - 18;
  const ph = Math.round(opt.plotHeight || (spec.invertY ? Math.min(440, Math.max(280, pwGuess * 1.1))
    : Math.min(360, Math.max(220, pwGuess * 0.7))));
  const items = series.filter((s) => s.points.some(([x, y]) => isFinite(x) && isFinite(y)) && s.legend !== false);
  const markItems = (spec.marks || []).filter((mk) => isFinite(mk.x) && isFinite(mk.y));
  const legendRows = series.filter((s) => s.legend !== false && (s.band || s.bars) && !items.includes(s))
    .map((s) => ({ label: s.label, role: s.role, color: s.color, swatch: s.bars ? "bar" : "band", opacity: s.opacity }))
    .concat(items.map((s) => ({ label: s.label, role: s.role, color: s.color, swatch: s.bars ? "bar" : undefined })));
  if (markItems.length) {
    legendRows.push({ label: markItems[0].label || "point", role: "mark-item" });
  }
  const lh = 17;
  const legendW = W - 64 - 34 - 8;
  legendRows.forEach((r) => {
    r.lines = wrapText(r.label, FONT.legend, legendW);
  });
  const headLines = spec.legendTitle ? wrapText(spec.legendTitle, FONT.legend, W - 64 - 8) : [];
  const legendHead = headLines.length * lh;
  const legendLines = legendRows.reduce((n, r) => n + r.lines.length, 0);
  const legendH = legendRows.length ? lh * legendLines + legendHead + 10 : 0;
  const provLines = opt.provenance ? wrapText(opt.provenance, FONT.provenance, W - 16) : [];
  const provH = provLines.length * 13 + (provLines.length ? 4 : 0);
  const titleLines = wrapText(spec.title, FONT.title, W - 64 - 8).slice(0, 2);
  const titleH = (Math.max(titleLines.length, opt.titleLines || 1) - 1) * 17;
  const right = spec.y2 ? 58 : 18;
  const m = spec.invertY ? { l: 64, r: right, t: 66 + titleH } : { l: 64, r: right, t: 34 + titleH };
  const bottomAxis = spec.invertY ? 12 : 48;
  const pw = W - m.l - m.r;
  const H = m.t + ph + bottomAxis + legendH + provH;

  const dom = dataDomain(spec);
  const vp = opt.viewport;
  const nx = Math.max(3, Math.min(8, Math.floor(pw / 75)));
  const ny = Math.max(3, Math.min(8, Math.floor(ph / 45)));
  const xs = axisScale(spec.x, dom.x[0], dom.x[1], nx, vp && vp.x);
  const ys = axisScale(spec.y, dom.y[0], dom.y[1], ny, vp && vp.y);
  const sxt = (t) => m.l + (t - xs.lo) / (xs.hi - xs.lo) * pw;
  const syt = spec.invertY
    ? (t) => m.t + (t - ys.lo) / (ys.hi - ys.lo) * ph
    : (t) => m.t + ph - (t - ys.lo) / (ys.hi - ys.lo) * ph;
  const sx = (x) => sxt(xs.t(x));
  const sy = (y) => syt(ys.t(y));

  const svg = el("svg", {
    xmlns: SVG_NS, viewBox: `0 0 ${W} ${H}`, width: W, height: H, class: "plot", role: "img",
    "aria-label": spec.title, "data-title": spec.title,
    "data-x-domain": `${xs.v(xs.lo)},${xs.v(xs.hi)}`, "data-y-domain": `${ys.v(ys.lo)},${ys.v(ys.hi)}`,
    "data-x-scale": xs.kind, "data-y-scale": ys.kind,
  });
  svg.appendChild(el("title", {}, spec.title));
  titleLines.forEach((t, i) => svg.appendChild(el("text", { x: m.l, y: 18 + 17 * i, class: "plot-title" }, t)));
  svg.appendChild(el("rect", { x: m.l, y: m.t, width: pw, height: ph, class: "plot-frame" }));

  // grid and ticks; the axis ends are ticks
  const axisY = spec.invertY ? m.t : m.t + ph;
  const gx = el("g", { class: "axis-x" });
  for (const k of xs.ticks) {
    const X = sxt(k.t);
    gx.appendChild(el("line", { x1: X, x2: X, y1: m.t, y2: m.t + ph, class: "grid" }));
    gx.appendChild(el("text", {
      x: X, y: spec.invertY ? axisY - 7 : axisY + 17, class: "tick tick-x", "text-anchor": "middle",
    }, k.label));
  }
  svg.appendChild(gx);
  const gy = el("g", { class: "axis-y" });
  for (const k of ys.ticks) {
    const Y = syt(k.t);
    gy.appendChild(el("line", { x1: m.l, x2: m.l + pw, y1: Y, y2: Y, class: "grid" }));
    gy.appendChild(el("text", { x: m.l - 7, y: Y + 4, class: "tick tick-y", "text-anchor": "end" }, k.label));
  }
  svg.appendChild(gy);
  svg.appendChild(el("text", {
    x: m.l + pw / 2, y: spec.invertY ? m.t - 30 : m.t + ph + 38, class: "axis-title x-axis", "text-anchor": "middle",
  }, axisTitle(spec.x)));
  svg.appendChild(el("text", {
    x: 16, y: m.t + ph / 2, class: "axis-title y-axis", "text-anchor": "middle",
    transform: `rotate(-90 16 ${m.t + ph / 2})`,
  }, axisTitle(spec.y) + (spec.invertY ? " ↓" : "")));

  let y2pairs = null;
  if (spec.y2) {
    y2pairs = drawSecondAxis(svg, spec.y2, [ys.v(ys.lo), ys.v(ys.hi)], sy, m.l + pw, m.t + ph / 2, ny);
  }

  const clipId = "clip-" + Math.random().toString(36).slice(2);
  const defs = el("defs");
  const clip = el("clipPath", { id: clipId });
  clip.appendChild(el("rect", { x: m.l, y: m.t, width: pw, height: ph }));
  defs.appendChild(clip);
  svg.appendChild(defs);
  const area = el("g", { "clip-path": `url(#${clipId})`, class: "area" });
  svg.appendChild(area);

  for (const lv of spec.levels || []) {
    if (isFinite(lv.y) && isFinite(sy(lv.y)) && sy(lv.y) >= m.t - 0.5 && sy(lv.y) <= m.t + ph + 0.5) {
      const Y = sy(lv.y);
      area.appendChild(el("line", { x1: m.l, x2: m.l + pw, y1: Y, y2: Y, class: "level" }));
    }
  }

  // bands (a range between two curves) and bars, under the curves
  for (const s of series) {
    const fill = [s.color ? `fill: ${s.color}` : "", isFinite(s.opacity) ? `fill-opacity: ${s.opacity}` : ""]
      .filter((x) => x).join("; ") || undefined;
    if (s.band) {
      const ring = s.band.upper.concat(s.band.lower.slice().reverse())
        .filter(([x, y]) => isFinite(sx(x)) && isFinite(sy(y)));
      if (ring.length > 2) {
        area.appendChild(el("path", {
          d: ring.map(([x, y], i) => (i ? "L" : "M") + sx(x).toFixed(2) + "," + sy(y).toFixed(2)).join("") + "Z",
          class: `band role-${s.role || "path"}`, "data-series": s.label, style: fill,
        }));
      }
    }
    if (s.bars) {
      const xsOk = s.points.map((q) => q[0]).filter((x) => isFinite(x)).sort((a, b) => a - b);
      let gap = Infinity;
      for (let i = 1; i < xsOk.length; i++) {
        gap = Math.min(gap, xsOk[i] - xsOk[i - 1]);
      }
      const bw = s.barWidth || (isFinite(gap) ? gap * 0.85 : 1);
      for (const [x, y] of s.points) {
        if (!isFinite(x) || !isFinite(y)) {
          continue;
        }
        const X0 = sx(x - bw / 2), X1 = sx(x + bw / 2);
        const base = ys.kind === "log" ? m.t + (spec.invertY ? 0 : ph) : sy(Math.max(ys.v(Math.min(ys.lo, ys.hi)), Math.min(0, ys.v(Math.max(ys.lo, ys.hi)))));
        const Y = sy(y);
        area.appendChild(el("rect", {
          x: Math.min(X0, X1), y: Math.min(Y, base), width: Math.abs(X1 - X0), height: Math.abs(base - Y),
          class: `bar role-${s.role || "path"}`, "data-series": s.label, style: fill,
        }));
      }
    }
  }

  // vertical lines at given x (percentiles, a mean), over the bars and bands
  const xLevelsShown = (spec.xLevels || []).filter((lv) => isFinite(lv.x) && isFinite(sx(lv.x))
    && sx(lv.x) >= m.l - 0.5 && sx(lv.x) <= m.l + pw + 0.5);
  for (const lv of xLevelsShown) {
    const X = sx(lv.x);
    area.appendChild(el("line", { x1: X, x2: X, y1: m.t, y2: m.t + ph, class: "xlevel" + (lv.strong ? " xlevel-strong" : ""),
      "data-x": lv.x, "data-label": lv.label || "" }));
  }

  // curves: gaps (non-finite values) break a curve into pieces
  const screen = [];
  series.forEach((s, i) => {
    let d = "", pen = false, n = 0;
    const pts = [];
    for (const [x, y] of s.bars ? [] : s.points) {
      if (isFinite(x) && isFinite(y)) {
        const X = sx(x), Y = sy(y);
        d += (pen ? "L" : "M") + X.toFixed(2) + "," + Y.toFixed(2);
        pts.push([X, Y]);
        pen = true;
        n++;
      } else {
        pen = false;
        pts.push(null);
      }
    }
    screen.push(pts);
    const role = s.role || "path";
    const style = s.color ? `stroke: ${s.color}` : undefined;
    if (n > 0) {
      area.appendChild(el("path", {
        d, class: `curve role-${role}`, "data-series": s.label, "data-points": n, "data-index": i,
        "data-run": s.run, style,
      }));
    }
    if (s.dots || n === 1) {
      for (const [x, y] of s.points) {
        if (isFinite(x) && isFinite(y)) {
          area.appendChild(el("circle", { cx: sx(x), cy: sy(y), r: 3, class: `dot role-${role}`, style: s.color ? `fill: ${s.color}` : undefined }));
        }
      }
    }
  });

  // labels: levels, marks and curve labels kept off the curves and off each other
  const obstacles = curveSamples(screen);
  const placed = [];
  const frame = { x0: m.l + 1, x1: m.l + pw - 1, y0: m.t + 1, y1: m.t + ph - 1 };
  const labels = el("g", { class: "labels" });
  const fs = FONT.label, lhh = fs + 3;
  for (const lv of spec.levels || []) {
    if (!isFinite(lv.y) || !lv.label || !(sy(lv.y) >= m.t - 0.5 && sy(lv.y) <= m.t + ph + 0.5)) {
      continue;
    }
    const Y = sy(lv.y);
    const variants = [[lv.label]];
    const words = lv.label.split(/\s+/);
    if (words.length >= 2) {
      // the two-line split with the narrowest longer line
      let best = null;
      for (let k = 1; k < words.length; k++) {
        const lines = [words.slice(0, k).join(" "), words.slice(k).join(" ")];
        const w = Math.max(...lines.map((t) => textWidth(t, fs)));
        if (!best || w < best.w) {
          best = { lines, w };
        }
      }
      variants.push(best.lines);
    }
    const candidates = [];
    for (const lines of variants) {
      const w = Math.max(...lines.map((t) => textWidth(t, fs))), hh = lhh * lines.length;
      for (const top of [Y - 3 - hh, Y + 3]) {
        for (let x = m.l + pw - 5 - w; x >= m.l + 5; x -= 8) {
          candidates.push({ x, y: top, w, h: hh, lines });
        }
        candidates.push({ x: m.l + 5, y: top, w, h: hh, lines });
      }
    }
    const c = placeLabel(candidates, obstacles, placed, frame);
    const t = el("text", { x: c.x, y: c.y + lhh - 4, class: "level-label" });
    c.lines.forEach((line, k) => t.appendChild(el("tspan", { x: c.x, dy: k === 0 ? 0 : lhh }, k < c.lines.length - 1 ? line + " " : line)));
    labels.appendChild(t);
  }
  for (const lv of xLevelsShown) {
    if (!lv.label) {
      continue;
    }
    // beside its line, as high as the curves and the other labels allow
    const X = sx(lv.x), w = textWidth(lv.label, fs);
    const candidates = [];
    for (let top = m.t + 3; top <= m.t + ph - lhh - 3; top += lhh) {
      candidates.push({ x: X + 3, y: top, w, h: lhh }, { x: X - 3 - w, y: top, w, h: lhh });
    }
    const c = placeLabel(candidates, obstacles, placed, frame);
    if (c) {
      labels.appendChild(el("text", { x: c.x, y: c.y + lhh - 4, class: "level-label xlevel-label", "data-x": lv.x }, lv.label));
    }
  }
  for (const mk of spec.marks || []) {
    if (!isFinite(mk.x) || !isFinite(mk.y)) {
      continue;
    }
    const X = sx(mk.x), Y = sy(mk.y);
    area.appendChild(el("path", { d: `M${X - 6},${Y}L${X},${Y - 6}L${X + 6},${Y}L${X},${Y + 6}Z`, class: "mark" }));
    placed.push({ x: X - 7, y: Y - 7, w: 14, h: 14 });
    if (mk.label) {
      const w = textWidth(mk.label, fs);
      const candidates = [];
      for (const r of [0, 12, 24, 40]) {
        candidates.push({ x: X + 9 + r, y: Y - 8 - lhh - r, w, h: lhh }, { x: X - 9 - w - r, y: Y - 8 - lhh - r, w, h: lhh },
          { x: X + 9 + r, y: Y + 8 + r, w, h: lhh }, { x: X - 9 - w - r, y: Y + 8 + r, w, h: lhh },
          { x: X + 10 + r, y: Y - lhh / 2, w, h: lhh }, { x: X - 10 - w - r, y: Y - lhh / 2, w, h: lhh });
      }
      const c = placeLabel(candidates, obstacles, placed, frame);
      labels.appendChild(el("text", { x: c.x, y: c.y + lhh - 4, class: "mark-label" }, mk.label));
    }
  }
  svg.appendChild(labels);

  // legend, under the plot
  const ly0 = m.t + ph + bottomAxis + 4;
  if (legendRows.length > 0) {
    const g = el("g", { class: "legend" });
    const lx = m.l;
    headLines.forEach((t, i) => g.appendChild(el("text", { x: lx, y: ly0 + lh * i + lh / 2 + 4, class: "legend-head" }, t)));
    let row = 0;
    legendRows.forEach((s) => {
      const Y = ly0 + legendHead + lh * row + lh / 2;
      if (s.role === "mark-item") {
        g.appendChild(el("path", { d: `M${lx + 7},${Y}l6,-6l6,6l-6,6z`, class: "mark" }));
      } else if (s.swatch) {
        g.appendChild(el("rect", { x: lx, y: Y - 6, width: 26, height: 12, class: `${s.swatch} role-${s.role || "path"}`,
          style: [s.color ? `fill: ${s.color}` : "", isFinite(s.opacity) ? `fill-opacity: ${s.opacity}` : ""].filter((x) => x).join("; ") || undefined }));
      } else {
        g.appendChild(el("line", {
          x1: lx, x2: lx + 26, y1: Y, y2: Y, class: `curve role-${s.role || "path"}`,
          style: s.color ? `stroke: ${s.color}` : undefined,
        }));
      }
      const t = el("text", { x: lx + 34, y: Y + 4, class: "legend-text" });
      s.lines.forEach((line, k) => t.appendChild(el("tspan", { x: lx + 34, dy: k === 0 ? 0 : lh }, k < s.lines.length - 1 ? line + " " : line)));
      g.appendChild(t);
      row += s.lines.length;
    });
    svg.appendChild(g);
  }
  if (provLines.length) {
    const t = el("text", { x: 8, y: H - provH + 11, class: "provenance" });
    provLines.forEach((line, k) => t.appendChild(el("tspan", { x: 8, dy: k === 0 ? 0 : 13 }, k < provLines.length - 1 ? line + " " : line)));
    svg.appendChild(t);
  }

  // frame.x / frame.y and invXt / invYt are in axis units (log10 on a log axis); invX / invY give values
  const invXt = (X) => xs.lo + (X - m.l) / pw * (xs.hi - xs.lo);
  const invYt = spec.invertY
    ? (Y) => ys.lo + (Y - m.t) / ph * (ys.hi - ys.lo)
    : (Y) => ys.lo + (m.t + ph - Y) / ph * (ys.hi - ys.lo);
  const invX = (X) => xs.v(invXt(X)), invY = (Y) => ys.v(invYt(Y));
  svg.frame = { m, pw, ph, W, H, x: [xs.lo, xs.hi], y: [ys.lo, ys.hi], sx, sy, invX, invY, invXt, invYt, y2pairs, screen,
    xScale: xs, yScale: ys };
  return svg;
}

/**
 * A second vertical axis on the right for a quantity that grows with the first (pressure with
 * depth): its ticks are placed where the given [y, value] pairs put them. Returns the sorted pairs.
 */
function drawSecondAxis(svg, y2, yr, sy, x, midY, n) {
  const pairs = y2.pairs.filter(([a, b]) => isFinite(a) && isFinite(b)).sort((p, q) => p[0] - q[0]);
  if (pairs.length < 2) {
    return null;
  }
  const inverse = pairs.map(([a, b]) => [b, a]);
  const lo = interpolate(pairs, Math.max(Math.min(...yr), pairs[0][0]));
  const hi = interpolate(pairs, Math.min(Math.max(...yr), pairs[pairs.length - 1][0]));
  const t = ticks(Math.min(lo, hi), Math.max(lo, hi), n);
  const step = t.length > 1 ? t[1] - t[0] : 1;
  const g = el("g", { class: "axis-2" });
  for (const v of t) {
    const y = interpolate(inverse, v);
    if (!isFinite(y)) {
      continue;
    }
    const Y = sy(y);
    g.appendChild(el("line", { x1: x, x2: x + 5, y1: Y, y2: Y, class: "tick-mark" }));
    g.appendChild(el("text", { x: x + 8, y: Y + 4, class: "tick tick-2" }, fmtTick(v, step)));
  }
  const X = x + 46;
  g.appendChild(el("text", {
    x: X, y: midY, class: "axis-title y2-axis", "text-anchor": "middle", transform: `rotate(90 ${X} ${midY})`,
  }, axisTitle(y2)));
  svg.appendChild(g);
  return pairs;
}

// ------------------------------------------------------------------ export

/** The plot as a standalone SVG document: styles inlined, a provenance line at the foot. */
export function svgMarkup(spec, options, provenance) {
  const svg = drawPlot(spec, Object.assign({}, options, { provenance }));
  svg.insertBefore(el("style", {}, PLOT_CSS), svg.firstChild.nextSibling);
  svg.insertBefore(el("rect", { x: 0, y: 0, width: svg.frame.W, height: svg.frame.H, fill: "#fff" }), svg.querySelector("style").nextSibling);
  return { text: '<?xml version="1.0" encoding="UTF-8"?>\n' + new XMLSerializer().serializeToString(svg) + "\n",
    width: svg.frame.W, height: svg.frame.H };
}

/** Rasterises SVG markup (from svgMarkup) at `density` pixels per CSS pixel; resolves to a PNG blob. */
export function pngBlob(markup, width, height, density) {
  const d = Math.max(1, Math.min(8, Number(density) || 2));
  return new Promise((resolve, reject) => {
    const img = new Image();
    img.onload = () => {
      const canvas = document.createElement("canvas");
      canvas.width = Math.round(width * d);
      canvas.height = Math.round(height * d);
      const g = canvas.getContext("2d");
      g.fillStyle = "#fff";
      g.fillRect(0, 0, canvas.width, canvas.height);
      g.drawImage(img, 0, 0, canvas.width, canvas.height);
      canvas.toBlob((b) => (b ? resolve(b) : reject(new Error("the browser could not make a PNG"))), "image/png");
    };
    img.onerror = () => reject(new Error("the figure could not be rasterised"));
    img.src = "data:image/svg+xml;charset=utf-8," + encodeURIComponent(markup);
  });
}

/** Makes the browser save `blob` as `name`. */
export function saveBlob(blob, name) {
  const a = document.createElement("a");
  a.href = URL.createObjectURL(blob);
  a.download = name;
  // named and hidden: it stays in the page for a second, and an unnamed link is an accessibility fault
  a.textContent = name;
  a.hidden = true;
  document.body.append(a);
  a.click();
  setTimeout(() => {
    URL.revokeObjectURL(a.href);
    a.remove();
  }, 1000);
}

/** A short author-year form of a citation: "Katz et al. 2003", "McKenzie & Bickle 1988". */
export function shortCitation(citation) {
  const c = String(citation || "");
  const year = /\((\d{4}[a-z]?)\)/.exec(c);
  if (!year) {
    return c.split(/[.;]/)[0].slice(0, 40);
  }
  const authors = c.slice(0, year.index).trim();
  const names = authors.split(/\s*(?:&|,\s*(?=[A-Z][a-z]))\s*/).map((s) => s.split(",")[0].trim())
    .filter((s) => /^[A-Z][A-Za-z'\- ]+$/.test(s) && !/^[A-Z]\.?$/.test(s));
  const surnames = [...new Set(names)];
  const who = surnames.length <= 1 ? (surnames[0] || authors.split(",")[0])
    : surnames.length === 2 ? `${surnames[0]} & ${surnames[1]}` : `${surnames[0]} et al.`;
  return `${who} ${year[1]}`;
}

// ------------------------------------------------------------------ interaction

let cssInjected = false;

/** Puts PLOT_CSS into the page once. */
export function injectPlotCss(doc) {
  const d = doc || document;
  if (cssInjected || d.getElementById("plot-css")) {
    return;
  }
  const style = d.createElement("style");
  style.id = "plot-css";
  style.textContent = PLOT_CSS;
  d.head.append(style);
  cssInjected = true;
}

function nearestPoint(frame, spec, X, Y) {
  let best = null, bestD = 24 * 24;
  frame.screen.forEach((pts, i) => {
    pts.forEach((p, j) => {
      if (p) {
        const d = (p[0] - X) ** 2 + (p[1] - Y) ** 2;
        if (d < bestD) {
          bestD = d;
          best = { series: i, index: j, X: p[0], Y: p[1] };
        }
      }
    });
  });
  if (!best) {
    return null;
  }
  const s = spec.series[best.series];
  return Object.assign(best, { label: s.label, point: s.points[best.index], extra: s.extras ? s.extras[best.index] : undefined });
}

/**
 * Draws `spec` into `holder` (an element) and makes it interactive:
 *  - drag to pan, shift+drag to zoom to a box, Ctrl/⌘+wheel to zoom at the cursor,
 *    keys + − and arrows when the plot has focus, double-click to go back to the full view;
 *  - a cursor readout of x, y (and the second axis) and of the nearest curve point.
 * @param options drawPlot options plus {readout: element to write the readout into,
 *   onView(viewport) called after every zoom or pan}
 * @returns {svg, spec, viewport(), setViewport(v), zoom(factor, cx?, cy?), pan(fx, fy), reset(),
 *   redraw(width?, options?), markup(provenance), png(provenance, density)}
 */
export function mountPlot(holder, spec, options) {
  injectPlotCss();
  const opt = Object.assign({}, options || {});
  let viewport = opt.viewport || null;
  let svg = null;
  let drag = null;

  const handle = {
    spec,
    get svg() {
      return svg;
    },
    viewport: () => (viewport ? { x: viewport.x.slice(), y: viewport.y.slice() } : null),
    setViewport(v) {
      viewport = v ? { x: v.x.slice(), y: v.y.slice() } : null;
      render();
      if (opt.onView) {
        opt.onView(handle.viewport());
      }
    },
    reset() {
      handle.setViewport(null);
    },
    /** Zooms by `factor` (> 1 zooms in) about (cx, cy) in axis units (log10 on a log axis), the centre by default. */
    zoom(factor, cx, cy) {
      const f = svg.frame;
      const x0 = cx === undefined ? (f.x[0] + f.x[1]) / 2 : cx, y0 = cy === undefined ? (f.y[0] + f.y[1]) / 2 : cy;
      handle.setViewport({
        x: [x0 + (f.x[0] - x0) / factor, x0 + (f.x[1] - x0) / factor],
        y: [y0 + (f.y[0] - y0) / factor, y0 + (f.y[1] - y0) / factor],
      });
    },
    /** Pans by fractions of the shown ranges (fx > 0 shows larger x, fy > 0 larger y). */
    pan(fx, fy) {
      const f = svg.frame;
      const dx = (f.x[1] - f.x[0]) * fx, dy = (f.y[1] - f.y[0]) * fy;
      handle.setViewport({ x: [f.x[0] + dx, f.x[1] + dx], y: [f.y[0] + dy, f.y[1] + dy] });
    },
    /** Draws again, at a new width and with other drawPlot options if given. */
    redraw(width, more) {
      if (width) {
        opt.width = width;
      }
      Object.assign(opt, more || {});
      render();
    },
    markup(provenance) {
      return svgMarkup(spec, Object.assign({}, opt, { viewport }), provenance);
    },
    png(provenance, density) {
      const mk = handle.markup(provenance);
      return pngBlob(mk.text, mk.width, mk.height, density);
    },
  };

  function readout(X, Y) {
    const out = opt.readout;
    const f = svg.frame;
    svg.querySelectorAll(".crosshair, .nearest").forEach((n) => n.remove());
    if (!out) {
      return;
    }
    if (X === null || X < f.m.l || X > f.m.l + f.pw || Y < f.m.t || Y > f.m.t + f.ph) {
      out.textContent = out.dataset.hint || "";
      return;
    }
    const x = f.invX(X), y = f.invY(Y);
    const xText = f.xScale.kind === "categories" ? String(spec.x.categories[Math.round(x)] ?? "") : fmtValue(x);
    const parts = [`${spec.x.label} ${xText} ${spec.x.unit || ""}`.trim(),
      `${spec.y.label} ${fmtValue(y)} ${spec.y.unit || ""}`.trim()];
    if (f.y2pairs && spec.y2) {
      const v = interpolate(f.y2pairs, y);
      if (isFinite(v)) {
        parts.push(`${spec.y2.label} ${fmtValue(v)} ${spec.y2.unit || ""}`.trim());
      }
    }
    svg.appendChild(el("line", { x1: X, x2: X, y1: f.m.t, y2: f.m.t + f.ph, class: "crosshair" }));
    svg.appendChild(el("line", { x1: f.m.l, x2: f.m.l + f.pw, y1: Y, y2: Y, class: "crosshair" }));
    const near = nearestPoint(f, spec, X, Y);
    if (near) {
      svg.appendChild(el("circle", { cx: near.X, cy: near.Y, r: 5, class: "nearest" }));
      let t = `nearest: ${near.label} at ${fmtValue(near.point[0])} ${spec.x.unit || ""}, ${fmtValue(near.point[1])} ${spec.y.unit || ""}`;
      if (near.extra) {
        t += `, ${near.extra}`;
      }
      parts.push(t.replace(/ ,/g, ","));
    }
    out.textContent = parts.join(" · ");
    out.dataset.x = String(x);
    out.dataset.y = String(y);
  }

  function local(ev) {
    const r = svg.getBoundingClientRect();
    const k = svg.frame.W / r.width;
    return [(ev.clientX - r.left) * k, (ev.clientY - r.top) * k];
  }

  function render() {
    const next = drawPlot(spec, Object.assign({}, opt, { viewport }));
    next.setAttribute("tabindex", "0");
    next.setAttribute("aria-label", spec.title + (viewport ? " (zoomed; double-click or press 0 for the full view)" : ""));
    const f = next.frame;
    const hit = el("rect", { x: f.m.l, y: f.m.t, width: f.pw, height: f.ph, class: "hit" });
    next.appendChild(hit);
    if (svg && svg.parentNode === holder) {
      holder.replaceChild(next, svg);
    } else {
      holder.append(next);
    }
    svg = next;
    holder.dataset.zoomed = viewport ? "true" : "false";
    hit.addEventListener("pointerdown", (ev) => {
      const [X, Y] = local(ev);
      drag = { X, Y, box: ev.shiftKey, frame: svg.frame, moved: false };
      hit.setPointerCapture(ev.pointerId);
    });
    hit.addEventListener("pointermove", (ev) => {
      const [X, Y] = local(ev);
      if (!drag) {
        readout(X, Y);
        return;
      }
      drag.moved = drag.moved || Math.hypot(X - drag.X, Y - drag.Y) > 3;
      if (drag.box) {
        svg.querySelectorAll(".zoom-box").forEach((n) => n.remove());
        svg.appendChild(el("rect", {
          x: Math.min(X, drag.X), y: Math.min(Y, drag.Y), width: Math.abs(X - drag.X), height: Math.abs(Y - drag.Y), class: "zoom-box",
        }));
      }
    });
    const finish = (ev) => {
      if (!drag) {
        return;
      }
      const d = drag;
      drag = null;
      const [X, Y] = local(ev);
      if (!d.moved) {
        return;
      }
      const f0 = d.frame;
      if (d.box) {
        const xa = f0.invXt(Math.min(X, d.X)), xb = f0.invXt(Math.max(X, d.X));
        const ya = f0.invYt(Y), yb = f0.invYt(d.Y);
        if (Math.abs(X - d.X) > 6 && Math.abs(Y - d.Y) > 6) {
          handle.setViewport({ x: [xa, xb], y: [Math.min(ya, yb), Math.max(ya, yb)] });
        }
      } else {
        const dx = f0.invXt(d.X) - f0.invXt(X), dy = f0.invYt(d.Y) - f0.invYt(Y);
        handle.setViewport({ x: [f0.x[0] + dx, f0.x[1] + dx], y: [f0.y[0] + dy, f0.y[1] + dy] });
      }
    };
    hit.addEventListener("pointerup", finish);
    hit.addEventListener("pointercancel", () => {
      drag = null;
    });
    hit.addEventListener("pointerleave", () => {
      if (!drag) {
        readout(null, null);
      }
    });
    hit.addEventListener("dblclick", () => handle.reset());
    next.addEventListener("wheel", (ev) => {
      if (!(ev.ctrlKey || ev.metaKey)) {
        return; // plain wheel scrolls the page
      }
      ev.preventDefault();
      const [X, Y] = local(ev);
      handle.zoom(ev.deltaY < 0 ? 1.25 : 0.8, svg.frame.invXt(X), svg.frame.invYt(Y));
    }, { passive: false });
    next.addEventListener("keydown", (ev) => {
      const keys = { "+": () => handle.zoom(1.5), "=": () => handle.zoom(1.5), "-": () => handle.zoom(1 / 1.5),
        "0": () => handle.reset(), ArrowLeft: () => handle.pan(-0.1, 0), ArrowRight: () => handle.pan(0.1, 0),
        ArrowUp: () => handle.pan(0, spec.invertY ? -0.1 : 0.1), ArrowDown: () => handle.pan(0, spec.invertY ? 0.1 : -0.1) };
      if (keys[ev.key]) {
        ev.preventDefault();
        keys[ev.key]();
        svg.focus();
      }
    });
  }

  render();
  if (opt.readout && opt.readout.dataset.hint) {
    opt.readout.textContent = opt.readout.dataset.hint;
  }
  return handle;
}
