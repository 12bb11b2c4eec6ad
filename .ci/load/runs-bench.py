#!/usr/bin/env python3
"""Runs against individual requests, side by side in one go, on the packaged jar.

  python3 .ci/load/runs-bench.py [--jar service/target/tectomelt.jar] [--compare OLD.jar]
                                 [--rounds 3] [--warmup-s 120] [--poll-ms 20] [--no-jmh]

1. JMH RunSweepBenchmark: the single-core time of the 2,000 columns of the mid-ocean-ridge
   sweep in the engine alone (engineColumnsOf2000Points: the ridge's column, no request, no
   operation, no text), before and again after the services (the mean of the two: the machine's
   load drifts); × the service's cores = the engine's column rate the issue compares with. Beside
   it, for reference: each point computed as a run computes it (sweepOf2000Points: the request,
   the operation, the chosen outputs as text; no database), the operation alone on requests bound
   beforehand (columnsOf2000Points), and the engine columns with one thread per core at once (the
   cores' real joint rate on this machine). RunSweepCpuTime gives the thread CPU time of the engine's
   columns (and of a run's per-point path), set beside the service's CPU time per run: the columns'
   share of the service's CPU is the most a run can reach of the engine rate x cores.
2. The jar (and, with --compare, a second jar: both on loopback ports, each with a fresh
   embedded database) warmed up for --warmup-s seconds each (default 120; 2,000 individual
   requests, then four runs, and again: a lab server runs warm, and a cold JVM spent as much CPU
   compiling as computing, still a tenth after a minute of runs); then, per round and per jar:
   - the 2,000 points as 2,000 POST /v1/settings/mid-ocean-ridge from a client with two
     keep-alive connections;
   - the same 2,000 points as one run: POST /v1/runs, polled every --poll-ms until it
     succeeded, while a third connection asks GET /v1/health every 20 ms (its latencies give
     the p99).
   A run is timed twice: end to end by the client (POST sent → "succeeded" seen, so it includes
   the POST's own time and up to one poll interval), and by the run's own timestamps
   (createdAt → finishedAt, stored by the service: from accepting the run to saving its last
   point). The service's process CPU time per run is read from /proc.
Prints the medians per jar: seconds and points/s, ratios, the run's share of the engine rate by
both measures, health p50/p99 while runs computed, and whether the go was clean: the JMH figures
steady and, from /proc/stat, the CPU time the whole machine spent during the go less what this
script and its children (the services, JMH, Maven) spent, with the hypervisor's stolen time, at
most 5 % of the cores (the load average used before counted the go's own services and JMH). The
machine is shared: read ratios, not times.
"""
import argparse
import datetime
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


def bench_classpath():
    """The compiled benchmarks and their dependencies."""
    cp_file = os.path.join(ROOT, "service", "target", "bench-classpath.txt")
    subprocess.run(["mvn", "-B", "-q", "-Pbench", "-pl", "service", "test-compile", "dependency:build-classpath",
                    "-Dmdep.outputFile=" + cp_file, "-Dmdep.includeScope=test"], cwd=ROOT, check=True)
    return ":".join([os.path.join(ROOT, "service", "target", "test-classes"),
                     os.path.join(ROOT, "service", "target", "classes"), open(cp_file).read().strip()])


def cpu_time():
    """RunSweepCpuTime: (engine columns, run path) thread CPU ms per 2,000 points, medians of the late rounds."""
    out = subprocess.run(["java", "-cp", bench_classpath(), "org.tectomelt.bench.RunSweepCpuTime", "12"], cwd=ROOT,
                         check=True, capture_output=True, text=True).stdout
    m = re.search(r"median of rounds \S+: engine columns ([\d.]+) ms, run path ([\d.]+) ms", out)
    return float(m.group(1)), float(m.group(2))


def jmh(threads, only=None):
    """{benchmark method: ms per 2,000-point sweep per thread} with `threads` threads at once."""
    cp = bench_classpath()
    out = os.path.join(ROOT, "service", "target", f"jmh-runsweep-t{threads}.json")
    subprocess.run(["java", "-Djmh.ignoreLock=true", "-cp", cp, "org.openjdk.jmh.Main",
                    "RunSweepBenchmark" + ("." + only if only else ""),
                    "-f", "1", "-t", str(threads), "-wi", "3", "-w", "2s", "-i", "5", "-r", "2s",
                    "-rf", "json", "-rff", out], cwd=ROOT, check=True, stdout=subprocess.DEVNULL,
                   stderr=subprocess.DEVNULL)
    return {r["benchmark"].rsplit(".", 1)[1]: r["primaryMetric"]["score"] for r in json.load(open(out))}


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


