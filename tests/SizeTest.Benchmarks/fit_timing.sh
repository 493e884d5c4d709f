#!/usr/bin/env bash
# Whole-process timing of `sizetest fit` against the Python baseline (issue 11, performance), measured in one run with
# /usr/bin/time -v (wall, user+sys CPU, peak RSS). Usage: tests/SizeTest.Benchmarks/fit_timing.sh [WORKDIR] [--large]
#   default: 200 000 galaxies, lcdm (--free omega_m) + static-linear, sizes, --cv-folds 0, and the Python baseline;
#   --large: also 10^6 galaxies, two models, CV off and 5-fold CV.
# The catalogues are synthetic (sizetest simulate, seeds 11 and 12). Builds the CLI in Release first.
set -euo pipefail
ROOT="$(cd "$(dirname "$0")/../.." && pwd)"
WORK="${1:-/tmp/sizetest-fit-timing}"
LARGE="${2:-}"
mkdir -p "$WORK"
dotnet build "$ROOT/src/SizeTest.Cli" -c Release -v quiet -nologo >/dev/null
EXE="$ROOT/src/SizeTest.Cli/bin/Release/net10.0/sizetest"
[ -f "$WORK/g200k.csv" ] || "$EXE" simulate --n 200000 --seed 11 --out "$WORK/g200k.csv" >/dev/null
measure() { # label, command...
  local label="$1"; shift
  /usr/bin/time -v "$@" > "$WORK/last.out" 2> "$WORK/last.time" || { cat "$WORK/last.out" "$WORK/last.time"; exit 1; }
  local wall cpu_u cpu_s rss
  wall=$(grep "Elapsed (wall clock)" "$WORK/last.time" | awk '{print $NF}')
  cpu_u=$(grep "User time" "$WORK/last.time" | awk '{print $NF}')
  cpu_s=$(grep "System time" "$WORK/last.time" | awk '{print $NF}')
  rss=$(grep "Maximum resident" "$WORK/last.time" | awk '{print $NF}')
  printf '%-58s wall %8s  cpu %7.2f s  peak RSS %6d MB\n' "$label" "$wall" "$(echo "$cpu_u + $cpu_s" | bc)" $((rss / 1024))
}
echo "# $(date -u +%FT%TZ) $(nproc) cores, load average $(cut -d' ' -f1-3 /proc/loadavg)"
measure "sizetest fit 200k lcdm(omega_m)+static-linear, no CV" "$EXE" fit "$WORK/g200k.csv" --models lcdm,static-linear --free omega_m --observable size --cv-folds 0 --out "$WORK/out200k" --force
measure "python baseline 200k (astropy + scipy L-BFGS-B)" /usr/bin/python3 "$ROOT/tests/SizeTest.Benchmarks/python_baseline_fit.py" "$WORK/g200k.csv"
head -1 "$WORK/last.out"
if [ "$LARGE" = "--large" ]; then
  [ -f "$WORK/g1m.csv" ] || "$EXE" simulate --n 1000000 --seed 12 --out "$WORK/g1m.csv" >/dev/null
  measure "sizetest fit 10^6 lcdm(omega_m)+static-linear, no CV" "$EXE" fit "$WORK/g1m.csv" --models lcdm,static-linear --free omega_m --observable size --cv-folds 0 --out "$WORK/out1m" --force
  measure "sizetest fit 10^6 lcdm(omega_m)+static-linear, 5-fold CV" "$EXE" fit "$WORK/g1m.csv" --models lcdm,static-linear --free omega_m --observable size --cv-folds 5 --out "$WORK/out1m5" --force
fi
