#!/usr/bin/env bash
# Measures forelay plan on an invented portfolio of SERIES monthly series
# (10,000 by default) of up to POINTS months (120 by default; method auto,
# 18 months, two scoped events) and prints the wall time, the processor
# time (user and system: steadier than the wall time on a shared machine)
# and the peak memory.
# Usage, from the repository root:
#
#   bash examples/portfolio/scale.sh [SERIES] [WORKERS] [POINTS]
#
# Needs Go and GNU time (/usr/bin/time). Nothing is written outside a
# temporary directory, which is removed at the end.
set -euo pipefail
series=${1:-10000}
workers=${2:-2}
points=${3:-120}
dir=$(mktemp -d)
trap 'rm -rf "$dir"' EXIT
go build -o "$dir/forelay" ./cmd/forelay
go run ./examples/generate -kind portfolio -series "$series" -points "$points" -out "$dir/history.csv"
cat > "$dir/plan.yaml" <<'YAML'
plan: scale
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
/usr/bin/time -v "$dir/forelay" plan "$dir/plan.yaml" --out "$dir/out" --workers "$workers" \
  >/dev/null 2>"$dir/time.txt" || { grep -v '^warning' "$dir/time.txt" >&2; exit 1; }
echo "forelay plan, $series series of up to $points months, $workers workers:"
grep -E 'User time|System time|Elapsed|Maximum resident' "$dir/time.txt"
