#!/usr/bin/env bash
# SPDX-License-Identifier: MIT
# A Slurm job array that runs one sweep file across the cluster: task I of N computes the designs whose number
# is I modulo N. Submit from the folder that holds the sweep file, e.g. for 4 tasks:
#
#   sbatch --array=0-3 slurm-array.sh filter-widths.json results
#   # when all tasks are done:
#   periodic merge results/part-*.csv --out filter-widths.csv
#
# A task that is killed (time limit, pre-emption) resumes where it stopped when it is run again: resubmit the
# same array (or only the failed indices, e.g. --array=2). Set PERIODIC to the command that runs the tool if
# `periodic` is not on the nodes' PATH (e.g. PERIODIC="dotnet /opt/periodic/Periodic.Cli.dll").
#SBATCH --job-name=periodic-sweep
#SBATCH --ntasks=1
#SBATCH --cpus-per-task=2
#SBATCH --output=periodic-sweep-%A_%a.log
set -euo pipefail
spec="${1:?usage: sbatch --array=0-(N-1) slurm-array.sh SWEEP.json OUTPUT-FOLDER [csv|parquet]}"
out="${2:?give the folder for the parts}"
format="${3:-csv}"
mkdir -p "$out"
: "${SLURM_ARRAY_TASK_ID:?run this with sbatch --array}"
# The number of tasks: Slurm's count of the array (the array must run 0..N-1).
tasks="${SLURM_ARRAY_TASK_COUNT:?run this with sbatch --array=0-(N-1)}"
${PERIODIC:-periodic} sweep "$spec" --shard "$SLURM_ARRAY_TASK_ID/$tasks" --threads "${SLURM_CPUS_PER_TASK:-1}" \
    --out "$out/part-$SLURM_ARRAY_TASK_ID.$format"
