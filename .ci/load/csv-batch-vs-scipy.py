#!/usr/bin/env python3
"""A 10,000-point hydrous melt-fraction batch: the service (CSV, three fields, into pandas) against
the same points computed in the client by a scipy brentq loop, side by side in one run.

Starts service/target/tectomelt.jar on loopback (or uses TECTOMELT_URL), then times, best of
--repeats after --warmup untimed calls of each side (default 10):
  service: json.dumps of the request -> POST /v1/melt-fraction with Accept: text/csv and
           ?fields=meltFraction,solidusC,waterInMeltWtPct -> pandas.read_csv of the answer, once with
           the batch as "points" (a list of objects) and once as "columns" (two lists, numpy's
           tolist(), what a notebook holding arrays sends)
  client:  the same 10,000 points, Katz, Spiegelman & Langmuir (2003) hydrous melting solved per
           point with scipy.optimize.brentq (F = F_dry(T + K X^gamma), X = Xbulk/(D + F(1 - D))
           capped at saturation; their Table 2 parameters as the engine uses them, fertile cpx 0.17)
and checks that all give the same melt fractions (to 1e-6; both service forms identically) before
printing the ratios.

Needs: python3 -m venv .venv && .venv/bin/pip install scipy pandas requests
Run:   .venv/bin/python .ci/load/csv-batch-vs-scipy.py [--repeats 5]
The points are an invented grid (0.5-6 GPa, 1000-1500 degC, 0.1 wt% water), for a benchmark only.
"""
import argparse
import io
import json
import os
import re
import subprocess
import sys
import tempfile
import time

import numpy as np
import pandas as pd
import requests
from scipy.optimize import brentq

# Katz et al. (2003) Table 2 (P in GPa, T in degC, water in wt%), as in Katz2003Peridotite
A1, A2, A3 = 1085.7, 132.9, -5.1
B1, B2, B3 = 1475.0, 80.0, -3.2
C1, C2, C3 = 1780.0, 45.0, -2.0
R1, R2 = 0.50, 0.08
BETA1, BETA2 = 1.50, 1.50
K, GAMMA = 43.0, 0.75
D_WATER = 0.01
CHI1, CHI2, LAMBDA = 12.0, 1.0, 0.6
M_CPX = 0.17


def f_dry(p, t):
    ts, tl, tq = A1 + A2 * p + A3 * p * p, B1 + B2 * p + B3 * p * p, C1 + C2 * p + C3 * p * p
    if t <= ts:
        return 0.0
    f_cpx = M_CPX / (R1 + R2 * p)
    t_cpx = f_cpx ** (1 / BETA1) * (tl - ts) + ts
    if t <= t_cpx:
        return ((t - ts) / (tl - ts)) ** BETA1
    if t >= tq:
        return 1.0
    return f_cpx + (1 - f_cpx) * ((t - t_cpx) / (tq - t_cpx)) ** BETA2


def f_wet(p, t, water):
    x_sat = CHI1 * p ** LAMBDA + CHI2 * p

    def dt(f):
        return K * min(water / (D_WATER + f * (1 - D_WATER)), x_sat) ** GAMMA

    g = lambda f: f - f_dry(p, t + dt(f))
    if g(0.0) >= 0:
        return 0.0
    if g(1.0) <= 0:
        return 1.0
    return brentq(g, 0.0, 1.0, xtol=1e-12)


def start_server(jar):
    log = tempfile.NamedTemporaryFile("w+", suffix=".log", delete=False)
    env = dict(os.environ, HOST="127.0.0.1", PORT="0", TECTOMELT_CACHE_MB="0",
               TECTOMELT_DATA_DIR=tempfile.mkdtemp(prefix="tectomelt-bench-"))
    proc = subprocess.Popen(["java", "-Xmx256m", "-XX:+UseSerialGC", "-jar", jar], stdout=log,
                            stderr=subprocess.STDOUT, env=env)
    for _ in range(600):
        time.sleep(0.2)
        m = re.search(r"listening on http://127\.0\.0\.1:(\d+)/", open(log.name).read())
        if m:
            return proc, "http://127.0.0.1:" + m.group(1)
        if proc.poll() is not None:
            break
    sys.exit("server did not start:\n" + open(log.name).read())


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument("--repeats", type=int, default=5)
    ap.add_argument("--warmup", type=int, default=10,
                    help="untimed calls of each side first (a lab server runs warm; its JIT needs a few)")
    ap.add_argument("--jar", default="service/target/tectomelt.jar")
    args = ap.parse_args()
    proc, url = (None, os.environ["TECTOMELT_URL"]) if "TECTOMELT_URL" in os.environ else start_server(args.jar)
    try:
        ps = np.repeat(np.linspace(0.5, 6.0, 100), 100)
        ts = np.tile(np.linspace(1000.0, 1500.0, 100), 100)
        water = 0.1
        session = requests.Session()

        def service_points():
            return ask(json.dumps({"lithology": "peridotite-katz2003", "bulkWaterWtPct": water,
                                   "points": [{"pressureGPa": float(p), "temperatureC": float(t)}
                                              for p, t in zip(ps, ts)]}))

        def service_columns():
            return ask(json.dumps({"lithology": "peridotite-katz2003", "bulkWaterWtPct": water,
                                   "columns": {"pressureGPa": ps.tolist(), "temperatureC": ts.tolist()}}))

        def ask(body):
            r = session.post(url + "/v1/melt-fraction", data=body,
                             params={"fields": "meltFraction,solidusC,waterInMeltWtPct"},
                             headers={"Content-Type": "application/json", "Accept": "text/csv"})
            r.raise_for_status()
            return pd.read_csv(io.StringIO(r.text))

        def client():
            return np.array([f_wet(p, t, water) for p, t in zip(ps, ts)])

        sides = [service_points, service_columns, client]
        for _ in range(args.warmup):
            for fn in sides:
                fn()  # warm-up
        times = [[] for _ in sides]
        outs = [None] * len(sides)
        for _ in range(args.repeats):  # the sides in turn, so that a busy spell of the machine hits all
            for k, fn in enumerate(sides):
                t0 = time.perf_counter()
                outs[k] = fn()
                times[k].append(time.perf_counter() - t0)
        (p_best, k_best, c_best) = (min(t) for t in times)
        (p_med, k_med, c_med) = (sorted(t)[len(t) // 2] for t in times)
        frame, frame_k, local = outs
        diff = float(np.max(np.abs(frame["meltFraction"].to_numpy() - local)))
        same = frame.equals(frame_k)
        print(f"points: {len(ps)}, columns: {list(frame.columns)}, rows: {len(frame)}")
        print(f"max |F_service - F_client| = {diff:.2e}; points and columns answers identical: {same}")
        print("| side | best s | median s | scipy ÷ side (best / median) |")
        print("|---|---|---|---|")
        print(f"| service, request as points, CSV 3 fields -> pandas | {p_best:.3f} | {p_med:.3f} | "
              f"{c_best / p_best:.1f}x / {c_med / p_med:.1f}x |")
        print(f"| service, request as columns, CSV 3 fields -> pandas | {k_best:.3f} | {k_med:.3f} | "
              f"{c_best / k_best:.1f}x / {c_med / k_med:.1f}x |")
        print(f"| client, scipy brentq loop | {c_best:.3f} | {c_med:.3f} | 1x |")
        if diff > 1e-6 or not same:
            sys.exit("the sides disagree")
    finally:
        if proc:
            proc.terminate()
            proc.wait()


if __name__ == "__main__":
    main()
