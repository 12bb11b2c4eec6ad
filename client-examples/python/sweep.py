#!/usr/bin/env python3
"""Run a parameter sweep against a tectomelt service and print the results as a table.

Standard library only (Python 3.8+). Usage:

    python3 sweep.py                 # the default sweep (DEFAULT_SWEEP below)
    python3 sweep.py --sweep ridge   # another sweep from SWEEPS
    python3 sweep.py --list          # what sweeps there are

Environment: TECTOMELT_URL (default http://localhost:7070); TECTOMELT_TOKEN, sent as a bearer
token when the server asks for one. Any HTTP error ends the script with exit status 1, after
printing the problem the service returned.

The scenarios are invented, for demonstration. Results are research estimates, not hazard,
geothermal or site assessments.
"""

import argparse
import json
import os
import sys
import urllib.error
import urllib.request

BASE_URL = os.environ.get("TECTOMELT_URL", "http://localhost:7070").rstrip("/")


def frange(start, stop, step):
    """start, start + step, ... up to and including stop."""
    n = int(round((stop - start) / step))
    return [round(start + i * step, 10) for i in range(n + 1)]


# Each sweep: the endpoint, the values of the one input that varies, the request for a value,
# and the columns to print (heading, function of (value, response)).
SWEEPS = {
    "ridge": {
        "title": "Crustal thickness against mantle potential temperature at a fictional ridge segment (48 mm/yr, dry)",
        "endpoint": "/v1/settings/mid-ocean-ridge",
        "values": frange(1250, 1450, 25),
        "body": lambda tp: {"potentialTemperatureC": tp, "bulkWaterWtPct": 0,
                            "fullSpreadingRateMmPerYr": 48, "lithology": "peridotite-katz2003"},
        "columns": [
            ("Tp (°C)", lambda v, r: v),
            ("crust (km)", lambda v, r: r["crustalThicknessKm"]),
            ("onset (km)", lambda v, r: (r["column"]["onset"] or {}).get("depthKm")),
            ("mean F (%)", lambda v, r: 100 * r["column"]["meanMeltFraction"]),
            ("new crust (km³/Myr per km)", lambda v, r: 1e6 * r["meltProductionKm3PerYrPerKm"]),
        ],
    },
    "moho": {
        "title": "Moho temperature and lithosphere thickness against surface heat flow (invented plateau, 38 km crust)",
        "endpoint": "/v1/geotherm",
        "values": frange(40, 90, 10),
        "body": lambda q0: {"lithosphere": {"type": "continental", "surfaceHeatFlowMWPerM2": q0, "crustThicknessKm": 38},
                            "potentialTemperatureC": 1330, "maxDepthKm": 300, "stepKm": 5},
        "columns": [
            ("q0 (mW/m²)", lambda v, r: v),
            ("Moho T (°C)", lambda v, r: r["mohoTemperatureC"]),
            ("lithosphere base (km)", lambda v, r: r["lithosphereBaseDepthKm"]),
        ],
    },
    "pressure": {
        "title": "Depth of 1, 2 and 3 GPa against crust thickness (invented plateau)",
        "endpoint": "/v1/pressure",
        "values": frange(0, 60, 10),
        "body": lambda crust: {"pressuresGPa": [1, 2, 3], "crustThicknessKm": crust},
        "columns": [
            ("crust (km)", lambda v, r: v),
            ("1 GPa at (km)", lambda v, r: r["points"][0]["depthKm"]),
            ("2 GPa at (km)", lambda v, r: r["points"][1]["depthKm"]),
            ("3 GPa at (km)", lambda v, r: r["points"][2]["depthKm"]),
        ],
    },
}

# The sweep run without --sweep.
DEFAULT_SWEEP = "ridge"


class ServiceError(Exception):
    """An HTTP error from the service, with the problem details it sent."""


def post(path, body):
    """POST a JSON body and return the decoded JSON answer; raise ServiceError on any HTTP error."""
    request = urllib.request.Request(
        BASE_URL + path,
        data=json.dumps(body).encode("utf-8"),
        headers={"Content-Type": "application/json", "Accept": "application/json"},
        method="POST",
    )
    token = os.environ.get("TECTOMELT_TOKEN")
    if token:
        request.add_header("Authorization", "Bearer " + token)
    try:
        with urllib.request.urlopen(request, timeout=60) as response:
            return json.load(response)
    except urllib.error.HTTPError as e:
        detail = e.read().decode("utf-8", "replace")
        try:
            problem = json.loads(detail)
            errors = "; ".join(f"{x['field']}: {x['message']}" for x in problem.get("errors", []))
            detail = problem.get("detail", "") + (f" ({errors})" if errors else "")
        except ValueError:
            pass
        raise ServiceError(f"POST {path} -> HTTP {e.code}: {detail}") from None


def run(name):
    """Runs sweep `name`; returns (headings, rows)."""
    sweep = SWEEPS[name]
    headings = [c[0] for c in sweep["columns"]]
    rows = []
    for value in sweep["values"]:
        answer = post(sweep["endpoint"], sweep["body"](value))
        rows.append([column(value, answer) for _, column in sweep["columns"]])
    return headings, rows


def print_table(title, headings, rows):
    widths = [max(len(h), 10) for h in headings]
    print(title)
    print("  ".join(h.rjust(w) for h, w in zip(headings, widths)))
    for row in rows:
        print("  ".join(cell(x).rjust(w) for x, w in zip(row, widths)))


def cell(x):
    if x is None:
        return "—"  # e.g. no onset: the mantle is too cold to melt
    return f"{x:.2f}" if isinstance(x, float) else str(x)


def main(argv=None):
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--sweep", default=DEFAULT_SWEEP, choices=sorted(SWEEPS))
    parser.add_argument("--list", action="store_true", help="list the sweeps and exit")
    args = parser.parse_args(argv)
    if args.list:
        for name, sweep in SWEEPS.items():
            print(f"{name:10} {sweep['endpoint']:32} {sweep['title']}")
        return 0
    try:
        headings, rows = run(args.sweep)
    except ServiceError as e:
        print(f"error: {e}", file=sys.stderr)
        return 1
    except urllib.error.URLError as e:
        print(f"error: cannot reach {BASE_URL}: {e.reason}", file=sys.stderr)
        return 1
    print_table(f"{SWEEPS[args.sweep]['title']} (POST {SWEEPS[args.sweep]['endpoint']})", headings, rows)
    return 0


if __name__ == "__main__":
    sys.exit(main())
