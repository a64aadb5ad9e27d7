#!/usr/bin/env bash
# Measures a sharded plan: SERIES invented long-layout monthly series
# (100,000 by default) of POINTS months (120), planned as N shards (8) run
# one after another on this machine, each on WORKERS workers (2, as a
# two-core pod), then merged. Prints, per shard, the wall time, the
# processor time (user + sys) and the peak resident memory (GNU time), the
# merge's, the cost of reading the whole file (a shard of 1/1000 of the
# series), and the projection for TARGET series (1,000,000) on PODS
# two-core pods (50): each pod reads the whole file (TARGET/SERIES times
# this one) on one core and plans TARGET/PODS series on two. Usage, from
# the repository root:
#
#   bash examples/kubernetes/bench.sh [SERIES] [N] [WORKERS] [POINTS]
#
# Needs Go and GNU time (/usr/bin/time). Everything is written into a
# temporary directory (KEEP=1 keeps it), removed at the end.
set -euo pipefail
series=${1:-100000}
n=${2:-8}
workers=${3:-2}
points=${4:-120}
target=${TARGET:-1000000}
pods=${PODS:-50}
dir=$(mktemp -d)
if [[ -z "${KEEP:-}" ]]; then trap 'rm -rf "$dir"' EXIT; else echo "keeping $dir"; fi
go build -o "$dir/forelay" ./cmd/forelay
go run ./examples/generate -kind portfolio -series "$series" -points "$points" -out "$dir/history.csv"
echo "history: $(du -h "$dir/history.csv" | cut -f1), $(wc -l < "$dir/history.csv") lines"
cat > "$dir/plan.yaml" <<'YAML'
plan: shards
history:
  file: history.csv
  key: [family, product, customer]
  levels: [family, product, customer]
  period: month
horizon: 18
baseline: {method: auto}
events:
  - id: fair
    kind: pulse
    start: 2027-08
    periods: 1
    effect: {percent: 12}
    range: {low: 6, high: 18}
    scope: [{series: "milk/*/*"}]
  - id: exit
    kind: step
    start: 2027-06
    effect: {percent: -100}
    scope: [{series: "*/*/grocer-east"}]
YAML
limit=(--limit history-bytes=8000000000)
measure() { # label, then the command
  local label=$1; shift
  /usr/bin/time -f '%e %U %S %M' -o "$dir/t.txt" "$@" >/dev/null 2>"$dir/err.txt" || { cat "$dir/err.txt" >&2; exit 1; }
  awk -v l="$label" '{ printf "%-10s wall %7.1f s  cpu %7.1f s  peak %6.0f MB\n", l, $1, $2 + $3, $4 / 1024 }' "$dir/t.txt"
  awk '{ print $1, $2 + $3, $4 }' "$dir/t.txt" >> "$dir/all.txt"
}
echo "forelay plan --shard K/$n, $series series of $points months, $workers workers, one shard after another:"
shards=()
for ((k = 0; k < n; k++)); do
  measure "shard $k" "$dir/forelay" "${limit[@]}" plan "$dir/plan.yaml" --shard "$k/$n" --out "$dir/s$k" --workers "$workers"
  shards+=("$dir/s$k")
done
measure merge "$dir/forelay" merge --out "$dir/merged" "${shards[@]}"
measure "read only" "$dir/forelay" "${limit[@]}" plan "$dir/plan.yaml" --shard 0/1000 --out "$dir/r" --workers "$workers"
awk -v n="$n" -v s="$series" -v t="$target" -v p="$pods" '
  NR <= n { w += $1; c += $2; if ($3 > m) m = $3 }
  NR == n + 1 { mw = $1; mc = $2; mm = $3 }
  NR == n + 2 { rc = $2; rm = $3 }
  END {
    plan = (c - n * rc) / s           # processor time per series, reading left out
    read = rc * t / s                 # reading the whole file of t series, one core
    pod = read + plan * t / p / 2     # then t/p series on two cores
    printf "per series: %.2f ms of processor time to plan; reading the file: %.1f s per shard; shards: %.0f s wall in all, peak %.0f MB; merge: %.1f s wall, %.1f s cpu, %.0f MB\n", 1000 * plan, rc, w, m / 1024, mw, mc, mm / 1024
    printf "projection, %d series on %d two-core pods (%d series each): %.0f s to read + %.0f s to plan = about %.0f s per pod, then the merge (%.1f s here for %d series, growing with the series)\n", t, p, t / p, read, plan * t / p / 2, pod, mw, s
  }' "$dir/all.txt"
