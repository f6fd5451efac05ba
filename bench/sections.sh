#!/bin/sh
# Index build with and without sections, as a user runs it: `undertone index` as one process,
# wall clock and peak RSS from /usr/bin/time -v, alternating runs, a fresh cache each run.
# Usage: npm run build && sh bench/sections.sh <folder> [runs]   (prints one line per run)
set -eu
folder=$1
runs=${2:-3}
cli="$(dirname "$0")/../dist/cli.js"
tmp=$(mktemp -d)
for i in $(seq 1 "$runs"); do
  for mode in sections skip; do
    rm -rf "$tmp/cache"
    flag=""
    [ "$mode" = skip ] && flag="--skip-sections"
    /usr/bin/time -v node "$cli" index "$folder" --cache-dir "$tmp/cache" --quiet $flag > "$tmp/out" 2> "$tmp/time"
    wall=$(grep 'Elapsed (wall clock)' "$tmp/time" | awk '{print $NF}')
    rss=$(grep 'Maximum resident set size' "$tmp/time" | awk '{print $NF}')
    size=$(find "$tmp/cache" -name 'index.undertone' -exec stat -c %s {} \;)
    echo "run=$i mode=$mode wall=$wall peakRssKiB=$rss indexBytes=$size"
  done
done
rm -rf "$tmp"
