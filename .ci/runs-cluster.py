#!/usr/bin/env python3
"""Runs across processes, with the packaged jar (run by .ci/run):

  restart   one instance on the embedded database: a run is started, the process is killed
            (SIGKILL) part-way, a new process on the same data folder finishes the run; every
            point computed before the kill is still there with the same values, none is lost
            or stored twice.
  replicas  two instances on one PostgreSQL database: both compute points of the same run
            (each one's tectomelt_run_points_total grows); one is killed part-way and the
            other finishes the run after taking over its chunks.

  db-outage one instance on PostgreSQL: a run is started, the PostgreSQL server is stopped
            part-way (.ci/postgres.sh stop); while it is down the run endpoints answer 503
            storage-unavailable naming the database and the cause, health and a computing
            route still answer 200; the server is started again and the run finishes with
            every point stored once, those read before the outage unchanged, and a
            statusReason saying when it was interrupted and resumed.

Usage: runs-cluster.py JAR restart
       runs-cluster.py JAR replicas JDBC_URL USER PASSWORD
       runs-cluster.py JAR db-outage JDBC_URL USER PASSWORD PG_DIR PG_PORT
Prints one "ok:" line per check and exits non-zero on the first failure.
"""
import json
import os
import re
import signal
import subprocess
import sys
import tempfile
import time
import urllib.error
import urllib.request

# McKenzie & Bickle (1988) columns cost milliseconds each (their melt law is inverted by root
# finding at every step), so a few hundred points take long enough to kill an instance mid-run
SLOW_SWEEP = {
    "operation": "mid-ocean-ridge",
    "request": {"lithology": "peridotite-mckenzie-bickle1988"},
    "sweep": {"potentialTemperatureC": {"from": 1250, "to": 1550, "steps": 120},
              "fullSpreadingRateMmPerYr": {"from": 10, "to": 100, "steps": 10}},
    "outputs": ["crustalThicknessKm"],
    "label": "CI: Skerry Ridge segments, killed part-way",
}
TOTAL = 1200


def start(jar, env, log):
    full = dict(os.environ, PORT="0", HOST="127.0.0.1", TECTOMELT_RUN_THREADS="1",
                TECTOMELT_RUN_HEARTBEAT_MS="1000", TECTOMELT_RUN_POLL_MS="200")
    full.update(env)
    out = open(log, "w")
    proc = subprocess.Popen(["java", "-Xmx256m", "-jar", jar], env=full, stdout=out, stderr=subprocess.STDOUT)
    deadline = time.time() + 120
    while time.time() < deadline:
        if proc.poll() is not None:
            sys.exit(f"the service exited ({proc.returncode}):\n" + open(log).read())
        m = re.search(r"listening on (http://127\.0\.0\.1:\d+)", open(log).read())
        if m:
            return proc, m.group(1).rstrip("/")
        time.sleep(0.2)
    proc.kill()
    sys.exit("the service did not report its port:\n" + open(log).read())


def call(url, method="GET", body=None):
    data = None if body is None else json.dumps(body).encode()
    req = urllib.request.Request(url, data=data, method=method,
                                 headers={"Content-Type": "application/json"} if data else {})
    with urllib.request.urlopen(req, timeout=30) as r:
        return r.status, r.headers, r.read().decode()


def call_any(url, method="GET", body=None):
    """call() that returns an HTTP error's status, headers and body instead of raising."""
    try:
        return call(url, method, body)
    except urllib.error.HTTPError as e:
        return e.code, e.headers, e.read().decode()


def run(base, rid):
    return json.loads(call(f"{base}/v1/runs/{rid}")[2])


def rows(base, rid):
    return json.loads(call(f"{base}/v1/runs/{rid}/results")[2])


def points_total(base):
    text = call(f"{base}/metrics")[2]
    m = re.search(r"^tectomelt_run_points_total (\S+)$", text, re.M)
    return float(m.group(1)) if m else 0.0


def wait(predicate, what, seconds):
    deadline = time.time() + seconds
    while time.time() < deadline:
        v = predicate()
        if v:
            return v
        time.sleep(0.1)
    sys.exit(f"FAILED: {what} within {seconds} s")


def ok(msg):
    print("ok:", msg, flush=True)


