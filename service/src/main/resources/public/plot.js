// Small SVG plotting for the page: line plots with axes, units, level lines, marks and a legend.
// No library: everything below is drawn with plain SVG elements.

const SVG_NS = "http://www.w3.org/2000/svg";

/** Roles name what a curve means; style.css gives each role its stroke. */
export const ROLES = ["path", "adiabat", "melting", "solidus", "liquidus", "melt", "productivity"];

function el(name, attrs, text) {
  const e = document.createElementNS(SVG_NS, name);
  for (const [k, v] of Object.entries(attrs || {})) {
    e.setAttribute(k, String(v));
  }
  if (text !== undefined) {
    e.textContent = text;
  }
  return e;
}

/** "Nice" tick values covering [lo, hi] with about n intervals. */
export function ticks(lo, hi, n) {
  if (!(hi > lo)) {
    return [lo];
  }
  const raw = (hi - lo) / n;
  const mag = Math.pow(10, Math.floor(Math.log10(raw)));
  const f = raw / mag;
  const step = (f < 1.5 ? 1 : f < 3 ? 2 : f < 7 ? 5 : 10) * mag;
  const out = [];
  for (let v = Math.ceil(lo / step - 1e-9) * step; v <= hi + step * 1e-9; v += step) {
    out.push(Math.abs(v) < step * 1e-9 ? 0 : v);
  }
  return out;
}

/** Extends [lo, hi] to tick boundaries, with a little room when the range is empty. */
export function niceRange(lo, hi, n) {
  if (!isFinite(lo) || !isFinite(hi)) {
    return [0, 1];
  }
  if (hi - lo < 1e-12) {
    const pad = Math.abs(lo) > 0 ? Math.abs(lo) * 0.1 : 1;
    lo -= pad;
    hi += pad;
  }
  const t = ticks(lo, hi, n);
  const step = t.length > 1 ? t[1] - t[0] : (hi - lo);
  return [Math.floor(lo / step + 1e-9) * step, Math.ceil(hi / step - 1e-9) * step];
}

function fmtTick(v, step) {
  const decimals = Math.max(0, -Math.floor(Math.log10(step) + 1e-9));
  return v.toFixed(Math.min(decimals, 6));
}

function axisTitle(a) {
  return a.unit ? `${a.label} (${a.unit})` : a.label;
}

/** Linear interpolation in a table of [a, b] pairs sorted by a; NaN outside it. */
function interpolate(pairs, a) {
  for (let i = 1; i < pairs.length; i++) {
    const [a0, b0] = pairs[i - 1], [a1, b1] = pairs[i];
    if ((a >= a0 && a <= a1) || (a <= a0 && a >= a1)) {
      return a1 === a0 ? b0 : b0 + (b1 - b0) * (a - a0) / (a1 - a0);
    }
  }
  return NaN;
}

/**
 * A second vertical axis on the right for a quantity that grows with the first (pressure with
 * depth): its ticks are placed where the given [y, value] pairs put them.
 */
function drawSecondAxis(svg, y2, yr, sy, x, midY) {
  const pairs = y2.pairs.filter(([a, b]) => isFinite(a) && isFinite(b)).sort((p, q) => p[0] - q[0]);
  if (pairs.length < 2) {
    return;
  }
  const inverse = pairs.map(([a, b]) => [b, a]);
  const lo = interpolate(pairs, Math.max(yr[0], pairs[0][0]));
  const hi = interpolate(pairs, Math.min(yr[1], pairs[pairs.length - 1][0]));
  const t = ticks(Math.min(lo, hi), Math.max(lo, hi), 6);
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
  const X = x + 44;
  g.appendChild(el("text", {
    x: X, y: midY, class: "axis-title y2-axis", "text-anchor": "middle", transform: `rotate(90 ${X} ${midY})`,
  }, axisTitle(y2)));
  svg.appendChild(g);
}

/**
 * Draws one plot.
 * @param spec {title, x: {label, unit}, y: {label, unit}, invertY, series: [{label, role, points: [[x, y]], dots}],
 *             levels: [{y, label}], marks: [{x, y, label}], y2: {label, unit, pairs: [[y, value]]}}
 * @returns an <svg> element
 */