def cpu_ms(pid):
    """User + system CPU time of the process so far, in ms."""
    fields = open(f"/proc/{pid}/stat").read().rsplit(")", 1)[1].split()
    return (int(fields[11]) + int(fields[12])) * 1000.0 / os.sysconf("SC_CLK_TCK")


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


def instant(text):
    return datetime.datetime.fromisoformat(text.replace("Z", "+00:00")).timestamp()


def as_run(port, pid, poll_s):
    """(client seconds, createdAt → finishedAt seconds, process CPU ms, health latencies)."""
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
    cpu0 = cpu_ms(pid)
    t0 = time.perf_counter()
    rid = json.loads(request(conn, "POST", "/v1/runs", SWEEP))["id"]
    sampler.start()
    while True:
        r = json.loads(request(conn, "GET", f"/v1/runs/{rid}"))
        if r["status"] not in ("queued", "running"):
            break
        time.sleep(poll_s)
    elapsed = time.perf_counter() - t0
    stop.set()
    sampler.join()
    cpu = cpu_ms(pid) - cpu0
    if r["status"] != "succeeded" or r["progress"]["done"] != len(POINTS):
        sys.exit(f"run ended {r['status']} {r['progress']}")
    own = instant(r["finishedAt"]) - instant(r["createdAt"])
    request(conn, "DELETE", f"/v1/runs/{rid}")
    conn.close()
    return elapsed, own, cpu, latencies


def machine_cpu():
    """(busy, steal) CPU seconds of the whole machine so far, from /proc/stat."""
    f = [int(x) for x in open("/proc/stat").readline().split()[1:]]
    user, nice, system, idle, iowait, irq, softirq, steal = (f + [0] * 8)[:8]
    tick = os.sysconf("SC_CLK_TCK")
    return (user + nice + system + irq + softirq) / tick, steal / tick


def own_cpu():
    """CPU seconds of this script and of every child it has waited for (services, JMH, Maven)."""
    t = os.times()
    return t.user + t.system + t.children_user + t.children_system