def check_complete(base, rid, before=None, event="the kill"):
    final = wait(lambda: (lambda r: r if r["status"] not in ("queued", "running") else None)(run(base, rid)),
                 "the run finished", 600)
    if final["status"] != "succeeded" or final["progress"]["done"] != TOTAL:
        sys.exit(f"FAILED: run ended {final['status']} with progress {final['progress']}")
    got = rows(base, rid)
    idx = [r["index"] for r in got]
    if idx != list(range(TOTAL)):
        sys.exit(f"FAILED: {len(idx)} rows, {len(set(idx))} distinct indexes, expected 0..{TOTAL - 1} once each")
    ok(f"run {rid} succeeded with {TOTAL} rows, each index once")
    if before is not None:
        by_index = {r["index"]: r for r in got}
        changed = [r["index"] for r in before if by_index.get(r["index"]) != r]
        if changed:
            sys.exit(f"FAILED: points computed before {event} changed or vanished: {changed[:10]}")
        ok(f"the {len(before)} points read before {event} are kept unchanged")
    return final


def restart(jar):
    work = tempfile.mkdtemp(prefix="tectomelt-restart-")
    env = {"TECTOMELT_DATA_DIR": os.path.join(work, "data"), "TECTOMELT_INSTANCE_NAME": "first"}
    proc, base = start(jar, env, os.path.join(work, "first.log"))
    status, headers, body = call(f"{base}/v1/runs", "POST", SLOW_SWEEP)
    rid = json.loads(body)["id"]
    ok(f"run {rid} accepted ({status}, {headers['Location']})")
    wait(lambda: run(base, rid)["progress"]["done"] >= 50, "50 points computed before the kill", 300)
    before = rows(base, rid)
    proc.send_signal(signal.SIGKILL)
    proc.wait()
    ok(f"first process killed with {len(before)}+ points stored")
    env["TECTOMELT_INSTANCE_NAME"] = "second"
    proc2, base2 = start(jar, env, os.path.join(work, "second.log"))
    try:
        r = run(base2, rid)
        if r["progress"]["done"] < len(before):
            sys.exit(f"FAILED: after the restart only {r['progress']['done']} points, {len(before)} were read before")
        ok(f"after the restart the run is {r['status']} at {r['progress']['done']}/{TOTAL}")
        check_complete(base2, rid, before)
        if points_total(base2) >= TOTAL:
            sys.exit("FAILED: the restarted process recomputed every point")
        ok(f"the restarted process computed {points_total(base2):.0f} points, not all {TOTAL}")
    finally:
        proc2.terminate()
        proc2.wait(30)


def replicas(jar, url, user, password):
    work = tempfile.mkdtemp(prefix="tectomelt-replicas-")
    common = {"TECTOMELT_DATABASE_URL": url, "TECTOMELT_DATABASE_USER": user, "TECTOMELT_DATABASE_PASSWORD": password}
    a, base_a = start(jar, dict(common, TECTOMELT_INSTANCE_NAME="replica-a"), os.path.join(work, "a.log"))
    b, base_b = start(jar, dict(common, TECTOMELT_INSTANCE_NAME="replica-b"), os.path.join(work, "b.log"))
    try:
        status, _, body = call(f"{base_a}/v1/runs", "POST", SLOW_SWEEP)
        rid = json.loads(body)["id"]
        ok(f"run {rid} accepted by replica a ({status})")
        seen_on_b = wait(lambda: run(base_b, rid)["id"] == rid, "replica b reads the run", 30)
        wait(lambda: points_total(base_a) > 0 and points_total(base_b) > 0, "both replicas computed points", 300)
        pa, pb = points_total(base_a), points_total(base_b)
        ok(f"both replicas computed points of the run: a {pa:.0f}, b {pb:.0f}")
        done = run(base_b, rid)["progress"]["done"]
        if done >= TOTAL:
            sys.exit("FAILED: the run finished before a replica could be killed; make it longer")
        a.send_signal(signal.SIGKILL)
        a.wait()
        ok(f"replica a killed at {done}/{TOTAL}")
        check_complete(base_b, rid)
        ok(f"replica b finished the run alone ({points_total(base_b):.0f} points)")
    finally:
        for p in (a, b):
            if p.poll() is None:
                p.terminate()
                p.wait(30)


def postgres(action, pg_dir, pg_port=None):
    script = os.path.join(os.path.dirname(os.path.abspath(__file__)), "postgres.sh")
    args = ["bash", script, action, pg_dir] + ([str(pg_port)] if pg_port else [])
    subprocess.run(args, check=True, stdout=subprocess.DEVNULL)


