#!/usr/bin/env python3
# SPDX-License-Identifier: MIT
# Copyright (c) 2026 Periodic contributors
"""Turns one BenchmarkDotNet run into benchmarks/results/<date>/: the raw GitHub-markdown reports and
SUMMARY.md, the ratio table against each target. Usage (from the repository root, after a run):
    python3 benchmarks/summarise.py [calibration-log]"""
import csv, glob, math, os, re, shutil, subprocess, sys, datetime

ART = "BenchmarkDotNet.Artifacts/results"
UNITS = {"ns": 1e-9, "us": 1e-6, "μs": 1e-6, "ms": 1e-3, "s": 1.0}

def seconds(text):
    number, unit = text.replace(",", "").split()
    return float(number) * UNITS[unit]

def kilobytes(text):
    if text in ("-", "0 B"):
        return 0.0
    number, unit = text.replace(",", "").split()
    return float(number) * {"B": 1 / 1024, "KB": 1, "MB": 1024, "GB": 1024 * 1024}[unit]

def load(name):
    rows = {}
    for path in glob.glob(f"{ART}/Periodic.Benchmarks.{name}-report.csv"):
        with open(path, newline="") as f:
            for row in csv.DictReader(f):
                key = row["Method"] + (f"[{row['Layers']}]" if row.get("Layers") else "")
                rows[key] = {"mean": seconds(row["Mean"]), "alloc": kilobytes(row["Allocated"])}
    return rows

def fit(points):
    xs = [math.log(n) for n, _ in points]
    ys = [math.log(t) for _, t in points]
    mx, my = sum(xs) / len(xs), sum(ys) / len(ys)
    return sum((x - mx) * (y - my) for x, y in zip(xs, ys)) / sum((x - mx) ** 2 for x in xs)

