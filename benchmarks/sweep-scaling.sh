#!/usr/bin/env bash
# SPDX-License-Identifier: MIT
# Whole-process sweep scaling: 10^5 two-layer designs x 3 bands (docs/examples/sweeps/scaling-1e5.json), one thread
# against all cores, runs alternated so that load on a shared machine hits both alike; also the share of the time
# spent writing the table (from the tool's --verbose timing line). Prints a Markdown table; commit it under
# benchmarks/results/DATE/. Usage: benchmarks/sweep-scaling.sh [repeats]   (a few minutes)
set -euo pipefail
cd "$(dirname "$0")/.."
repeats="${1:-3}"
dotnet build src/Periodic.Cli -c Release -v:q -nologo >/dev/null
tool="src/Periodic.Cli/bin/Release/net10.0/Periodic.Cli.dll"
spec="docs/examples/sweeps/scaling-1e5.json"
work="$(mktemp -d)"; trap 'rm -rf "$work"' EXIT
cores="$(nproc)"
echo "| run | threads | wall (s) | compute (s) | write (s) | write share |"
echo "|---|---|---|---|---|---|"
declare -a serial parallel
for r in $(seq "$repeats"); do
    for threads in 1 "$cores"; do
        start=$(date +%s.%N)
        line=$(dotnet "$tool" sweep "$spec" --threads "$threads" --out "$work/t$threads.csv" --verbose 2>&1 >/dev/null | grep 'designs computed')
        end=$(date +%s.%N)
        compute=$(sed -E 's/.* in ([0-9.]+) s on.*/\1/' <<<"$line")
        write=$(sed -E 's/.*written in ([0-9.]+) s.*/\1/' <<<"$line")
        wall=$(echo "$end - $start" | bc -l)
        share=$(echo "$write / ($compute + $write)" | bc -l)
        printf '| %d | %d | %.2f | %.2f | %.3f | %.3f |\n' "$r" "$threads" "$wall" "$compute" "$write" "$share"
        if [ "$threads" = 1 ]; then serial+=("$compute"); else parallel+=("$compute"); fi
    done
    cmp "$work/t1.csv" "$work/t$cores.csv" >/dev/null || { echo "tables differ between 1 and $cores threads" >&2; exit 1; }
done
for r in $(seq 0 $((repeats - 1))); do
    printf 'run %d: parallel speed-up (compute) %.2f x\n' "$((r + 1))" "$(echo "${serial[$r]} / ${parallel[$r]}" | bc -l)"
done
echo "load while running: $(cut -d' ' -f1-3 /proc/loadavg)"
