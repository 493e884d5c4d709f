#!/usr/bin/env python3
"""Writes docs/benchmarks.md from BenchmarkDotNet's output.

Usage (from the repository root, after a benchmark run):

    dotnet run -c Release --project tests/SizeTest.Benchmarks -- --filter '*Distance*' --job short
    python3 tests/SizeTest.Benchmarks/write-benchmarks-page.py BenchmarkDotNet.Artifacts/results

`tests/SizeTest.Benchmarks/fit_timing.sh DIR [--large]` writes its whole-process timings (wall, CPU, peak RSS and the
speed-up over the Python baseline of the same run) as `DIR/results/WholeProcessFitTiming-report-github.md` in the same
layout; pass `DIR/results` to put them on the page.

For every `*-report-github.md` in the given folder, the page gets one section per benchmark
class: the environment block BenchmarkDotNet printed (version, OS, CPU, SDK, job), the date of
the report file, the load average of the machine when this script ran, and the measured table
with each row's target from TARGETS below. Sections of classes that are not in the folder are
kept as they were, so the page accumulates runs of different classes. Only numbers that
BenchmarkDotNet wrote go into the page; nothing is typed in by hand.

Standard library only (any python3 works).
"""
from __future__ import annotations

import datetime as _dt
import os
import re
import sys
from pathlib import Path

# Targets by (class, method); "*" matches every method of the class. Text only, never figures.
TARGETS: dict[tuple[str, str], str] = {
    ("DistanceBenchmarks", "AngularDiameterMillion"): "≤ 20 ms on one core",
    ("DistanceBenchmarks", "AngularDiameterGrid256Warm"): "a few µs",
    ("DistanceBenchmarks", "CreateModelAndGrid256"): "tens of µs at most",
    ("ReaderBenchmarks", "*"): "CSV ≥ 5·10^5 rows/s, FITS ≥ 2·10^6 rows/s; ≤ 80 B per row",
    ("LikelihoodBenchmarks", "*"): "10^6 galaxies ≤ 10 ms; 2000 galaxies, Ωm free ≲ 15 µs",
    ("LikelihoodQuickTimings", "*"): "see the class doc comment",
    ("FitBenchmarks", "*"): "MLE of 4 models + 200 bootstrap resamples, 2000 galaxies ≤ 3 s",
    ("KernelBenchmarks", "*"): "10^6 galaxies ≤ 3 ms; 10^8 galaxies ≤ 0.3 s (2 threads)",
    ("SamplerBenchmarks", "*"): "MCMC 32 walkers × 3000 steps, 2000 galaxies ≤ 2 s",
    ("SimulationBenchmarks", "*"): "10^6 galaxies ≤ 1 s",
    ("SimulationPowerBenchmarks", "*"): "200 mocks × 2000 galaxies × 4 models ≤ 60 s",
    ("PhotometryBenchmarks", "*"): "—",
    # fit_timing.sh (whole process, /usr/bin/time -v); issue 11.
    ("WholeProcessFitTiming", "Fit200kNoCv"): "≥ 40× faster than the Python baseline of the same run",
    ("WholeProcessFitTiming", "PythonBaseline200k"): "the reference (astropy + scipy)",
    ("WholeProcessFitTiming", "Fit1mNoCv"): "≤ 3 s, ≤ 300 MB peak",
    ("WholeProcessFitTiming", "Fit1mCv5"): "≤ 6 s",
}

# Columns of BenchmarkDotNet's table that describe the job rather than the benchmark.
JOB_COLUMNS = {"Job", "Runtime", "Toolchain", "IterationCount", "LaunchCount", "WarmupCount",
               "InvocationCount", "UnrollFactor", "RunStrategy", "Platform", "Jit", "Server"}
STAT_COLUMNS = ["Mean", "Error", "StdDev", "Median", "Allocated"]

HEADER = """# Benchmark figures

Written by `tests/SizeTest.Benchmarks/write-benchmarks-page.py` from BenchmarkDotNet's
`*-report-github.md` files and the whole-process report of `fit_timing.sh`; do not edit by hand (DEVELOPERS.md, "Benchmarks", says how to
refresh a section). Each section is one run of one benchmark class, with the environment and
job BenchmarkDotNet recorded. The machine is shared: the load average shown is the one when the
page was written, and wall times measured under load are upper bounds. A `ShortRun` job has few
iterations, so its error columns are wide.
"""

