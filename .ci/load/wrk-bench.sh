#!/usr/bin/env bash
# Load test of the packaged service with wrk, over loopback only.
#
# Starts service/target/tectomelt.jar with the container's heap settings on 127.0.0.1 (a free
# port), then for each endpoint runs wrk and reports requests/s, p50 and p99 latency, failed
# responses and socket errors, and the server's resident memory (VmRSS from /proc) after each run.
# With --soak it instead drives all endpoints together at a moderate rate for a while and fails on
# any error or on resident memory above the limit.
#
# Endpoints are "GET:/path" or "POST:/path=@body.json" (a file) or "POST:/path={...}" (inline).
# Default: GET:/v1/health (the framework's ceiling) and POST:/v1/pressure with
# .ci/load/bodies/pressure.json. Add routes as they land, e.g.
#   POST:/v1/melt-fraction=@.ci/load/bodies/melt-fraction.json
#
# Examples (from the repository root, after mvn -B -q -DskipTests package):
#   bash .ci/load/wrk-bench.sh                                   # 3 runs × 10 s, -t1 -c32
#   bash .ci/load/wrk-bench.sh --runs 5 --duration 20 GET:/v1/health POST:/v1/pressure=@.ci/load/bodies/pressure.json
#   bash .ci/load/wrk-bench.sh --soak 30                          # what .ci/run does
#   bash .ci/load/wrk-bench.sh --soak 3600 --connections 16       # the long soak for the lab machine
#   bash .ci/load/wrk-bench.sh --runs 6 --jvm-opts "-Xms256m -XX:+AlwaysPreTouch"  # RSS with the heap touched
#   bash .ci/load/wrk-bench.sh --baseline GET:/v1/health POST:/v1/melt-fraction=@.ci/load/bodies/melt-fraction.json
#       also starts .ci/load/TrivialServer.java (one constant GET on the same Javalin build, same
#       JVM options) and measures it in turn with the others, each run; the summary gives every
#       endpoint's median req/s and p99 as a fraction / multiple of the trivial route's
#   bash .ci/load/wrk-bench.sh --baseline --jar /tmp/before.jar --compare service/target/tectomelt.jar GET:/v1/health
#       before/after in one go: --compare starts a second server from another jar (same options) and
#       measures every endpoint on both in turn, each run; rows of the second are marked "B"
# Other options: --threads N, --warmup SECS, --heap SIZE, --delay-ms MS, --max-rss-mib N,
# --env VAR=VALUE (for the server), --out FILE (the table as Markdown), --jar PATH.
set -euo pipefail
cd "$(dirname "$0")/../.."

JAR=service/target/tectomelt.jar
DURATION=10
THREADS=1
CONNECTIONS=32
RUNS=3
WARMUP=5
HEAP=256m
JVM_OPTS=""
SOAK=0
DELAY_MS=0
MAX_RSS_MIB=512
OUT=""
BASELINE=0
COMPARE_JAR=""
B_PID=""
STARTED_PID=""
SERVER_ENV=("TECTOMELT_CACHE_MB=0")   # measure computation, not the result cache
ENDPOINTS=()

usage() { awk 'NR > 1 && /^#/ { sub(/^# ?/, ""); print; next } NR > 1 { exit }' "$0"; exit "${1:-0}"; }

while [ $# -gt 0 ]; do
  case "$1" in
    --jar) JAR="$2"; shift 2 ;;
    --duration) DURATION="$2"; shift 2 ;;
    --threads) THREADS="$2"; shift 2 ;;
    --connections) CONNECTIONS="$2"; shift 2 ;;
    --runs) RUNS="$2"; shift 2 ;;
    --warmup) WARMUP="$2"; shift 2 ;;
    --heap) HEAP="$2"; shift 2 ;;
    --jvm-opts) JVM_OPTS="$2"; shift 2 ;;
    --soak) SOAK="$2"; shift 2 ;;
    --delay-ms) DELAY_MS="$2"; shift 2 ;;
    --max-rss-mib) MAX_RSS_MIB="$2"; shift 2 ;;
    --env) SERVER_ENV+=("$2"); shift 2 ;;
    --out) OUT="$2"; shift 2 ;;
    --baseline) BASELINE=1; shift ;;
    --compare) COMPARE_JAR="$2"; shift 2 ;;
    -h|--help) usage 0 ;;
    -*) echo "unknown option $1" >&2; usage 2 ;;
    *) ENDPOINTS+=("$1"); shift ;;
  esac
