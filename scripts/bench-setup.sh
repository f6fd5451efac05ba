#!/usr/bin/env bash
# Prepares the benchmark corpora and the reference pipeline (idempotent; safe to re-run).
#  - Debian packages: python3-sklearn and python3-scipy (the reference pipeline and the exact
#    ARPACK solver used by `npm run bench:compare`), linux-source-6.1 (a large real source tree).
#  - Unpacks the kernel tarball into .cache/bench/linux-source-6.1 (ignored by git).
# Set UNDERTONE_BENCH_NO_APT=1 to skip the package step (for example without root).
set -euo pipefail
py=/usr/bin/python3  # Debian's interpreter (a python3 earlier on PATH may lack the Debian packages)
root="$(cd "$(dirname "$0")/.." && pwd)"
cache="$root/.cache/bench"
mkdir -p "$cache"

need=()
"$py" -c 'import sklearn' 2>/dev/null || need+=(python3-sklearn)
"$py" -c 'import scipy.sparse.linalg' 2>/dev/null || need+=(python3-scipy)
[ -f /usr/src/linux-source-6.1.tar.xz ] || need+=(linux-source-6.1)
if [ "${#need[@]}" -gt 0 ]; then
  if [ "${UNDERTONE_BENCH_NO_APT:-0}" = "1" ]; then
    echo "bench-setup: missing ${need[*]} (apt step skipped)" >&2
  else
    sudo_cmd=""
    [ "$(id -u)" -ne 0 ] && sudo_cmd="sudo"
    echo "bench-setup: installing ${need[*]}" >&2
    $sudo_cmd apt-get update -qq
    DEBIAN_FRONTEND=noninteractive $sudo_cmd apt-get install -y -qq "${need[@]}" >&2
  fi
fi

tree="$cache/linux-source-6.1"
if [ ! -f "$tree/.unpacked" ]; then
  if [ ! -f /usr/src/linux-source-6.1.tar.xz ]; then
    echo "bench-setup: /usr/src/linux-source-6.1.tar.xz is missing" >&2
    exit 1
  fi
  echo "bench-setup: unpacking linux-source-6.1 into $cache (takes a minute)" >&2
  rm -rf "$tree"
  tar -xJf /usr/src/linux-source-6.1.tar.xz -C "$cache"
  touch "$tree/.unpacked"
fi
echo "bench-setup: ready ($tree)" >&2
