#!/bin/sh
# Index build with and without sections, as a user runs it: `undertone index` as one process,
# wall clock, user CPU and peak RSS from /usr/bin/time -v, alternating runs, a fresh cache each
# run, the sections stage's own seconds (from --json) and the 1-minute load average at the start.
# Usage: npm run build && sh bench/sections.sh <folder> [runs] [extra index options, e.g. --k 200]
# Prints one line per run.
set -eu
folder=$1
runs=${2:-3}
shift
[ $# -gt 0 ] && shift
cli="$(dirname "$0")/../dist/cli.js"
tmp=$(mktemp -d)
for i in $(seq 1 "$runs"); do
  for mode in sections skip; do
    rm -rf "$tmp/cache"
    flag=""
    [ "$mode" = skip ] && flag="--skip-sections"
    load=$(cut -d' ' -f1 /proc/loadavg)
    /usr/bin/time -v node "$cli" index "$folder" --cache-dir "$tmp/cache" --json "$@" $flag > "$tmp/out" 2> "$tmp/time"
    wall=$(grep 'Elapsed (wall clock)' "$tmp/time" | awk '{print $NF}')
    user=$(grep 'User time' "$tmp/time" | awk '{print $NF}')
    rss=$(grep 'Maximum resident set size' "$tmp/time" | awk '{print $NF}')
    size=$(find "$tmp/cache" -name 'index.undertone' -exec stat -c %s {} \;)
    stage=$(tail -n 1 "$tmp/out" | node -e 'let s="";process.stdin.on("data",(d)=>(s+=d)).on("end",()=>{const j=JSON.parse(s);console.log(j.seconds.sections.toFixed(2))})')
    echo "run=$i mode=$mode load=$load wall=$wall userS=$user peakRssKiB=$rss indexBytes=$size sectionsStageS=$stage"
  done
done
rm -rf "$tmp"
