#!/usr/bin/env python3
"""The server's CPU time per 10,000-point hydrous melt-fraction batch (CSV, three fields), for one or
more jars in turn: the same measure for a before/after comparison, less sensitive to a shared
machine than wall time.

For each jar: start it on loopback (-Xmx256m, SerialGC, result cache off), send 30 untimed batches,
then, three times, N batches (default 40), reading the server process's utime + stime from
/proc/PID/stat before and after; prints CPU ms and wall ms per batch. The batch is sent as
"points" (a list of objects), the form every build accepts. The points are an invented grid
(0.5-6 GPa, 1000-1500 degC, 0.1 wt% water), for a benchmark only.

Needs: requests and numpy (python3 -m venv /tmp/venv && /tmp/venv/bin/pip install numpy requests)
Run:   /tmp/venv/bin/python .ci/load/batch-server-cpu.py BEFORE.jar service/target/tectomelt.jar [--batches 40]
"""
import argparse
import json
import os
import re
import subprocess
import tempfile
import time

import numpy as np
import requests


def run(jar, batches):
    env = dict(os.environ, HOST="127.0.0.1", PORT="0", TECTOMELT_CACHE_MB="0",
               TECTOMELT_DATA_DIR=tempfile.mkdtemp(prefix="tectomelt-cpu-"))
    log = tempfile.NamedTemporaryFile("w+", suffix=".log", delete=False)
    proc = subprocess.Popen(["java", "-Xmx256m", "-XX:+UseSerialGC", "-jar", jar], stdout=log,
                            stderr=subprocess.STDOUT, env=env)
    try:
        url = None
        for _ in range(600):
            time.sleep(0.2)
            m = re.search(r"listening on http://127\.0\.0\.1:(\d+)/", open(log.name).read())
            if m:
                url = "http://127.0.0.1:" + m.group(1)
                break
        if url is None:
            raise SystemExit("server did not start:\n" + open(log.name).read())

        def cpu():
            fields = open(f"/proc/{proc.pid}/stat").read().split(")")[1].split()
            return (int(fields[11]) + int(fields[12])) / os.sysconf("SC_CLK_TCK")

        ps = np.repeat(np.linspace(0.5, 6.0, 100), 100)
        ts = np.tile(np.linspace(1000.0, 1500.0, 100), 100)
        body = json.dumps({"lithology": "peridotite-katz2003", "bulkWaterWtPct": 0.1,
                           "points": [{"pressureGPa": float(p), "temperatureC": float(t)} for p, t in zip(ps, ts)]})
        session = requests.Session()

        def go(k):
            for _ in range(k):
                r = session.post(url + "/v1/melt-fraction", data=body,
                                 params={"fields": "meltFraction,solidusC,waterInMeltWtPct"},
                                 headers={"Content-Type": "application/json", "Accept": "text/csv"})
                r.raise_for_status()

        go(30)
        for _ in range(3):
            c0, t0 = cpu(), time.perf_counter()
            go(batches)
            c1, t1 = cpu(), time.perf_counter()
            print(f"| {os.path.basename(jar)} | {1e3 * (c1 - c0) / batches:.1f} | {1e3 * (t1 - t0) / batches:.1f} |")
    finally:
        proc.terminate()
        proc.wait()


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument("jars", nargs="+")
    ap.add_argument("--batches", type=int, default=40)
    args = ap.parse_args()
    print(f"load average at the start: {os.getloadavg()[0]:.1f}")
    print("| jar | server CPU ms per batch | wall ms per batch |")
    print("|---|---|---|")
    for jar in args.jars:
        run(jar, args.batches)
    print(f"load average at the end: {os.getloadavg()[0]:.1f}")


if __name__ == "__main__":
    main()
