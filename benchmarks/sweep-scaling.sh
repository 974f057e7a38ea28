#!/usr/bin/env bash
# SPDX-License-Identifier: MIT
# Whole-process sweep scaling: 10^5 two-layer designs x 3 bands (docs/examples/sweeps/scaling-1e5.json), one thread
# against all cores, runs alternated so that load on a shared machine hits both alike; also the share of the time
# spent writing output (the journal of finished rows while running plus the final table, from the tool's --verbose
# timing line). Prints a Markdown table and the ratios; commit it under benchmarks/results/DATE/.
# Usage: benchmarks/sweep-scaling.sh [repeats] [sweep file]   (a few minutes; needs a free second core: check uptime first)
# SWEEP_TOOL=path/to/Periodic.Cli.dll measures that build instead of building this checkout (e.g. an older commit's, to
# compare side by side); SWEEP_ENV="NAME=VALUE" runs the tool with that environment variable set.
set -euo pipefail
cd "$(dirname "$0")/.."
repeats="${1:-3}"
if [ -z "${SWEEP_TOOL:-}" ]; then dotnet build src/Periodic.Cli -c Release -v:q -nologo >/dev/null; fi
tool="${SWEEP_TOOL:-src/Periodic.Cli/bin/Release/net10.0/Periodic.Cli.dll}"
spec="${2:-docs/examples/sweeps/scaling-1e5.json}"
work="$(mktemp -d)"; trap 'rm -rf "$work"' EXIT
cores="$(nproc)"
if [ "$cores" -lt 2 ]; then echo "needs at least 2 cores to compare parallel with serial; this machine has $cores" >&2; exit 1; fi
echo "tool: $tool ${SWEEP_ENV:-}"
echo "load before: $(cut -d' ' -f1-3 /proc/loadavg); CPU over 2 s: $(top -bn2 -d2 | grep '%Cpu' | tail -1)"
echo "| run | threads | wall (s) | compute (s) | journal (s) | table (s) | write share |"
echo "|---|---|---|---|---|---|---|"
declare -a serial parallel serialWall parallelWall shares
for r in $(seq "$repeats"); do
    for threads in 1 "$cores"; do
        rm -f "$work/t$threads.csv" "$work/t$threads.csv.journal"
        start=$(date +%s.%N)
        line=$(env ${SWEEP_ENV:-} dotnet "$tool" sweep "$spec" --threads "$threads" --out "$work/t$threads.csv" --verbose 2>&1 >/dev/null | grep 'designs computed')
        end=$(date +%s.%N)
        # "periodic: N designs computed in C s on T threads; journal written in J s; table written in W s"
        read -r compute journal table < <(sed -E 's/.* computed in ([0-9.]+) s on .* journal written in ([0-9.]+) s; table written in ([0-9.]+) s.*/\1 \2 \3/' <<<"$line")
        wall=$(awk -v a="$start" -v b="$end" 'BEGIN { printf "%.3f", b - a }')
        share=$(awk -v c="$compute" -v j="$journal" -v t="$table" 'BEGIN { printf "%.4f", (j + t) / (c + j + t) }')
        printf '| %d | %d | %s | %s | %s | %s | %s |\n' "$r" "$threads" "$wall" "$compute" "$journal" "$table" "$share"
        if [ "$threads" = 1 ]; then serial+=("$compute"); serialWall+=("$wall"); else parallel+=("$compute"); parallelWall+=("$wall"); shares+=("$share"); fi
    done
    cmp "$work/t1.csv" "$work/t$cores.csv" >/dev/null || { echo "tables differ between 1 and $cores threads" >&2; exit 1; }
done
echo
for r in $(seq 0 $((repeats - 1))); do
    awk -v r="$((r + 1))" -v s="${serial[$r]}" -v p="${parallel[$r]}" -v sw="${serialWall[$r]}" -v pw="${parallelWall[$r]}" -v w="${shares[$r]}" \
        'BEGIN { printf "run %d: parallel speed-up %.2f x (compute), %.2f x (whole process); write share of the parallel run %.1f %%\n", r, s / p, sw / pw, 100 * w }'
done
echo "acceptance: speed-up >= 1.8 x on 2 cores; write share <= 10 %"
echo "load after: $(cut -d' ' -f1-3 /proc/loadavg); CPU over 2 s: $(top -bn2 -d2 | grep '%Cpu' | tail -1)"