def expect_storage_problem(base, method, path, body=None):
    status, headers, text = call_any(f"{base}{path}", method, body)
    if status != 503:
        sys.exit(f"FAILED: {method} {path} with the database down answered {status}: {text[:300]}")
    problem = json.loads(text)
    detail = problem.get("detail", "")
    if (problem.get("type") != "/problems/storage-unavailable" or "jdbc:postgresql:" not in detail
            or "failed:" not in detail or not headers.get("Retry-After")):
        sys.exit(f"FAILED: {method} {path}: expected a storage-unavailable problem naming the database and the"
                 f" cause, with Retry-After; got {headers.get('Retry-After')!r} {text[:400]}")
    return detail


def db_outage(jar, url, user, password, pg_dir, pg_port):
    work = tempfile.mkdtemp(prefix="tectomelt-outage-")
    env = {"TECTOMELT_DATABASE_URL": url, "TECTOMELT_DATABASE_USER": user, "TECTOMELT_DATABASE_PASSWORD": password,
           "TECTOMELT_INSTANCE_NAME": "outage", "TECTOMELT_RUN_THREADS": "2"}
    proc, base = start(jar, env, os.path.join(work, "outage.log"))
    pg_down = False
    try:
        status, _, body = call(f"{base}/v1/runs", "POST", SLOW_SWEEP)
        rid = json.loads(body)["id"]
        ok(f"run {rid} accepted ({status})")
        wait(lambda: run(base, rid)["progress"]["done"] >= 50, "50 points computed before the outage", 300)
        before = rows(base, rid)
        postgres("stop", pg_dir)
        pg_down = True
        down_at = time.time()
        ok(f"PostgreSQL stopped with {len(before)}+ of {TOTAL} points stored")
        detail = expect_storage_problem(base, "GET", f"/v1/runs/{rid}")
        ok(f"GET /v1/runs/{{id}} answers 503 storage-unavailable: {detail}")
        expect_storage_problem(base, "GET", f"/v1/runs/{rid}/results")
        expect_storage_problem(base, "GET", "/v1/runs")
        expect_storage_problem(base, "POST", "/v1/runs", SLOW_SWEEP)
        ok("results, the listing and a new run answer 503 storage-unavailable too (nothing accepted unstored)")
        status, _, text = call_any(f"{base}/v1/health")
        if status != 200 or json.loads(text).get("status") != "up":
            sys.exit(f"FAILED: /v1/health with the database down answered {status}: {text}")
        status, _, text = call_any(f"{base}/v1/pressure", "POST", {"depthsKm": [10, 30]})
        if status != 200:
            sys.exit(f"FAILED: a computing route with the database down answered {status}: {text[:300]}")
        ok("/v1/health answers 200 up (liveness: the process is fine) and /v1/pressure still computes")
        # long enough for chunks to fail on the database and for their heartbeats to go stale
        time.sleep(max(0.0, 8 - (time.time() - down_at)))
        postgres("start", pg_dir, pg_port)
        pg_down = False
        ok(f"PostgreSQL started again after {time.time() - down_at:.1f} s")
        final = check_complete(base, rid, before, "the outage")
        reason = final.get("statusReason", "")
        if "interrupted" not in reason or "resumed" not in reason:
            sys.exit(f"FAILED: the finished run does not say it was interrupted and resumed: {reason!r}")
        ok(f"the run says why it paused: {reason}")
        log = open(os.path.join(work, "outage.log")).read()
        if "Exception in thread" in log:
            sys.exit("FAILED: an uncaught exception in the service log:\n" + log[-4000:])
    finally:
        if pg_down:
            postgres("start", pg_dir, pg_port)
        if proc.poll() is None:
            proc.terminate()
            proc.wait(30)


if __name__ == "__main__":
    if len(sys.argv) >= 3 and sys.argv[2] == "restart":
        restart(sys.argv[1])
    elif len(sys.argv) >= 6 and sys.argv[2] == "replicas":
        replicas(sys.argv[1], sys.argv[3], sys.argv[4], sys.argv[5])
    elif len(sys.argv) >= 8 and sys.argv[2] == "db-outage":
        db_outage(sys.argv[1], sys.argv[3], sys.argv[4], sys.argv[5], sys.argv[6], sys.argv[7])
    else:
        sys.exit(__doc__)