BEGIN = "<!-- bench:{name}:begin -->"
END = "<!-- bench:{name}:end -->"


def target_for(cls: str, method: str) -> str:
    return TARGETS.get((cls, method)) or TARGETS.get((cls, "*")) or "—"


def parse_report(path: Path) -> tuple[str, list[str], list[str], list[list[str]]]:
    """Returns (class name, environment lines, table header, table rows)."""
    cls = path.name.removesuffix("-report-github.md").split(".")[-1]
    text = path.read_text(encoding="utf-8")
    env_match = re.search(r"```\s*\n(.*?)```", text, re.S)
    env = [l.rstrip() for l in env_match.group(1).strip("\n").splitlines()] if env_match else []
    lines = [l for l in text.splitlines() if l.startswith("|")]
    if len(lines) < 3:
        raise SystemExit(f"{path}: no result table")
    cells = lambda l: [c.strip().replace("**", "") for c in l.strip().strip("|").split("|")]
    header = cells(lines[0])
    rows = [cells(l) for l in lines[2:]]
    return cls, env, header, rows


def render_section(cls: str, env: list[str], header: list[str], rows: list[list[str]], report: Path) -> str:
    stamp = _dt.datetime.fromtimestamp(report.stat().st_mtime, _dt.timezone.utc).strftime("%Y-%m-%d %H:%M UTC")
    try:
        load = " / ".join(Path("/proc/loadavg").read_text().split()[:3])
    except OSError:
        load = "unknown"
    params = [h for h in header if h not in JOB_COLUMNS and h not in STAT_COLUMNS and h != "Method"
              and not h.startswith("Gen") and h not in ("Ratio", "RatioSD", "Alloc Ratio")]
    stats = [h for h in STAT_COLUMNS if h in header]
    out = [BEGIN.format(name=cls), f"## {cls}", "",
           f"Report written {stamp}; load average (1/5/15 min) when this page was written: {load}.", ""]
    if env:
        out += ["```"] + env + ["```", ""]
    out.append("| " + " | ".join(["benchmark"] + params + stats + ["target"]) + " |")
    out.append("|" + "---|" * (1 + len(params) + len(stats) + 1))
    idx = {h: i for i, h in enumerate(header)}
    for r in rows:
        get = lambda h: r[idx[h]] if idx[h] < len(r) else ""
        method = get("Method")
        out.append("| " + " | ".join([f"`{method}`"] + [get(p) for p in params] + [get(s) for s in stats]
                                     + [target_for(cls, method)]) + " |")
    out += ["", END.format(name=cls)]
    return "\n".join(out)


def main(argv: list[str]) -> int:
    if len(argv) < 2:
        print(__doc__)
        return 2
    results = Path(argv[1])
    repo = Path(__file__).resolve().parents[2]
    page = Path(argv[2]) if len(argv) > 2 else repo / "docs" / "benchmarks.md"
    reports = sorted(results.glob("*-report-github.md"))
    if not reports:
        print(f"write-benchmarks-page: no *-report-github.md in {results}", file=sys.stderr)
        return 2
    sections: dict[str, str] = {}
    if page.exists():
        old = page.read_text(encoding="utf-8")
        for m in re.finditer(r"<!-- bench:(\w+):begin -->.*?<!-- bench:\1:end -->", old, re.S):
            sections[m.group(1)] = m.group(0)
    for report in reports:
        cls, env, header, rows = parse_report(report)
        sections[cls] = render_section(cls, env, header, rows, report)
        print(f"write-benchmarks-page: {cls}: {len(rows)} rows from {report.name}")
    body = HEADER + "\n" + "\n\n".join(sections[k] for k in sorted(sections)) + "\n"
    tmp = page.with_suffix(".md.tmp")
    tmp.write_text(body, encoding="utf-8")
    os.replace(tmp, page)
    print(f"write-benchmarks-page: wrote {page}")
    return 0


if __name__ == "__main__":
    sys.exit(main(sys.argv))
