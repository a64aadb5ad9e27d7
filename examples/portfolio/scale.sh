#!/usr/bin/env bash
# Measures forelay plan, then forelay stress with 1,000 paths, on an
# invented portfolio of SERIES monthly series (10,000 by default) of up to
# POINTS months (120 by default; method auto, 18 months, five scoped events,
# two shared lines) and prints for each the wall time, the processor time
# (user and system: steadier than the wall time on a shared machine) and
# the peak memory.
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
    probability: 0.6
    scope: [{series: "*/*/grocer-east"}]
  - id: schools-deal
    kind: step
    start: 2027-02
    ramp: {periods: 3, shape: linear}
    effect: {units: 40000, split: baseline}
    range: {low: 25000, high: 50000}
    probability: 0.7
    scope: [{series: "milk/*/school-*"}]
  - id: cheese-promo
    kind: pulse
    start: 2027-04
    periods: 2
    effect: {percent: 20}
    range: {low: 10, high: 30}
    scope: [{series: "cheese/*/*"}]
  - id: shutdown
    kind: pulse
    start: 2027-10
    periods: 1
    effect: {percent: -30}
    probability: 0.3
    scope: [{series: "yoghurt/**"}]
resources:
  - id: bottling
    series: "milk/**"
    per-unit: 0.0012
    units: line-hours
    capacity: {units: 600, changes: [{from: 2027-09, units: 680}]}
  - id: cups
    series: "yoghurt/**"
    per-unit: 0.002
    units: line-hours
    capacity: {units: 500}
YAML
measure() { # measure NAME ARGS...: run forelay ARGS under GNU time, print its figures
  name=$1
  shift
  /usr/bin/time -v "$dir/forelay" "$@" >/dev/null 2>"$dir/time.txt" || { grep -v '^warning' "$dir/time.txt" >&2; exit 1; }
  echo "forelay $name, $series series of up to $points months, $workers workers:"
  grep -E 'User time|System time|Elapsed|Maximum resident' "$dir/time.txt"
}
measure plan plan "$dir/plan.yaml" --out "$dir/out" --workers "$workers"
measure "stress (1,000 paths)" stress "$dir/plan.yaml" --paths 1000 --out "$dir/stress" --workers "$workers"
