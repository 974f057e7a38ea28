#!/usr/bin/env python3
# SPDX-License-Identifier: MIT
# Copyright (c) 2026 Periodic contributors
"""Whole-process timing of two commands, run alternately (A, B, A, B, ...) so that the load of a shared
machine hits both alike. Reports wall and CPU (user + sys of the child) medians and the ratios.

usage: whole-process.py RUNS 'command A' 'command B'"""
import os, resource, shlex, statistics, subprocess, sys, time

def run(command):
    before = resource.getrusage(resource.RUSAGE_CHILDREN)
    start = time.perf_counter()
    subprocess.run(shlex.split(command), check=True, stdout=subprocess.DEVNULL)
    wall = time.perf_counter() - start
    after = resource.getrusage(resource.RUSAGE_CHILDREN)
    cpu = (after.ru_utime - before.ru_utime) + (after.ru_stime - before.ru_stime)
    return wall, cpu

runs, a, b = int(sys.argv[1]), sys.argv[2], sys.argv[3]
run(a); run(b)  # warm the file cache and the JIT's disk caches once
times = {a: [], b: []}
for i in range(runs):
    for command in (a, b) if i % 2 == 0 else (b, a):
        times[command].append(run(command))
print(f"load average before/after: {os.getloadavg()}")
for label, command in (("A", a), ("B", b)):
    walls = [w for w, _ in times[command]]
    cpus = [c for _, c in times[command]]
    print(f"{label}: {command}\n   wall median {statistics.median(walls):.3f} s (min {min(walls):.3f}, max {max(walls):.3f}); "
          f"cpu median {statistics.median(cpus):.3f} s (min {min(cpus):.3f}, max {max(cpus):.3f}); {runs} runs")
wa = statistics.median(w for w, _ in times[a]); wb = statistics.median(w for w, _ in times[b])
ca = statistics.median(c for _, c in times[a]); cb = statistics.median(c for _, c in times[b])
print(f"ratio A/B: wall {wa / wb:.3f}, cpu {ca / cb:.3f}")
