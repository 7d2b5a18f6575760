#!/usr/bin/env bash
# Whole process against whole process on NAFEMS T3 at 10^5 points (1000 nodes x 100 times):
# `eigencheck eval` to tolerance 1e-10 (of the scale 100 degC, so 1e-8 degC) against the plain
# series with the fewest modes that reach the same accuracy over all points.
# usage: bash oracle/src/bench/plain-series/compare.sh   (from the project root; needs python3 with numpy)
set -euo pipefail
cd "$(dirname "$0")/../../../.."
work="$(mktemp -d)"
python3 - "$work/points.csv" <<'PY'
import sys
with open(sys.argv[1], "w") as f:
    f.write("x,t\n")
    for j in range(1, 101):
        for i in range(1000):
            f.write(f"{0.1 * i / 999!r},{0.32 * j!r}\n")
PY
./eigencheck --version >/dev/null   # build outside the timing
start=$(date +%s.%N)
./eigencheck eval reference-data/problems/nafems-t3.yaml --points "$work/points.csv" --out "$work/ref.csv" 2>/dev/null
end=$(date +%s.%N)
ours=$(echo "$end - $start" | bc -l)
echo "eigencheck eval, 1e5 points: ${ours} s"
for modes in 1000 4000 16000 64000; do
  start=$(date +%s.%N)
  python3 oracle/src/bench/plain-series/t3_plain_series.py "$modes" "$work/points.csv" "$work/plain.csv"
  end=$(date +%s.%N)
  theirs=$(echo "$end - $start" | bc -l)
  err=$(python3 - "$work/ref.csv" "$work/plain.csv" <<'PY'
import sys, numpy as np
a = np.loadtxt(sys.argv[1], delimiter=",", skiprows=1)
b = np.loadtxt(sys.argv[2], delimiter=",", skiprows=1)
print(f"{np.max(np.abs(a[:, 2] - b[:, 2])):.3e}")
PY
)
  echo "plain series, $modes modes: ${theirs} s, max error ${err} degC (target 1e-8), ratio $(echo "$theirs / $ours" | bc -l | cut -c1-6)"
done
rm -rf "$work"
