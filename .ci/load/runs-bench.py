#!/usr/bin/env python3
"""Runs against individual requests, side by side in one go, on the packaged jar.

  python3 .ci/load/runs-bench.py [--jar service/target/tectomelt.jar] [--rounds 3] [--no-jmh]

1. JMH RunSweepBenchmark: the single-core time of the 2,000-point mid-ocean-ridge sweep,
   each point computed as a run computes it (no database); × the service's cores = the engine rate.
2. The jar on a loopback port (fresh embedded database), warmed up; then, alternately, per round:
   - the 2,000 points as 2,000 POST /v1/settings/mid-ocean-ridge from a client with two
     keep-alive connections;
   - the same 2,000 points as one run: POST /v1/runs, polled every 20 ms until it succeeded,
     while a third connection asks GET /v1/health every 20 ms (its latencies give the p99).
Prints the medians: seconds and points/s of both, their ratio, the run's share of the engine
rate, and the health p50/p99 while runs computed. The machine is shared: read ratios, not times.
"""
import argparse
import http.client
import json
import os
import re
import statistics
import subprocess
import sys
import tempfile
import threading
import time

ROOT = os.path.dirname(os.path.dirname(os.path.dirname(os.path.abspath(__file__))))
TPS = [1250 + 300 * k / 199 for k in range(200)]
RATES = [10 + 90 * k / 9 for k in range(10)]
SWEEP = {"operation": "mid-ocean-ridge", "request": {},
         "sweep": {"potentialTemperatureC": {"from": 1250, "to": 1550, "steps": 200},
                   "fullSpreadingRateMmPerYr": {"from": 10, "to": 100, "steps": 10}},
         "outputs": ["crustalThicknessKm", "meltProductionKm3PerYrPerKm"]}
POINTS = [(tp, r) for tp in TPS for r in RATES]


def jmh_ms_per_sweep():
    cp_file = os.path.join(ROOT, "service", "target", "bench-classpath.txt")
    subprocess.run(["mvn", "-B", "-q", "-Pbench", "-pl", "service", "test-compile", "dependency:build-classpath",
                    "-Dmdep.outputFile=" + cp_file, "-Dmdep.includeScope=test"], cwd=ROOT, check=True)
    cp = ":".join([os.path.join(ROOT, "service", "target", "test-classes"),
                   os.path.join(ROOT, "service", "target", "classes"), open(cp_file).read().strip()])
    out = os.path.join(ROOT, "service", "target", "jmh-runsweep.json")
    subprocess.run(["java", "-Djmh.ignoreLock=true", "-cp", cp, "org.openjdk.jmh.Main", "RunSweepBenchmark",
                    "-f", "1", "-wi", "3", "-w", "2s", "-i", "5", "-r", "2s", "-rf", "json", "-rff", out],
                   cwd=ROOT, check=True, stdout=subprocess.DEVNULL)
    return json.load(open(out))[0]["primaryMetric"]["score"]


def start(jar):
    work = tempfile.mkdtemp(prefix="tectomelt-runs-bench-")
    log = os.path.join(work, "service.log")
    env = dict(os.environ, PORT="0", HOST="127.0.0.1", TECTOMELT_DATA_DIR=os.path.join(work, "data"))
    proc = subprocess.Popen(["java", "-Xmx512m", "-jar", jar], env=env, stdout=open(log, "w"), stderr=subprocess.STDOUT)
    for _ in range(600):
        m = re.search(r"listening on http://127\.0\.0\.1:(\d+)", open(log).read())
        if m:
            return proc, int(m.group(1))
        if proc.poll() is not None:
            sys.exit(open(log).read())
        time.sleep(0.2)
    sys.exit("the service did not start")


def request(conn, method, path, body=None):
    data = None if body is None else json.dumps(body)
    conn.request(method, path, body=data, headers={"Content-Type": "application/json"} if data else {})
    r = conn.getresponse()
    payload = r.read()
    if r.status >= 300:
        sys.exit(f"{method} {path}: HTTP {r.status} {payload[:300]!r}")
    return payload