def main():
    today = datetime.datetime.now(datetime.timezone.utc).strftime("%Y-%m-%d")
    out = f"benchmarks/results/{today}"
    os.makedirs(out, exist_ok=True)
    for path in glob.glob(f"{ART}/*-report-github.md"):
        shutil.copy(path, out)
    cpu = subprocess.run(["lscpu"], capture_output=True, text=True).stdout
    model = re.search(r"Model name:\s*(.*)", cpu).group(1).strip()
    cores = subprocess.run(["nproc"], capture_output=True, text=True).stdout.strip()
    lines = [f"# Benchmark results {today}", "",
             f"Machine: {cores} cores (`nproc`), {model} (`lscpu`), KVM guest, shared with other builds during the run.",
             "Job: see the raw reports beside this file. Ratios are within this one run; absolute times are noisy.", "",
             "| Target | Case | Measured | Met |", "|---|---|---|---|"]
    def row(target, case, value, met):
        lines.append(f"| {target} | {case} | {value} | {'yes' if met else '**no**'} |")

    k = load("EnergyOfWavevectorBenchmarks")
    if k:
        base = k["NaiveScanAndNewton"]["mean"]
        for m in ("LibraryChebyshevPrebuilt", "LibraryChebyshevIncludingBuild", "LibraryRootSearch"):
            if m in k:
                r = k[m]["mean"] / base
                row("E(k) ≤ 0.1 × naive", f"5 bands × 10^5 k, {m}", f"{r:.3f} × ({k[m]['mean'] / 5e5 * 1e9:.0f} ns vs {base / 5e5 * 1e9:.0f} ns per point)", r <= 0.1)
        row("0 B per k-point", "LibraryChebyshevPrebuilt", f"{k['LibraryChebyshevPrebuilt']['alloc'] * 1024:.0f} B per 5×10^5 points", k["LibraryChebyshevPrebuilt"]["alloc"] == 0)
    d = load("DispersionFunctionBenchmarks")
    if d:
        base = d["HandInlinedClosedForm"]["mean"]
        labels = {"BatchTraces": "TracesVectorized (batch)", "ScalarTraceLoop": "Trace(E) per energy",
                  "BatchTracesExact": "Traces (exact batch, computes dD/dE too)", "ScalarDispersionLoop": "Dispersion(E) per energy (computes dD/dE too)"}
        for m in ("BatchTraces", "ScalarTraceLoop", "BatchTracesExact", "ScalarDispersionLoop"):
            if m not in d:
                continue
            r = d[m]["mean"] / base
            row("D(E) ≤ 1.2 × hand-inlined", f"2 layers × 10^6 E, {labels[m]}", f"{r:.2f} × ({d[m]['mean'] / 2e6 * 1e9:.1f} ns per layer per energy)", r <= 1.2)
        r = d["ScalarDispersionLoop"]["mean"] / d["BatchTraces"]["mean"]
        row("batch ≥ 2 × scalar loop", "2 layers × 10^6 E, Dispersion loop / TracesVectorized", f"{r:.2f} ×", r >= 2)
        r = d["ScalarTraceLoop"]["mean"] / d["BatchTraces"]["mean"]
        row("batch ≥ 2 × scalar loop", "2 layers × 10^6 E, Trace loop / TracesVectorized (trace-only both)", f"{r:.2f} ×", r >= 2)
        row("0 B per energy", "BatchTraces", f"{d['BatchTraces']['alloc'] * 1024:.0f} B per 10^6 energies", d["BatchTraces"]["alloc"] == 0)
    g = load("DispersionFunctionGradedBenchmarks")
    if g:
        r = g["ScalarDispersionLoop"]["mean"] / g["BatchTraces"]["mean"]
        row("batch ≥ 2 × scalar loop", "20 graded layers × 10^6 E, Dispersion loop / TracesVectorized", f"{r:.2f} ×", r >= 2)
        if "ScalarTraceLoop" in g:
            r = g["ScalarTraceLoop"]["mean"] / g["BatchTraces"]["mean"]
            row("batch ≥ 2 × scalar loop", "20 graded layers × 10^6 E, Trace loop / TracesVectorized (trace-only both)", f"{r:.2f} ×", r >= 2)
    e = load("BandEdgeBenchmarks")
    if e:
        points = sorted((int(key.split("[")[1][:-1]), v["mean"]) for key, v in e.items())
        times = ", ".join(f"{n}: {t * 1e3:.3g} ms" for n, t in points)
        row("band edges linear in layers (exponent ≤ 1.1)", f"10 bands; {times}", f"exponent {fit(points):.2f} (all sizes), {fit([p for p in points if p[0] >= 200]):.2f} (200–20000)", fit(points) <= 1.1 and fit([p for p in points if p[0] >= 200]) <= 1.1)
    f = load("FiniteDifferenceBenchmarks")
    if f:
        base = f["FiniteDifferenceBandOne"]["mean"]
        for m in ("LibraryBandOne", "LibraryFirstTenBands"):
            r = base / f[m]["mean"]
            row("≥ 1000 × faster than FD at 1 µeV", f"FD 560×560 (band 1 at 1 µeV, {base:.2f} s) vs {m}", f"{r:,.0f} ×", r >= 1000)
    a = load("FiniteDifferenceAllEdgesBenchmarks")
    if a:
        base = a["FiniteDifferenceFirstThreeBands"]["mean"]
        r = base / a["LibraryFirstThreeBands"]["mean"]
        row("≥ 1000 × faster than FD at 1 µeV", f"FD 2632×2632 (all 6 edges of bands 1–3 at 1 µeV, {base:.1f} s) vs LibraryFirstThreeBands", f"{r:,.0f} ×", r >= 1000)
    s = load("SweepBenchmarks")
    if s:
        r = s["LibrarySerial"]["mean"] / s["LibraryParallel"]["mean"]
        row("parallel sweep ≥ 1.8 × on 2 cores", "10^4 cells × 3 bands", f"{r:.2f} × (serial {s['LibrarySerial']['mean']:.3f} s, parallel {s['LibraryParallel']['mean']:.3f} s)", r >= 1.8)
        r = s["LibrarySerial"]["mean"] / s["NaiveSerial"]["mean"]
        row("(context) sweep vs naive scan", "10^4 cells × 3 bands, serial", f"{r:.2f} ×", True)
    o = load("DensityOfStatesBenchmarks")
    if o:
        r = o["LibraryDensitiesOfStates"]["mean"] / o["NaiveClosedForm"]["mean"]
        row("(context) DOS vs naive closed form", "10^6 energies", f"{r:.2f} × ({o['LibraryDensitiesOfStates']['alloc'] * 1024:.0f} B allocated)", True)
    if len(sys.argv) > 1:
        lines += ["", "## Accuracy (calibration run, `-- --calibrate`)", "", "```"] + open(sys.argv[1]).read().strip().splitlines() + ["```"]
    with open(f"{out}/SUMMARY.md", "w") as handle:
        handle.write("\n".join(lines) + "\n")
    print("\n".join(lines))

main()