def quantile(xs, q):
    xs = sorted(xs)
    return xs[min(len(xs) - 1, int(q * len(xs)))]


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument("--jar", default=os.path.join(ROOT, "service", "target", "tectomelt.jar"))
    ap.add_argument("--compare", help="a second jar (say, main's) measured alternately with --jar")
    ap.add_argument("--rounds", type=int, default=3)
    ap.add_argument("--warmup-s", type=float, default=120, help="seconds of warm-up per jar")
    ap.add_argument("--poll-ms", type=float, default=20, help="the client's poll interval of a run")
    ap.add_argument("--no-jmh", action="store_true")
    a = ap.parse_args()
    cores = os.cpu_count()
    load0 = os.getloadavg()[0]
    busy0, steal0 = machine_cpu()
    own0, wall0 = own_cpu(), time.time()
    jmh1 = jmh2 = None
    if not a.no_jmh:
        jmh1, jmh2 = jmh(1), jmh(cores, "engineColumnsOf2000Points")
    jars = [("new", a.jar)] + ([("old", a.compare)] if a.compare else [])
    services = {}
    try:
        for name, jar in jars:
            services[name] = start(jar)
        for name, (proc, port) in services.items():
            until = time.time() + a.warmup_s
            while True:   # at least one of each: JIT of both paths
                individual(port)   # 2,000 requests
                for _ in range(4):   # a run is a fifth of the time of the requests: as much time on each path
                    as_run(port, proc.pid, a.poll_ms / 1000)
                if time.time() > until:
                    break
        res = {name: {"singles": [], "client": [], "own": [], "cpu": [], "health": []} for name in services}
        for _ in range(a.rounds):
            for name, (proc, port) in services.items():
                res[name]["singles"].append(individual(port))
                t, own, cpu, lat = as_run(port, proc.pid, a.poll_ms / 1000)
                res[name]["client"].append(t)
                res[name]["own"].append(own)
                res[name]["cpu"].append(cpu)
                res[name]["health"].extend(lat)
    finally:
        for proc, _ in services.values():
            proc.terminate()
            proc.wait(30)
    # the machine's load drifts: the single-core time again after the services, the mean of both used
    jmh1_after = None if a.no_jmh else jmh(1, "engineColumnsOf2000Points")
    cpu_engine, cpu_path = (None, None) if a.no_jmh else cpu_time()
    n = len(POINTS)
    print(f"machine: {cores} cores, load average {load0:.1f} at the start, {os.getloadavg()[0]:.1f} at the end "
          f"(shared with other work); warm-up {a.warmup_s:.0f} s per jar, {a.rounds} rounds, poll {a.poll_ms:.0f} ms")
    engine = None
    if jmh1 is not None:
        before, after = jmh1["engineColumnsOf2000Points"], jmh1_after["engineColumnsOf2000Points"]
        per = (before + after) / 2
        engine = n / (per / 1000.0) * cores
        print(f"JMH RunSweepBenchmark.engineColumnsOf2000Points, 1 thread: {before:.0f} ms per {n} columns before the "
              f"services, {after:.0f} ms after, mean {per:.0f} ms -> {n / (per / 1000):.0f} columns/s x {cores} cores = "
              f"{engine:.0f} points/s (the engine's column rate compared with)")
        per2 = jmh2["engineColumnsOf2000Points"]
        print(f"  the same with {cores} threads at once: {per2:.0f} ms per {n} columns per thread -> "
              f"{cores * n / (per2 / 1000):.0f} points/s together")
        busy1, steal1 = machine_cpu()
        span = (time.time() - wall0) * cores
        others = max(0.0, (busy1 - busy0) - (own_cpu() - own0)) / span
        stolen = (steal1 - steal0) / span
        print(f"  other work on the machine during the go: {100 * others:.1f} % of its cores (all CPU time in "
              f"/proc/stat less this script's and its children's), {100 * stolen:.1f} % stolen by the hypervisor")
        clean = abs(before - after) <= 0.1 * per and per2 <= 1.15 * per and others + stolen <= 0.05
        print(f"  clean go: {'yes' if clean else 'NO'} (the single-core times before and after within 10 % of each "
              f"other, {cores} threads at once within 15 % of one thread, other work and stolen time together at "
              f"most 5 % of the cores during the go; otherwise other work took the cores and the ratios below say "
              f"little)")
        sweep = jmh1["sweepOf2000Points"]
        print(f"  a run's per-point path (request, operation, outputs as text; no database), 1 thread: {sweep:.0f} ms "
              f"per sweep -> {n / (sweep / 1000):.0f} points/s")
        col = jmh1["columnsOf2000Points"]
        print(f"  the operation alone on requests bound beforehand, 1 thread: {col:.0f} ms per sweep"
              f" -> {n / (col / 1000):.0f} points/s")
        print(f"thread CPU time (RunSweepCpuTime, less sensitive to the load): {cpu_engine:.0f} ms per {n} engine "
              f"columns, {cpu_path:.0f} ms per {n} points on a run's per-point path")
    for name, jar in jars:
        r = res[name]
        s, c, o = statistics.median(r["singles"]), statistics.median(r["client"]), statistics.median(r["own"])
        print(f"[{name}] {jar}")
        print(f"  {n} points as individual requests, 2 connections: {s:.3f} s ({n / s:.0f} points/s), "
              f"rounds {[round(x, 3) for x in r['singles']]}")
        print(f"  {n} points as one run, client end to end:  {c:.3f} s ({n / c:.0f} points/s), "
              f"rounds {[round(x, 3) for x in r['client']]}")
        print(f"  {n} points as one run, createdAt->finishedAt: {o:.3f} s ({n / o:.0f} points/s), "
              f"rounds {[round(x, 3) for x in r['own']]}")
        print(f"  service CPU per run: {statistics.median(r['cpu']):.0f} ms (rounds {[round(x) for x in r['cpu']]})")
        print(f"  run vs individual requests: {s / c:.1f}x faster end to end, {s / o:.1f}x by the run's timestamps "
              f"(target >= 3x)")
        if engine is not None:
            print(f"  run rate / engine rate x cores: {100 * (n / c) / engine:.0f} % end to end, "
                  f"{100 * (n / o) / engine:.0f} % by the run's timestamps (target >= 70 %)")
        if cpu_engine is not None:
            share = 100 * cpu_engine / statistics.median(r["cpu"])
            print(f"  the engine's columns' share of the service's CPU per run: {share:.0f} % (a run cannot reach more "
                  f"of the engine rate x cores, even on free cores)")
        h = r["health"]
        print(f"  GET /v1/health while runs computed: {len(h)} calls, p50 {1000 * quantile(h, 0.5):.1f} ms, "
              f"p99 {1000 * quantile(h, 0.99):.1f} ms (target < 50 ms)")


if __name__ == "__main__":
    main()