export function drawPlot(spec) {
  // legend entries: every curve that has something to draw, and the marks
  const items = spec.series.filter((s) => s.points.some(([x, y]) => isFinite(x) && isFinite(y)));
  if ((spec.marks || []).some((mk) => isFinite(mk.x) && isFinite(mk.y))) {
    items.push({ label: spec.marks[0].label, role: "mark-item" });
  }
  const lh = 16;
  const legendH = items.length ? lh * items.length + 10 : 0;
  const W = 480, plotH = 340, H = plotH + legendH;
  const right = spec.y2 ? 54 : 16;
  const m = spec.invertY ? { l: 62, r: right, t: 62, b: 16 + legendH } : { l: 62, r: right, t: 34, b: 46 + legendH };
  const pw = W - m.l - m.r, ph = H - m.t - m.b;
  const svg = el("svg", {
    viewBox: `0 0 ${W} ${H}`, class: "plot", role: "img",
    "aria-label": spec.title, "data-title": spec.title,
  });
  svg.appendChild(el("title", {}, spec.title));

  let xs = [], ys = [];
  for (const s of spec.series) {
    for (const [x, y] of s.points) {
      if (isFinite(x) && isFinite(y)) {
        xs.push(x);
        ys.push(y);
      }
    }
  }
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
  const xr = niceRange(Math.min(...xs), Math.max(...xs), 6);
  const yr = spec.invertY ? niceRange(Math.min(0, ...ys), Math.max(...ys), 6)
    : niceRange(Math.min(...ys), Math.max(...ys), 6);
  const sx = (x) => m.l + (x - xr[0]) / (xr[1] - xr[0]) * pw;
  const sy = spec.invertY
    ? (y) => m.t + (y - yr[0]) / (yr[1] - yr[0]) * ph
    : (y) => m.t + ph - (y - yr[0]) / (yr[1] - yr[0]) * ph;

  svg.appendChild(el("text", { x: m.l, y: 16, class: "plot-title" }, spec.title));
  svg.appendChild(el("rect", { x: m.l, y: m.t, width: pw, height: ph, class: "plot-frame" }));

  // grid and ticks
  const xt = ticks(xr[0], xr[1], 6), yt = ticks(yr[0], yr[1], 6);
  const xStep = xt.length > 1 ? xt[1] - xt[0] : 1, yStep = yt.length > 1 ? yt[1] - yt[0] : 1;
  const axisY = spec.invertY ? m.t : m.t + ph;
  for (const v of xt) {
    const X = sx(v);
    svg.appendChild(el("line", { x1: X, x2: X, y1: m.t, y2: m.t + ph, class: "grid" }));
    svg.appendChild(el("text", {
      x: X, y: spec.invertY ? axisY - 6 : axisY + 15, class: "tick", "text-anchor": "middle",
    }, fmtTick(v, xStep)));
  }
  for (const v of yt) {
    const Y = sy(v);
    svg.appendChild(el("line", { x1: m.l, x2: m.l + pw, y1: Y, y2: Y, class: "grid" }));
    svg.appendChild(el("text", { x: m.l - 6, y: Y + 4, class: "tick", "text-anchor": "end" }, fmtTick(v, yStep)));
  }
  svg.appendChild(el("text", {
    x: m.l + pw / 2, y: spec.invertY ? m.t - 26 : m.t + ph + 34, class: "axis-title x-axis", "text-anchor": "middle",
  }, axisTitle(spec.x)));
  svg.appendChild(el("text", {
    x: 14, y: m.t + ph / 2, class: "axis-title y-axis", "text-anchor": "middle",
    transform: `rotate(-90 14 ${m.t + ph / 2})`,
  }, axisTitle(spec.y) + (spec.invertY ? " ↓" : "")));

  if (spec.y2) {
    drawSecondAxis(svg, spec.y2, yr, sy, m.l + pw, m.t + ph / 2);
  }

  const clipId = "clip-" + Math.random().toString(36).slice(2);
  const defs = el("defs");
  const clip = el("clipPath", { id: clipId });
  clip.appendChild(el("rect", { x: m.l, y: m.t, width: pw, height: ph }));
  defs.appendChild(clip);
  svg.appendChild(defs);
  const area = el("g", { "clip-path": `url(#${clipId})` });
  svg.appendChild(area);

  // level lines (depths worth naming)
  for (const lv of spec.levels || []) {
    if (!isFinite(lv.y)) {
      continue;
    }
    const Y = sy(lv.y);
    area.appendChild(el("line", { x1: m.l, x2: m.l + pw, y1: Y, y2: Y, class: "level" }));
    area.appendChild(el("text", { x: m.l + pw - 4, y: Y - 4, class: "level-label", "text-anchor": "end" }, lv.label));
  }

  // curves: gaps (non-finite values) break a curve into pieces
  spec.series.forEach((s, i) => {
    let d = "", pen = false, n = 0;
    for (const [x, y] of s.points) {
      if (isFinite(x) && isFinite(y)) {
        d += (pen ? "L" : "M") + sx(x).toFixed(2) + "," + sy(y).toFixed(2);
        pen = true;
        n++;
      } else {
        pen = false;
      }
    }
    const role = s.role || "path";
    if (n > 0) {
      area.appendChild(el("path", {
        d, class: `curve role-${role}`, "data-series": s.label, "data-points": n, "data-index": i,
      }));
    }
    if (s.dots || n === 1) {
      for (const [x, y] of s.points) {
        if (isFinite(x) && isFinite(y)) {
          area.appendChild(el("circle", { cx: sx(x), cy: sy(y), r: 3, class: `dot role-${role}` }));
        }
      }
    }
  });

  for (const mk of spec.marks || []) {
    if (!isFinite(mk.x) || !isFinite(mk.y)) {
      continue;
    }
    const X = sx(mk.x), Y = sy(mk.y);
    area.appendChild(el("path", { d: `M${X - 6},${Y}L${X},${Y - 6}L${X + 6},${Y}L${X},${Y + 6}Z`, class: "mark" }));
    if (mk.label) {
      area.appendChild(el("text", { x: X + 9, y: Y - 7, class: "mark-label" }, mk.label));
    }
  }

  // legend, under the plot
  if (items.length > 0) {
    const lx = m.l;
    const ly = H - legendH + 2;
    const g = el("g", { class: "legend" });
    items.forEach((s, i) => {
      const Y = ly + lh * i + lh / 2;
      if (s.role === "mark-item") {
        g.appendChild(el("path", { d: `M${lx + 7},${Y}l6,-6l6,6l-6,6z`, class: "mark" }));
      } else {
        g.appendChild(el("line", { x1: lx, x2: lx + 26, y1: Y, y2: Y, class: `curve role-${s.role || "path"}` }));
      }
      g.appendChild(el("text", { x: lx + 34, y: Y + 4, class: "legend-text" }, s.label));
    });
    svg.appendChild(g);
  }
  return svg;
}
