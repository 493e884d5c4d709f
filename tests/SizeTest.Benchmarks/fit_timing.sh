#!/usr/bin/env bash
# Whole-process timing of `sizetest fit` against the Python baseline (issue 11, performance), measured in one run with
# /usr/bin/time -v (wall, user+sys CPU, peak RSS = the kernel's VmHWM). Usage:
#   tests/SizeTest.Benchmarks/fit_timing.sh [WORKDIR] [--large]
#   default: 200 000 galaxies, lcdm (--free omega_m) + static-linear, sizes, --cv-folds 0, and the Python baseline;
#   --large: also 10^6 galaxies, two models, CV off and 5-fold CV.
# The catalogues are synthetic (sizetest simulate, seeds 11 and 12). Builds the CLI in Release first. Besides the lines
# printed, it writes WORKDIR/results/WholeProcessFitTiming-report-github.md, which
#   python3 tests/SizeTest.Benchmarks/write-benchmarks-page.py WORKDIR/results
# puts into docs/benchmarks.md (with the speed-up over the Python baseline of the same run).
set -euo pipefail
ROOT="$(cd "$(dirname "$0")/../.." && pwd)"
WORK="${1:-/tmp/sizetest-fit-timing}"
LARGE="${2:-}"
mkdir -p "$WORK/results"
dotnet build "$ROOT/src/SizeTest.Cli" -c Release -v quiet -nologo >/dev/null
EXE="$ROOT/src/SizeTest.Cli/bin/Release/net10.0/sizetest"
[ -f "$WORK/g200k.csv" ] || "$EXE" simulate --n 200000 --seed 11 --out "$WORK/g200k.csv" >/dev/null
ROWS="$WORK/rows.txt"
: > "$ROWS"
LOAD_BEFORE="$(cut -d' ' -f1-3 /proc/loadavg)"
measure() { # key, label, command...
  local key="$1" label="$2"; shift 2
  /usr/bin/time -v "$@" > "$WORK/last.out" 2> "$WORK/last.time" || { cat "$WORK/last.out" "$WORK/last.time"; exit 1; }
  local wall cpu_u cpu_s rss secs cpu
  wall=$(grep "Elapsed (wall clock)" "$WORK/last.time" | awk '{print $NF}')
  cpu_u=$(grep "User time" "$WORK/last.time" | awk '{print $NF}')
  cpu_s=$(grep "System time" "$WORK/last.time" | awk '{print $NF}')
  rss=$(grep "Maximum resident" "$WORK/last.time" | awk '{print $NF}')
  secs=$(echo "$wall" | awk -F: '{ s = 0; for (i = 1; i <= NF; i++) s = s * 60 + $i; printf "%.2f", s }')
  cpu=$(echo "$cpu_u + $cpu_s" | bc)
  printf '%-58s wall %8s s  cpu %7.2f s  peak RSS %6d MB\n' "$label" "$secs" "$cpu" $((rss / 1024))
  echo "$key $secs $cpu $((rss / 1024))" >> "$ROWS"
}
echo "# $(date -u +%FT%TZ) $(nproc) cores, load average $LOAD_BEFORE"
measure Fit200kNoCv "sizetest fit 200k lcdm(omega_m)+static-linear, no CV" "$EXE" fit "$WORK/g200k.csv" --models lcdm,static-linear --free omega_m --observable size --cv-folds 0 --out "$WORK/out200k" --force
measure PythonBaseline200k "python baseline 200k (astropy + scipy L-BFGS-B)" /usr/bin/python3 "$ROOT/tests/SizeTest.Benchmarks/python_baseline_fit.py" "$WORK/g200k.csv"
PYVERSIONS="$(head -1 "$WORK/last.out")"
echo "$PYVERSIONS"
if [ "$LARGE" = "--large" ]; then
  [ -f "$WORK/g1m.csv" ] || "$EXE" simulate --n 1000000 --seed 12 --out "$WORK/g1m.csv" >/dev/null
  measure Fit1mNoCv "sizetest fit 10^6 lcdm(omega_m)+static-linear, no CV" "$EXE" fit "$WORK/g1m.csv" --models lcdm,static-linear --free omega_m --observable size --cv-folds 0 --out "$WORK/out1m" --force
  measure Fit1mCv5 "sizetest fit 10^6 lcdm(omega_m)+static-linear, 5-fold CV" "$EXE" fit "$WORK/g1m.csv" --models lcdm,static-linear --free omega_m --observable size --cv-folds 5 --out "$WORK/out1m5" --force
fi
# The report: an environment block and one table row per measurement, in the layout of BenchmarkDotNet's
# *-report-github.md, so the page script renders it beside the BenchmarkDotNet classes. Speed-ups are against the
# Python baseline of this run (wall and CPU).
REPORT="$WORK/results/WholeProcessFitTiming-report-github.md"
{
  echo '```'
  echo "Whole-process timing (tests/SizeTest.Benchmarks/fit_timing.sh $LARGE), /usr/bin/time -v"
  echo "$(date -u +%FT%TZ); $(nproc) cores: $(grep -m1 'model name' /proc/cpuinfo | cut -d: -f2 | sed 's/^ //')"
  echo "load average (1/5/15 min) before the run: $LOAD_BEFORE; after: $(cut -d' ' -f1-3 /proc/loadavg)"
  echo "sizetest commit $(git -C "$ROOT" rev-parse --short HEAD)$(git -C "$ROOT" diff --quiet HEAD -- src || echo ' + uncommitted changes'); .NET SDK $(dotnet --version)"
  echo "baseline: $PYVERSIONS"
  echo '```'
  echo
  echo "| Method | Wall (s) | CPU (s) | Peak RSS (MB) | Python wall / this | Python CPU / this |"
  echo "|---|---|---|---|---|---|"
  read -r _ PYWALL PYCPU _ < <(grep '^PythonBaseline200k ' "$ROWS")
  while read -r key secs cpu rss; do
    if [ "$key" = "Fit200kNoCv" ]; then
      wr=$(echo "$PYWALL $secs" | awk '{ printf "%.1f×", $1 / $2 }'); cr=$(echo "$PYCPU $cpu" | awk '{ printf "%.1f×", $1 / $2 }')
    else wr="—"; cr="—"; fi
    echo "| $key | $secs | $cpu | $rss | $wr | $cr |"
  done < "$ROWS"
} > "$REPORT"
echo "wrote $REPORT"