done
if [ ${#ENDPOINTS[@]} -eq 0 ]; then
  ENDPOINTS=("GET:/v1/health" "POST:/v1/pressure=@.ci/load/bodies/pressure.json" "POST:/v1/melt-fraction=@.ci/load/bodies/melt-fraction.json" "POST:/v1/settings/mid-ocean-ridge=@.ci/load/bodies/mid-ocean-ridge.json")
fi
command -v wrk >/dev/null || { echo "wrk is not installed (Debian package wrk)" >&2; exit 2; }
[ -f "$JAR" ] || { echo "no $JAR: run mvn -B -q -DskipTests package first" >&2; exit 2; }

WORK=$(mktemp -d)
SERVER_PID=""
TRIVIAL_PID=""
cleanup() {
  for pid in "$SERVER_PID" "$TRIVIAL_PID" "$B_PID" "$STARTED_PID"; do
    if [ -n "$pid" ] && kill -0 "$pid" 2>/dev/null; then
      kill "$pid" 2>/dev/null || true
      wait "$pid" 2>/dev/null || true
    fi
  done
  [ -n "${KEEP_WORK:-}" ] || rm -rf "$WORK"
}
trap cleanup EXIT

# ---- endpoints → one Lua request table each
lua_string() { python3 -c 'import json,sys; print(json.dumps(sys.stdin.read()))'; }
endpoint_lua() {   # prints Lua table entries {method, path, body} for the given endpoint specs
  local spec method rest path body
  for spec in "$@"; do
    method=${spec%%:*}; rest=${spec#*:}
    if [[ "$rest" == *=* ]]; then
      path=${rest%%=*}; body=${rest#*=}
      if [[ "$body" == @* ]]; then body=$(cat "${body#@}"); fi
    else
      path=$rest; body=""
    fi
    printf '  {method = "%s", path = "%s", body = %s},\n' "$method" "$path" "$(printf '%s' "$body" | lua_string)"
  done
}
make_script() {    # $1 = script file, rest = endpoint specs
  local file=$1; shift
  {
    echo "local endpoints = {"
    endpoint_lua "$@"
    echo "}"
    cat <<LUA
local reqs = {}
-- built in init, once wrk has set the Host header
init = function(args)
  for i, e in ipairs(endpoints) do
    local headers = {}
    if e.body ~= "" then headers["Content-Type"] = "application/json" end
    if os.getenv("TECTOMELT_TOKEN") then headers["Authorization"] = "Bearer " .. os.getenv("TECTOMELT_TOKEN") end
    reqs[i] = wrk.format(e.method, e.path, headers, e.body ~= "" and e.body or nil)
  end
end
local n = 0
request = function()
  n = n + 1
  return reqs[(n % #reqs) + 1]
end
local delay_ms = ${DELAY_MS}
if delay_ms > 0 then delay = function() return delay_ms end end
done = function(summary, latency, requests)
  local secs = summary.duration / 1e6
  io.write(string.format("RESULT requests=%d rps=%.1f p50_ms=%.3f p99_ms=%.3f max_ms=%.3f status_errors=%d socket_errors=%d\n",
    summary.requests, summary.requests / secs, latency:percentile(50) / 1000, latency:percentile(99) / 1000,
    latency.max / 1000, summary.errors.status,
    summary.errors.connect + summary.errors.read + summary.errors.write + summary.errors.timeout))
end
LUA
  } > "$file"
}

# ---- server
rss_mib() { awk '/^VmRSS:/ {printf "%.0f", $2 / 1024}' "/proc/${1:-$SERVER_PID}/status"; }
# CPU time the server used (user + system, clock ticks): per request it does not depend on how
# busy the machine is, unlike requests/s
cpu_ticks() { awk '{print $14 + $15}' "/proc/${1:-$SERVER_PID}/stat"; }
CLK_TCK=$(getconf CLK_TCK)
hwm_mib() { awk '/^VmHWM:/ {printf "%.0f", $2 / 1024}' "/proc/$SERVER_PID/status"; }

# starts a jar on a free loopback port with its own (empty) run database in the scratch folder,
# not in ./data; sets STARTED_PID and STARTED_PORT ($2 names its log and database)
start_server() {
  local jar=$1 name=$2 log="$WORK/server-$2.log"
  env HOST=127.0.0.1 PORT=0 TECTOMELT_DATA_DIR="$WORK/data-$name" "${SERVER_ENV[@]}" \
    java -Xmx"$HEAP" -XX:+UseSerialGC -XX:+ExitOnOutOfMemoryError $JVM_OPTS -jar "$jar" > "$log" 2>&1 &
  STARTED_PID=$!
  STARTED_PORT=""
  for _ in $(seq 1 150); do
    STARTED_PORT=$(sed -n 's#.*listening on http://127.0.0.1:\([0-9]*\)/.*#\1#p' "$log" | sed -n 1p)
    [ -n "$STARTED_PORT" ] && return 0
    kill -0 "$STARTED_PID" 2>/dev/null || { cat "$log" >&2; exit 1; }
    sleep 0.2
  done
  echo "server $jar did not start" >&2; cat "$log" >&2; exit 1
}
start_server "$JAR" a
SERVER_PID=$STARTED_PID
BASE="http://127.0.0.1:$STARTED_PORT"
B_BASE=""
if [ -n "$COMPARE_JAR" ]; then
  [ -f "$COMPARE_JAR" ] || { echo "no $COMPARE_JAR" >&2; exit 2; }
  start_server "$COMPARE_JAR" b
  B_PID=$STARTED_PID
  B_BASE="http://127.0.0.1:$STARTED_PORT"
  both=()
  for e in "${ENDPOINTS[@]}"; do both+=("$e" "B:$e"); done
  ENDPOINTS=("${both[@]}")
fi
TRIVIAL_BASE=""
if [ "$BASELINE" = 1 ]; then
  java -Xmx"$HEAP" -XX:+UseSerialGC -XX:+ExitOnOutOfMemoryError $JVM_OPTS -cp "$JAR" .ci/load/TrivialServer.java 0 \
    > "$WORK/trivial.log" 2>&1 &
  TRIVIAL_PID=$!
  for _ in $(seq 1 150); do
    TPORT=$(sed -n 's#^trivial listening on http://127.0.0.1:\([0-9]*\)/.*#\1#p' "$WORK/trivial.log")
    [ -n "$TPORT" ] && break
    kill -0 "$TRIVIAL_PID" 2>/dev/null || { cat "$WORK/trivial.log" >&2; exit 1; }
    sleep 0.2
  done
  [ -n "$TPORT" ] || { echo "trivial server did not start" >&2; exit 1; }
  TRIVIAL_BASE="http://127.0.0.1:$TPORT"
  ENDPOINTS=("TRIVIAL:GET:/trivial" "${ENDPOINTS[@]}")
fi

echo "# machine: $(nproc) cores, $(grep -m1 'model name' /proc/cpuinfo | cut -d: -f2 | sed 's/^ *//'), load average $(cut -d' ' -f1-3 /proc/loadavg)"
echo "# server: java -Xmx$HEAP -XX:+UseSerialGC $JVM_OPTS ($(java -version 2>&1 | sed -n 1p)), ${SERVER_ENV[*]}, pid $SERVER_PID, $BASE"
[ -z "$COMPARE_JAR" ] || echo "# B: $COMPARE_JAR, pid $B_PID, $B_BASE (A: $JAR)"
echo "# wrk $(wrk -v 2>&1 | sed -n 1p | cut -d' ' -f2) -t$THREADS -c$CONNECTIONS, RSS after start: $(rss_mib) MiB"

run_wrk() {   # $1 = seconds, $2 = lua script, $3 = base URL (default the service); prints the RESULT line
  wrk -t"$THREADS" -c"$CONNECTIONS" -d"${1}s" --timeout 10s -s "$2" "${3:-$BASE}" > "$WORK/wrk.out" 2>&1 || true
  grep '^RESULT' "$WORK/wrk.out" || { cat "$WORK/wrk.out" >&2; echo "RESULT requests=0 rps=0 p50_ms=0 p99_ms=0 max_ms=0 status_errors=1 socket_errors=1"; }
}
field() { sed -n "s/.* $1=\([^ ]*\).*/\1/p" <<< " $2"; }

FAILED=0
if [ "$SOAK" -gt 0 ]; then
  make_script "$WORK/soak.lua" "${ENDPOINTS[@]}"
  [ "$DELAY_MS" -gt 0 ] || true
  echo "# soak: ${SOAK} s over ${#ENDPOINTS[@]} endpoints, -c$CONNECTIONS, delay ${DELAY_MS} ms per request and connection"
  line=$(run_wrk "$SOAK" "$WORK/soak.lua")
  rss=$(rss_mib); hwm=$(hwm_mib)
  echo "| soak s | requests | req/s | p50 ms | p99 ms | failed responses | socket errors | RSS MiB | peak RSS MiB |"
  echo "|---|---|---|---|---|---|---|---|---|"
  echo "| $SOAK | $(field requests "$line") | $(field rps "$line") | $(field p50_ms "$line") | $(field p99_ms "$line") | $(field status_errors "$line") | $(field socket_errors "$line") | $rss | $hwm |"
  if [ "$(field status_errors "$line")" != 0 ] || [ "$(field socket_errors "$line")" != 0 ]; then
    echo "soak FAILED: errors" >&2; FAILED=1
  fi
  if [ "$(field requests "$line")" = 0 ]; then echo "soak FAILED: no requests" >&2; FAILED=1; fi
  if [ "$hwm" -gt "$MAX_RSS_MIB" ]; then echo "soak FAILED: peak RSS $hwm MiB > $MAX_RSS_MIB MiB" >&2; FAILED=1; fi
  curl -fsS "$BASE/v1/health" > /dev/null || { echo "soak FAILED: server not healthy afterwards" >&2; FAILED=1; }
  exit $FAILED
fi

# an endpoint "TRIVIAL:GET:/trivial" is served by the trivial server (--baseline)
# and one "B:…" by the --compare server
target_base() { if [[ "$1" == TRIVIAL:* ]]; then echo "$TRIVIAL_BASE"; elif [[ "$1" == B:* ]]; then echo "$B_BASE"; else echo "$BASE"; fi; }
target_pid() { if [[ "$1" == TRIVIAL:* ]]; then echo "$TRIVIAL_PID"; elif [[ "$1" == B:* ]]; then echo "$B_PID"; else echo "$SERVER_PID"; fi; }
strip_target() { local s=${1#TRIVIAL:}; echo "${s#B:}"; }
mark() { if [[ "$1" == B:* ]]; then echo "B "; elif [ -n "$COMPARE_JAR" ] && [[ "$1" != TRIVIAL:* ]]; then echo "A "; fi; }
i=0
for spec in "${ENDPOINTS[@]}"; do
  i=$((i + 1)); make_script "$WORK/e$i.lua" "$(strip_target "$spec")"
  run_wrk "$WARMUP" "$WORK/e$i.lua" "$(target_base "$spec")" > /dev/null   # JIT warm-up, not reported
done
{
  echo "| run | endpoint | req/s | p50 ms | p99 ms | failed responses | socket errors | server CPU µs/request | RSS MiB after |"
  echo "|---|---|---|---|---|---|---|---|---|"
} | tee "$WORK/table.md"
for run in $(seq 1 "$RUNS"); do
  i=0
  for spec in "${ENDPOINTS[@]}"; do
    i=$((i + 1))
    pid=$(target_pid "$spec")
    before=$(cpu_ticks "$pid")
    line=$(run_wrk "$DURATION" "$WORK/e$i.lua" "$(target_base "$spec")")
    after=$(cpu_ticks "$pid")
    cpu=$(awk -v t=$((after - before)) -v n="$(field requests "$line")" -v hz="$CLK_TCK" \
      'BEGIN { if (n > 0) printf "%.0f", t / hz * 1e6 / n; else print "-" }')
    label=$(strip_target "$spec"); label="$(mark "$spec")${label%%=*}"
    echo "| $run | ${label/:/ } | $(field rps "$line") | $(field p50_ms "$line") | $(field p99_ms "$line") | $(field status_errors "$line") | $(field socket_errors "$line") | $cpu | $(rss_mib "$pid") |" | tee -a "$WORK/table.md"
    echo "$i $(field rps "$line") $(field p99_ms "$line") ${label/:/ }" >> "$WORK/runs.txt"
    [ "$(field status_errors "$line")" = 0 ] && [ "$(field socket_errors "$line")" = 0 ] || FAILED=1
  done
done
echo "# peak RSS $(hwm_mib) MiB (limit $MAX_RSS_MIB MiB)"
if [ "$BASELINE" = 1 ]; then
  # medians over the runs; endpoint 1 is the trivial route
  {
    echo
    echo "| endpoint | median req/s | median p99 ms | req/s ÷ trivial | p99 ÷ trivial |"
    echo "|---|---|---|---|---|"
    python3 - "$WORK/runs.txt" <<'PY'
import statistics, sys
runs = {}
for line in open(sys.argv[1]):
    i, rps, p99, label = line.split(maxsplit=3)
    runs.setdefault(int(i), (label.strip(), [], []))
    runs[int(i)][1].append(float(rps)); runs[int(i)][2].append(float(p99))
base_rps = statistics.median(runs[1][1]); base_p99 = statistics.median(runs[1][2])
for i in sorted(runs):
    label, rps, p99 = runs[i]
    r, p = statistics.median(rps), statistics.median(p99)
    print(f"| {label} | {r:.0f} | {p:.2f} | {r / base_rps:.0%} | {p / base_p99:.2f}× |")
PY
  } | tee -a "$WORK/table.md"
fi
[ "$(hwm_mib)" -le "$MAX_RSS_MIB" ] || { echo "peak RSS above $MAX_RSS_MIB MiB" >&2; FAILED=1; }
if [ -n "$OUT" ]; then cp "$WORK/table.md" "$OUT"; fi
exit $FAILED
