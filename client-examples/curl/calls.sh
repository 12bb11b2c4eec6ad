#!/usr/bin/env bash
# One call per endpoint of a running tectomelt service, with curl.
#
#   TECTOMELT_URL    service address (default http://localhost:7070)
#   TECTOMELT_TOKEN  sent as "Authorization: Bearer ..." when set (servers that ask for one)
#
# Every call uses --fail-with-body: an HTTP error prints the problem+json the service returned
# and stops the script with a non-zero status. Scenarios are invented, for demonstration;
# results are research estimates, not hazard, geothermal or site assessments.
set -euo pipefail

URL="${TECTOMELT_URL:-http://localhost:7070}"
URL="${URL%/}"
AUTH=()
if [ -n "${TECTOMELT_TOKEN:-}" ]; then
  AUTH=(-H "Authorization: Bearer ${TECTOMELT_TOKEN}")
fi

# get PATH — prints the JSON answer
get() {
  echo "== GET $1"
  curl -sS --fail-with-body "${AUTH[@]}" "$URL$1"
  echo
}

# post PATH JSON — prints the JSON answer
post() {
  echo "== POST $1"
  curl -sS --fail-with-body "${AUTH[@]}" -X POST "$URL$1" \
       -H 'Content-Type: application/json' -d "$2"
  echo
}

get /v1/health

echo "== GET /openapi.yaml"
curl -sS --fail-with-body "${AUTH[@]}" -o /dev/null -w 'specification: HTTP %{http_code}, %{size_download} bytes\n' \
     "$URL/openapi.yaml"

echo "== GET /metrics"
curl -sS --fail-with-body "${AUTH[@]}" -o /dev/null -w 'metrics: HTTP %{http_code}, %{size_download} bytes of Prometheus text\n' \
     "$URL/metrics"

# Pressure at three depths under the made-up Harrow Plateau (42 km of crust).
post /v1/pressure '{"depthsKm": [20, 42, 100], "crustThicknessKm": 42}'

# Geotherm of the made-up Harrow Plateau: continental, 62 mW/m², 38 km crust, over a 1330 °C adiabat.
post /v1/geotherm '{"lithosphere": {"type": "continental", "surfaceHeatFlowMWPerM2": 62, "crustThicknessKm": 38},
                    "potentialTemperatureC": 1330, "maxDepthKm": 200, "stepKm": 50}'

# The lithologies the service knows, with their validity ranges.
get /v1/lithologies

# Melt fraction of dry peridotite at 2 GPa and 1400 °C (a made-up xenolith's conditions).
post /v1/melt-fraction '{"lithology": "peridotite-katz2003", "pressureGPa": 2, "temperatureC": 1400}'

# Where a 1350 °C adiabat crosses the peridotite solidus (every 20 km down to 120 km).
post /v1/solidus-crossings '{"lithology": "peridotite-katz2003",
                             "path": {"adiabat": {"potentialTemperatureC": 1350, "maxDepthKm": 120, "depthStepKm": 20}}}'

# A passive decompression column at 1350 °C under a 6 km lid, reported every 10 km.
post /v1/decompression-melting '{"lithology": "peridotite-katz2003", "potentialTemperatureC": 1350,
                                 "lidDepthKm": 6, "upwelling": "passive", "stepKm": 10}'

# The fictional Varrow Rise: crust made by a 48 mm/yr ridge over dry 1340 °C mantle.
post /v1/settings/mid-ocean-ridge '{"potentialTemperatureC": 1340, "bulkWaterWtPct": 0, "fullSpreadingRateMmPerYr": 48}'

# The invented Ostra plume beneath 80 km of lithosphere.
post /v1/settings/hotspot '{"potentialTemperatureC": 1480, "ambientPotentialTemperatureC": 1340,
                            "lithosphereThicknessKm": 80, "plumeRadiusKm": 100, "upwellingVelocityCmPerYr": 5}'

# The made-up Selka rift, stretched threefold.
post /v1/settings/continental-rift '{"potentialTemperatureC": 1360, "stretchingFactor": 3,
                                     "lithosphereThicknessKm": 120, "crustThicknessKm": 36}'

# Flux melting in the wedge of the made-up Tessaly arc: 100 km, 1300 °C, 0.4 wt% water from the slab.
post /v1/settings/subduction '{"depthKm": 100, "wedgeTemperatureC": 1300, "bulkWaterWtPct": 0.4,
                               "slabWaterFluxKgPerMPerYr": 5000, "maxWaterWtPct": 0.5}'

# Heating budget under the made-up Harrow Plateau: how much basalt brings pelitic crust from
# 450 to 850 °C? (No-loss energy balance, a lower bound on the basalt.)
post /v1/crustal-heating/budget '{"crust": {"initialTemperatureC": 450, "densityKgPerM3": 2750, "heatCapacityJPerKgK": 1050,
                                            "latentHeatJPerKg": 280000,
                                            "meltCurve": [{"temperatureC": 750, "meltFraction": 0}, {"temperatureC": 850, "meltFraction": 0.25},
                                                          {"temperatureC": 1000, "meltFraction": 0.6}]},
                                  "intrusion": {"temperatureC": 1230, "densityKgPerM3": 2900, "heatCapacityJPerKgK": 1100,
                                                "latentHeatJPerKg": 400000, "meltingInterval": {"solidusC": 1000, "liquidusC": 1200},
                                                "thicknessM": 500},
                                  "finalTemperatureC": 850}'

# One 250 m basalt sill at 28 km in that crust, followed for 100 kyr (series every 25 kyr).
post /v1/crustal-heating/sill '{"crust": {"initialTemperatureC": 450, "conductivityWPerMK": 2.5, "densityKgPerM3": 2750,
                                          "heatCapacityJPerKgK": 1050, "latentHeatJPerKg": 280000,
                                          "meltCurve": [{"temperatureC": 750, "meltFraction": 0}, {"temperatureC": 850, "meltFraction": 0.25},
                                                        {"temperatureC": 1000, "meltFraction": 0.6}]},
                                "intrusion": {"temperatureC": 1230, "thicknessM": 250, "topDepthKm": 28, "conductivityWPerMK": 2.5,
                                              "densityKgPerM3": 2900, "heatCapacityJPerKgK": 1100, "latentHeatJPerKg": 400000,
                                              "meltingInterval": {"solidusC": 1000, "liquidusC": 1200}},
                                "durationKyr": 100, "outputEveryKyr": 25}'
