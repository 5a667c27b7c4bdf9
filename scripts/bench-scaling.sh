#!/usr/bin/env bash
# How the solver's cost grows with panel count: runs `sectionbench-cli
# bench` at N = 100 … 1600 panels and prints a Markdown table of the median
# stage times with the observed exponent between successive counts
# (log(t2/t1)/log(N2/N1)), to set against the expected orders: assembly
# O(N²), factorisation O(N³), a solve on the factorised system O(N²).
#
#   scripts/bench-scaling.sh [SECTION]      # default naca:2412
set -euo pipefail
cd "$(dirname "$0")/.."
export PATH="$PATH:/usr/local/go/bin" GOTOOLCHAIN=auto
section=${1:-naca:2412}
bin=$(mktemp -d)/sectionbench-cli
trap 'rm -rf "$(dirname "$bin")"' EXIT
go build -o "$bin" ./cmd/sectionbench-cli

field() { sed -n "s/.*\"$1\": \([0-9.e+-]*\).*/\1/p"; }
echo "Section $section; machine: $(nproc) cores, $(grep -m1 'model name' /proc/cpuinfo 2>/dev/null | cut -d: -f2 | sed 's/^ //'); load before: $(cut -d' ' -f1-3 /proc/loadavg 2>/dev/null)"
echo
echo "| N | assembly ms | exp. | factorisation ms | exp. | solve ms | sweep (41) ms | field 200×150 ms |"
echo "|---:|---:|---:|---:|---:|---:|---:|---:|"
prevN= prevA= prevF=
for n in 100 200 400 800 1600; do
  reps=15
  [ "$n" -ge 800 ] && reps=5
  j=$("$bin" bench --section "$section" --panels "$n" --repeats "$reps" --format json)
  a=$(echo "$j" | field assembly_ms); f=$(echo "$j" | field factorization_ms)
  s=$(echo "$j" | field solve_ms); w=$(echo "$j" | field sweep_ms); v=$(echo "$j" | field field_ms)
  ea=—; ef=—
  if [ -n "$prevN" ]; then
    ea=$(awk -v a="$a" -v b="$prevA" -v n="$n" -v m="$prevN" 'BEGIN { printf "%.2f", log(a/b)/log(n/m) }')
    ef=$(awk -v a="$f" -v b="$prevF" -v n="$n" -v m="$prevN" 'BEGIN { printf "%.2f", log(a/b)/log(n/m) }')
  fi
  echo "| $n | $a | $ea | $f | $ef | $s | $w | $v |"
  prevN=$n prevA=$a prevF=$f
done
echo
echo "Load after: $(cut -d' ' -f1-3 /proc/loadavg 2>/dev/null)"
