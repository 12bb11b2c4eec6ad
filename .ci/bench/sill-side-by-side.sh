#!/usr/bin/env bash
# Runs the sill model's JMH benchmark of an earlier commit and of this working tree in one go, one
# after the other, so the two are measured under the same machine load.
#   usage: .ci/bench/sill-side-by-side.sh BASE_COMMIT NEW_COMMIT [JMH_ARGS...]
#   e.g.   .ci/bench/sill-side-by-side.sh 96fa325 HEAD -f 1 -wi 2 -i 5 -r 5s
# Any other JMH benchmark class the same way, named in BENCH (default SillModelBenchmark):
#   BENCH=CompositionBenchmark .ci/bench/sill-side-by-side.sh a27847f HEAD -f 1 -wi 5 -i 5 -r 1s
# Both commits are exported to temporary directories (so edits in the worktree cannot mix in) and
# built there; each runs its own benchmark class. Output: JMH's tables, base first.
set -euo pipefail
base=${1:?base commit}
new=${2:?new commit}
shift 2
args=${*:-"-f 1 -wi 2 -i 5 -r 5s"}
bench=${BENCH:-SillModelBenchmark}
root=$(git rev-parse --show-toplevel)
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
mkdir "$tmp/base" "$tmp/new"
git -C "$root" archive "$base" | tar -x -C "$tmp/base"
git -C "$root" archive "$new" | tar -x -C "$tmp/new"
for side in base new; do
  (cd "$tmp/$side" && mvn -B -q -o -Pbench -pl service test-compile >/dev/null)
done
echo "== load before: $(cat /proc/loadavg)"
echo "== base $base ($(git -C "$root" rev-parse --short "$base")): $bench"
(cd "$tmp/base" && mvn -B -q -o -Pbench -pl service exec:exec -Djmh.args="$args $bench")
echo "== new $new ($(git -C "$root" rev-parse --short "$new")): $bench"
(cd "$tmp/new" && mvn -B -q -o -Pbench -pl service exec:exec -Djmh.args="$args $bench")
echo "== load after: $(cat /proc/loadavg)"
