// A dashboard-style summary of a running tectomelt service, with fetch (Node.js 20 or newer,
// no packages). Each panel is one request; the same code runs in a browser dashboard.
//
//   node dashboard.mjs
//
// TECTOMELT_URL (default http://localhost:7070); TECTOMELT_TOKEN is sent as a bearer token when
// set. Any HTTP error ends the program with exit status 1 and the problem the service returned.
// Scenarios are invented; results are research estimates, not hazard or site assessments.

const BASE = (process.env.TECTOMELT_URL ?? "http://localhost:7070").replace(/\/$/, "");
const TOKEN = process.env.TECTOMELT_TOKEN;

/** Calls the service; throws with the problem details on any HTTP error. */
async function call(method, path, body) {
  const headers = { Accept: "application/json" };
  if (body !== undefined) headers["Content-Type"] = "application/json";
  if (TOKEN) headers.Authorization = `Bearer ${TOKEN}`;
  const res = await fetch(BASE + path, {
    method, headers, body: body === undefined ? undefined : JSON.stringify(body),
  });
  const text = await res.text();
  if (!res.ok) {
    let why = text.slice(0, 300);
    try {
      const p = JSON.parse(text);
      why = [p.detail, ...(p.errors ?? []).map((e) => `${e.field}: ${e.message}`)].join("; ");
    } catch { /* not JSON */ }
    throw new Error(`${method} ${path} -> HTTP ${res.status}: ${why}`);
  }
  return JSON.parse(text);
}

// The panels: a title, the request, and how to turn the answer into label/value rows.
const PANELS = [
  {
    title: "Service",
    request: () => call("GET", "/v1/health"),
    rows: (r) => [["status", r.status], ["version", r.version]],
  },
  {
    title: "Fictional Varrow Rise: ridge at 48 mm/yr over 1340 °C mantle",
    request: () => call("POST", "/v1/settings/mid-ocean-ridge", {
      potentialTemperatureC: 1340, bulkWaterWtPct: 0, fullSpreadingRateMmPerYr: 48,
    }),
    rows: (r) => [
      ["crustal thickness", `${r.crustalThicknessKm.toFixed(2)} km`],
      ["new crust", `${(1e6 * r.meltProductionKm3PerYrPerKm).toFixed(0)} km³/Myr per km`],
      ["onset of melting", r.column.onset ? `${r.column.onset.depthKm.toFixed(1)} km` : "none"],
      ["maximum melt fraction", `${(100 * r.column.maxMeltFraction).toFixed(1)} %`],
    ],
  },
  {
    title: "Invented Harrow Plateau: pressure at depth (42 km crust)",
    request: () => call("POST", "/v1/pressure", { depthsKm: [10, 42, 60, 100, 150], crustThicknessKm: 42 }),
    rows: (r) => r.points.map((p) => [`${p.depthKm} km`, `${p.pressureGPa.toFixed(3)} GPa`]),
  },
  {
    title: "Invented Harrow Plateau: depth of pressure (42 km crust)",
    request: () => call("POST", "/v1/pressure", { pressuresGPa: [1, 2, 3], crustThicknessKm: 42 }),
    rows: (r) => r.points.map((p) => [`${p.pressureGPa} GPa`, `${p.depthKm.toFixed(1)} km`]),
  },
  {
    title: "Invented Harrow Plateau: geotherm (62 mW/m², 38 km crust, Tp 1330 °C)",
    request: () => call("POST", "/v1/geotherm", {
      lithosphere: { type: "continental", surfaceHeatFlowMWPerM2: 62, crustThicknessKm: 38 },
      potentialTemperatureC: 1330, maxDepthKm: 250, stepKm: 50,
    }),
    rows: (r) => [
      ["Moho temperature", `${r.mohoTemperatureC.toFixed(0)} °C`],
      ["base of the thermal lithosphere", `${r.lithosphereBaseDepthKm.toFixed(1)} km`],
      ...r.points.map((p) => [`T at ${p.depthKm} km`, `${p.temperatureC.toFixed(0)} °C`]),
    ],
  },
  {
    title: "Invented Tessaly arc: wedge at 100 km, 1300 °C, 0.4 wt% slab water",
    request: () => call("POST", "/v1/settings/subduction", {
      depthKm: 100, wedgeTemperatureC: 1300, bulkWaterWtPct: 0.4, slabWaterFluxKgPerMPerYr: 5000,
    }),
    rows: (r) => [
      ["dry solidus", `${r.drySolidusC.toFixed(0)} °C`],
      ["solidus with this water", `${r.wetSolidusC.toFixed(0)} °C`],
      ["melt fraction", `${(100 * r.meltFraction).toFixed(1)} %`],
      ["water in the melt", `${r.waterInMeltWtPct.toFixed(2)} wt%`],
      ["magma production", `${(1e6 * r.magmaProductionKm3PerYrPerKm).toFixed(1)} km³/Myr per km of arc`],
    ],
  },
  {
    title: "Invented Harrow Plateau: basalt needed to bring pelite from 450 to 850 °C",
    request: () => call("POST", "/v1/crustal-heating/budget", {
      crust: {
        initialTemperatureC: 450, densityKgPerM3: 2750, heatCapacityJPerKgK: 1050, latentHeatJPerKg: 280000,
        meltCurve: [{ temperatureC: 750, meltFraction: 0 }, { temperatureC: 850, meltFraction: 0.25 },
          { temperatureC: 1000, meltFraction: 0.6 }],
      },
      intrusion: {
        temperatureC: 1230, densityKgPerM3: 2900, heatCapacityJPerKgK: 1100, latentHeatJPerKg: 400000,
        meltingInterval: { solidusC: 1000, liquidusC: 1200 },
      },
      finalTemperatureC: 850,
    }),
    rows: (r) => [
      ["crustal melt fraction reached", `${(100 * r.crustMeltFraction).toFixed(0)} %`],
      ["basalt per metre of crust (lower bound)", `${r.basaltToCrustThicknessRatio.toFixed(3)} m`],
    ],
  },
];

function box(title, rows) {
  const width = Math.max(title.length, ...rows.map(([k, v]) => String(k).length + String(v).length + 3));
  const line = "─".repeat(width + 2);
  const out = [`┌${line}┐`, `│ ${title.padEnd(width)} │`, `├${line}┤`];
  for (const [k, v] of rows) {
    const gap = width - String(k).length - String(v).length;
    out.push(`│ ${k}${" ".repeat(gap)}${v} │`);
  }
  out.push(`└${line}┘`);
  return out.join("\n");
}

async function main() {
  console.log(`tectomelt at ${BASE}`);
  // the panels load concurrently, as on a dashboard
  const answers = await Promise.all(PANELS.map((p) => p.request()));
  PANELS.forEach((p, i) => console.log(box(p.title, p.rows(answers[i]))));
}

main().catch((e) => {
  console.error(`error: ${e.message}${e.cause ? ` (${e.cause.code ?? e.cause.message})` : ""}`);
  process.exitCode = 1;
});
