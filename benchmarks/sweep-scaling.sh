#!/usr/bin/env bash
# SPDX-License-Identifier: MIT
# Whole-process sweep scaling: 10^5 two-layer designs x 3 bands (docs/examples/sweeps/scaling-1e5.json), one thread
# against all cores, runs alternated so that load on a shared machine hits both alike; also the share of the time
# spent on output, from the tool's --verbose timing line. Prints a Markdown table and the ratios; commit it under
# benchmarks/results/DATE/.
# Usage: benchmarks/sweep-scaling.sh [repeats] [sweep file]   (a few minutes; needs a free second core: check uptime first)
# By default it measures the tool as its package ships it: published for this platform, ReadyToRun (ahead-of-time code
# for Periodic, the tool and System.CommandLine). SWEEP_TOOL=path/to/Periodic.Cli.dll measures that build instead (e.g.
# src/Periodic.Cli/bin/Release/net10.0/Periodic.Cli.dll for plain IL compiled by the JIT, or an older commit's, to
# compare side by side); SWEEP_BASELINE=path/to/other/Periodic.Cli.dll also runs that build, alternated with the first in
# every repeat; SWEEP_ENV="NAME=VALUE" runs the tool with that environment variable set.
#
# What the columns mean. compute: the phase in which the designs are computed (the tool's "designs computed in … s").
# tail: what follows it before the output file is in place. write share: the tool's "output share" where it prints one
# (rows streamed into the output while the designs compute: the output's share of the processor time in that phase,
# applied to it, plus the tail, over the whole run); for builds that wrote the table after computing ("journal written
# in J s; table written in W s"), (J + W) / (compute + J + W). CPU: the process's user + system time (from /usr/bin/time
# when present), whose ratio between the two thread counts shows what a second thread costs in total work.
set -euo pipefail
cd "$(dirname "$0")/.."
repeats="${1:-3}"
spec="${2:-docs/examples/sweeps/scaling-1e5.json}"
work="$(mktemp -d)"; trap 'rm -rf "$work"' EXIT
if [ -z "${SWEEP_TOOL:-}" ]; then
    rid="linux-$(uname -m | sed 's/x86_64/x64/; s/aarch64/arm64/')"
    dotnet publish src/Periodic.Cli -c Release -r "$rid" --self-contained false -o "$work/tool" -v:q -nologo >/dev/null
fi
tool="${SWEEP_TOOL:-$work/tool/Periodic.Cli.dll}"
cores="$(nproc)"
if [ "$cores" -lt 2 ]; then echo "needs at least 2 cores to compare parallel with serial; this machine has $cores" >&2; exit 1; fi
builds=("$tool")
if [ -n "${SWEEP_BASELINE:-}" ]; then builds+=("$SWEEP_BASELINE"); fi
timer=""
if [ -x /usr/bin/time ]; then timer="/usr/bin/time -f cpu=%U+%S -o $work/cpu"; fi
for b in "${!builds[@]}"; do echo "build $b: ${builds[$b]} ${SWEEP_ENV:-}"; done
echo "load before: $(cut -d' ' -f1-3 /proc/loadavg); CPU over 2 s: $(top -bn2 -d2 | grep '%Cpu' | tail -1)"
echo "| build | run | threads | wall (s) | compute (s) | tail (s) | write share | CPU (s) |"
echo "|---|---|---|---|---|---|---|---|"
declare -A compute wall share cpu
for r in $(seq "$repeats"); do
    for b in "${!builds[@]}"; do
        for threads in 1 "$cores"; do
            rm -f "$work/t$threads.csv" "$work/t$threads.csv.journal" "$work/cpu"
            start=$(date +%s.%N)
            line=$(env ${SWEEP_ENV:-} $timer dotnet "${builds[$b]}" sweep "$spec" --threads "$threads" --out "$work/t$threads.csv" --verbose 2>&1 >/dev/null | grep 'designs computed')
            end=$(date +%s.%N)
            w=$(awk -v a="$start" -v b="$end" 'BEGIN { printf "%.3f", b - a }')
            c=$(sed -E 's/.* computed in ([0-9.]+) s on .*/\1/' <<<"$line")
            if [[ "$line" == *"output share"* ]]; then
                # "… computed in E s on T threads (…); then X s to finish the file; output share S %; whole run R s; …"
                t=$(sed -E 's/.*; then ([0-9.]+) s to finish.*/\1/' <<<"$line")
                s=$(sed -E 's/.*output share ([0-9.]+) %.*/\1/' <<<"$line" | awk '{ printf "%.4f", $1 / 100 }')
            else
                # "… computed in C s on T threads; journal written in J s; table written in W s; …"
                read -r j tb < <(sed -E 's/.* journal written in ([0-9.]+) s; table written in ([0-9.]+) s.*/\1 \2/' <<<"$line")
                t=$(awk -v j="$j" -v tb="$tb" 'BEGIN { printf "%.3f", j + tb }')
                s=$(awk -v c="$c" -v t="$t" 'BEGIN { printf "%.4f", t / (c + t) }')
            fi
            u="-"
            if [ -f "$work/cpu" ]; then u=$(grep -o 'cpu=.*' "$work/cpu" | sed 's/cpu=//' | awk -F+ '{ printf "%.2f", $1 + $2 }'); fi
            printf '| %d | %d | %d | %s | %s | %s | %s | %s |\n' "$b" "$r" "$threads" "$w" "$c" "$t" "$s" "$u"
            key="$b,$r,$threads"; compute[$key]=$c; wall[$key]=$w; share[$key]=$s; cpu[$key]=$u
        done
        cmp "$work/t1.csv" "$work/t$cores.csv" >/dev/null || { echo "tables differ between 1 and $cores threads (build $b)" >&2; exit 1; }
        if [ "$b" = 0 ]; then mv "$work/t1.csv" "$work/first.csv"; elif ! cmp "$work/first.csv" "$work/t1.csv" >/dev/null; then echo "build $b's table differs from build 0's" >&2; exit 1; fi
    done
done
echo
for b in "${!builds[@]}"; do
    for r in $(seq "$repeats"); do
        s1="$b,$r,1"; p="$b,$r,$cores"
        awk -v b="$b" -v r="$r" -v s="${compute[$s1]}" -v p="${compute[$p]}" -v sw="${wall[$s1]}" -v pw="${wall[$p]}" -v w="${share[$p]}" -v cs="${cpu[$s1]}" -v cp="${cpu[$p]}" \
            'BEGIN { printf "build %d run %d: parallel speed-up %.2f x (compute), %.2f x (whole process); write share of the parallel run %.1f %%", b, r, s / p, sw / pw, 100 * w;
                     if (cs != "-" && cp != "-") printf "; CPU parallel / serial %.2f", cp / cs; printf "\n" }'
    done
done
echo "acceptance: speed-up >= 1.8 x on 2 cores; write share <= 10 %"
echo "load after: $(cut -d' ' -f1-3 /proc/loadavg); CPU over 2 s: $(top -bn2 -d2 | grep '%Cpu' | tail -1)"
