#!/usr/bin/env bash
# Monte Carlo study benchmark, both sides in one run (the machine's load is printed with them):
#  - JMH StudyBenchmark: 10,000-sample forward Monte Carlo of the mid-ocean-ridge operation and a
#    200-point posterior with 500 nuisance samples, through the operations' invocation path, on
#    THREADS threads (default 2);
#  - the same forward work in scipy (client-examples/python/ridge_column_scipy.py): COLUMNS columns
#    timed (default 300) and scaled to 10,000, since 10,000 scipy columns take minutes.
# Usage: bash .ci/bench/study-vs-scipy.sh [COLUMNS] [THREADS]
set -euo pipefail
cd "$(dirname "$0")/../.."
COLUMNS="${1:-300}"
THREADS="${2:-2}"
PY="${PYTHON:-python3}"
OUT="service/target/study-bench"
mkdir -p "$OUT"
echo "load average before: $(cut -d' ' -f1-3 /proc/loadavg), cores: $(nproc)"
mvn -B -q -Pbench -pl service test-compile exec:exec \
  -Djmh.args="-f 1 -wi 1 -i 3 -p threads=$THREADS -rf json -rff $PWD/$OUT/jmh.json StudyBenchmark" >"$OUT/jmh.log" 2>&1 \
  || { tail -40 "$OUT/jmh.log"; exit 1; }
"$PY" client-examples/python/ridge_column_scipy.py "$COLUMNS" 42 >"$OUT/scipy.json"
echo "load average after: $(cut -d' ' -f1-3 /proc/loadavg)"
"$PY" - "$OUT/jmh.json" "$OUT/scipy.json" "$THREADS" <<'PY'
import json, sys
jmh = {r["benchmark"].rsplit(".", 1)[1]: r["primaryMetric"] for r in json.load(open(sys.argv[1]))}
sp = json.load(open(sys.argv[2]))
fwd = jmh["forwardMonteCarlo10000Samples"]
post = jmh["posterior200Points500NuisanceSamples"]
scipy_10k = sp["msPerColumn"] * 10_000 / 1000
print(f"| study | tectomelt ({sys.argv[3]} threads, JMH single shot, mean of {len(fwd['rawData'][0])}) | scipy |")
print("|---|---|---|")
print(f"| 10,000-sample forward Monte Carlo, mid-ocean ridge | {fwd['score'] / 1000:.2f} s "
      f"(runs {', '.join(f'{x / 1000:.2f}' for x in fwd['rawData'][0])}) | "
      f"{scipy_10k:.1f} s ({sp['msPerColumn']:.2f} ms/column × 10,000; {sp['columns']} columns timed) |")
print(f"| 200-point posterior, 500 nuisance samples (100,000 columns) | {post['score'] / 1000:.2f} s | — |")
print(f"ratio scipy / tectomelt (forward): {scipy_10k / (fwd['score'] / 1000):.1f}×")
print(f"scipy column check: ∫F dz at 1350 °C = {sp['meltThicknessAt1350Km']:.3f} km (REFERENCES §2.5: 8.85 km); "
      f"crust mean {sp['crustMeanKm']:.2f} km, sd {sp['crustSdKm']:.2f} km over {sp['columns']} draws")
PY