def individual(port):
    def worker(points):
        conn = http.client.HTTPConnection("127.0.0.1", port, timeout=60)
        for tp, rate in points:
            request(conn, "POST", "/v1/settings/mid-ocean-ridge",
                    {"potentialTemperatureC": tp, "fullSpreadingRateMmPerYr": rate})
        conn.close()
    halves = [POINTS[0::2], POINTS[1::2]]
    threads = [threading.Thread(target=worker, args=(h,)) for h in halves]
    t0 = time.perf_counter()
    for t in threads:
        t.start()
    for t in threads:
        t.join()
    return time.perf_counter() - t0


def as_run(port):
    latencies = []
    stop = threading.Event()

    def health():
        conn = http.client.HTTPConnection("127.0.0.1", port, timeout=60)
        while not stop.is_set():
            t = time.perf_counter()
            request(conn, "GET", "/v1/health")
            latencies.append(time.perf_counter() - t)
            time.sleep(0.02)
        conn.close()
    conn = http.client.HTTPConnection("127.0.0.1", port, timeout=60)
    sampler = threading.Thread(target=health)
    t0 = time.perf_counter()
    rid = json.loads(request(conn, "POST", "/v1/runs", SWEEP))["id"]
    sampler.start()
    while True:
        r = json.loads(request(conn, "GET", f"/v1/runs/{rid}"))
        if r["status"] not in ("queued", "running"):
            break
        time.sleep(0.02)
    elapsed = time.perf_counter() - t0
    stop.set()
    sampler.join()
    if r["status"] != "succeeded" or r["progress"]["done"] != len(POINTS):
        sys.exit(f"run ended {r['status']} {r['progress']}")
    request(conn, "DELETE", f"/v1/runs/{rid}")
    conn.close()
    return elapsed, latencies


def quantile(xs, q):
    xs = sorted(xs)
    return xs[min(len(xs) - 1, int(q * len(xs)))]


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument("--jar", default=os.path.join(ROOT, "service", "target", "tectomelt.jar"))
    ap.add_argument("--rounds", type=int, default=3)
    ap.add_argument("--no-jmh", action="store_true")
    a = ap.parse_args()
    cores = os.cpu_count()
    jmh = None if a.no_jmh else jmh_ms_per_sweep()
    proc, port = start(a.jar)
    try:
        individual(port)   # warm-up: JIT of both paths
        as_run(port)
        singles, runs, health = [], [], []
        for _ in range(a.rounds):
            singles.append(individual(port))
            t, lat = as_run(port)
            runs.append(t)
            health.extend(lat)
    finally:
        proc.terminate()
        proc.wait(30)
    n = len(POINTS)
    s, r = statistics.median(singles), statistics.median(runs)
    print(f"machine: {cores} cores, load average {os.getloadavg()[0]:.1f} (shared with other work)")
    print(f"{n} points as individual requests, 2 connections: {s:.2f} s ({n / s:.0f} points/s), rounds {[round(x, 2) for x in singles]}")
    print(f"{n} points as one run:                       {r:.2f} s ({n / r:.0f} points/s), rounds {[round(x, 2) for x in runs]}")
    print(f"run vs individual requests: {s / r:.1f}x faster (target >= 3x)")
    if jmh is not None:
        engine = n / (jmh / 1000.0) * cores
        print(f"JMH RunSweepBenchmark: {jmh:.0f} ms per {n}-point sweep on one core -> {n / (jmh / 1000):.0f} points/s x {cores} cores = {engine:.0f} points/s")
        print(f"run rate / engine rate x cores: {100 * (n / r) / engine:.0f} % (target >= 70 %)")
    print(f"GET /v1/health while runs computed: {len(health)} calls, p50 {1000 * quantile(health, 0.5):.1f} ms, "
          f"p99 {1000 * quantile(health, 0.99):.1f} ms (target < 50 ms)")


if __name__ == "__main__":
    main()
