#!/usr/bin/env bash
# Pins the Dockerfile's base images by digest: each ARG *_IMAGE=name:tag[@sha256:...] is rewritten
# to name:tag@sha256:<digest of that tag now>. Needs registry access and docker (buildx) or crane.
# Run before a release and again to take base-image updates; commit the changed Dockerfile.
set -euo pipefail
cd "$(dirname "$0")/../.."
digest() {
  if command -v crane >/dev/null 2>&1; then
    crane digest "$1"
  else
    docker buildx imagetools inspect "$1" --format '{{json .Manifest}}' | sed -n 's/.*"digest":"\(sha256:[0-9a-f]*\)".*/\1/p'
  fi
}
for arg in BUILD_IMAGE RUNTIME_IMAGE; do
  ref="$(sed -n "s/^ARG ${arg}=\(.*\)$/\1/p" Dockerfile)"
  tag="${ref%@*}"
  d="$(digest "$tag")"
  [[ "$d" =~ ^sha256:[0-9a-f]{64}$ ]] || { echo "no digest for $tag" >&2; exit 1; }
  sed -i "s|^ARG ${arg}=.*$|ARG ${arg}=${tag}@${d}|" Dockerfile
  echo "$arg=$tag@$d"
done
