#!/usr/bin/env bash
# Runs the sill model's JMH benchmark of an earlier commit and of this working tree in one go, one
# after the other, so the two are measured under the same machine load.
#   usage: .ci/bench/sill-side-by-side.sh BASE_COMMIT [JMH_ARGS...]
#   e.g.   .ci/bench/sill-side-by-side.sh 96fa325 -f 1 -wi 2 -i 5 -r 5s
# The base's benchmark class is run as it was at BASE_COMMIT (its own methods); this tree's with all
# of its methods. Output: JMH's tables for each side, base first.
set -euo pipefail
base=${1:?base commit}
shift
args=${*:-"-f 1 -wi 2 -i 5 -r 5s"}
root=$(git rev-parse --show-toplevel)
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
git -C "$root" archive "$base" | tar -x -C "$tmp"
echo "== base $base: SillModelBenchmark"
(cd "$tmp" && mvn -B -q -o -Pbench -pl service test-compile exec:exec -Djmh.args="$args SillModelBenchmark")
echo "== this tree ($(git -C "$root" rev-parse --short HEAD), with uncommitted changes if any): SillModelBenchmark"
(cd "$root" && mvn -B -q -o -Pbench -pl service test-compile exec:exec -Djmh.args="$args SillModelBenchmark")
