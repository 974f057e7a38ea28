#!/usr/bin/env bash
# SPDX-License-Identifier: MIT
# Scale-out check: starts a single-node Slurm cluster on this machine (Debian's slurm-wlm and munge), runs the
# documented job-array script (docs/examples/sweeps/slurm-array.sh) as a 4-task array over an example sweep, merges
# the parts and requires the result to equal a local run of the same sweep byte for byte (CSV and Parquet).
# Needs root (it installs packages and starts daemons). Usage: .ci/slurm-check.sh  (about 2 minutes)
set -euo pipefail
cd "$(dirname "$0")/.."
ROOT="$PWD"
fail() { echo "slurm-check: FAILED: $*" >&2; exit 1; }
if ! command -v slurmctld >/dev/null || ! command -v munged >/dev/null; then
    export DEBIAN_FRONTEND=noninteractive
    apt-get update -qq
    apt-get install -y -qq slurm-wlm munge >/dev/null
fi
WORK="$(mktemp -d "${TMPDIR:-/tmp}/periodic-slurm.XXXXXX")"
chmod 755 "$WORK"
# Stops the daemon whose pid file is $1 and waits (up to 10 s) until it has exited: slurmctld writes its state into
# $WORK/state while it shuts down, so removing $WORK before it is gone can fail on a directory that is filling up.
stop_daemon() {
    [ -f "$1" ] || return 0
    local pid
    pid="$(cat "$1")"
    kill "$pid" 2>/dev/null || return 0
    for _ in $(seq 100); do kill -0 "$pid" 2>/dev/null || return 0; sleep 0.1; done
    kill -9 "$pid" 2>/dev/null || true
}
cleanup() {
    local status=$?
    scancel --user=root >/dev/null 2>&1 || true
    stop_daemon "$WORK/slurmd.pid"
    stop_daemon "$WORK/slurmctld.pid"
    stop_daemon /run/munge/periodic-ci.pid
    rm -rf "$WORK" || { sleep 1; rm -rf "$WORK"; } || echo "slurm-check: could not remove $WORK (left behind)" >&2
    exit "$status"
}
trap cleanup EXIT

# munge: the key the package made, or a new one; the daemon as the munge user with its files in $WORK.
if [ ! -s /etc/munge/munge.key ]; then
    mungekey --create --keyfile=/etc/munge/munge.key 2>/dev/null || dd if=/dev/urandom of=/etc/munge/munge.key bs=128 count=1 status=none
    chown munge:munge /etc/munge/munge.key; chmod 400 /etc/munge/munge.key
fi
mkdir -p /run/munge /var/log/munge /var/lib/munge && chown munge:munge /run/munge /var/log/munge /var/lib/munge
runuser -u munge -- /usr/sbin/munged --pid-file=/run/munge/periodic-ci.pid 2>/dev/null || /usr/sbin/munged --force --pid-file=/run/munge/periodic-ci.pid
for _ in $(seq 50); do munge -n >/dev/null 2>&1 && break; sleep 0.1; done
munge -n | unmunge >/dev/null || fail "munge does not run"

# One node, this machine, with the CPUs and memory it has; no cgroups, no accounting.
NODE="$(hostname -s)"
CPUS="$(nproc)"
MEMORY=$(( $(awk '/MemTotal/ {print $2}' /proc/meminfo) / 1024 - 1024 ))
mkdir -p "$WORK/state" "$WORK/spool" /etc/slurm
cat > "$WORK/slurm.conf" <<CONF
ClusterName=periodic-ci
SlurmctldHost=$NODE
SlurmUser=root
SlurmdUser=root
AuthType=auth/munge
StateSaveLocation=$WORK/state
SlurmdSpoolDir=$WORK/spool
SlurmctldPidFile=$WORK/slurmctld.pid
SlurmdPidFile=$WORK/slurmd.pid
SlurmctldLogFile=$WORK/slurmctld.log
SlurmdLogFile=$WORK/slurmd.log
ProctrackType=proctrack/linuxproc
TaskPlugin=task/none
JobAcctGatherType=jobacct_gather/none
AccountingStorageType=accounting_storage/none
SchedulerType=sched/backfill
SelectType=select/cons_tres
SelectTypeParameters=CR_CPU
ReturnToService=2
MpiDefault=none
NodeName=$NODE CPUs=$CPUS RealMemory=$MEMORY State=UNKNOWN
PartitionName=ci Nodes=$NODE Default=YES MaxTime=INFINITE State=UP
CONF
export SLURM_CONF="$WORK/slurm.conf"
/usr/sbin/slurmctld -f "$SLURM_CONF"
/usr/sbin/slurmd -f "$SLURM_CONF"
for _ in $(seq 100); do sinfo -h -o '%T' 2>/dev/null | grep -qE '^(idle|mixed|allocated)' && break; sleep 0.2; done
sinfo -h -o '%T' | grep -qE '^(idle|mixed|allocated)' || { cat "$WORK/slurmctld.log" "$WORK/slurmd.log" >&2 || true; fail "the Slurm node did not come up"; }
echo "slurm: node $NODE up ($CPUS CPUs)"

# The tool as the nodes run it, and the sweep.
dotnet build src/Periodic.Cli -c Release -v:q -nologo >/dev/null
export PERIODIC="dotnet $ROOT/src/Periodic.Cli/bin/Release/net10.0/Periodic.Cli.dll"
SPEC="$ROOT/docs/examples/sweeps/filter-widths.json"
for format in csv parquet; do
    $PERIODIC sweep "$SPEC" --out "$WORK/local.$format" >/dev/null
    (cd "$WORK" && sbatch --wait --array=0-3 --chdir="$WORK" "$ROOT/docs/examples/sweeps/slurm-array.sh" "$SPEC" "$WORK/parts-$format" "$format") \
        || { cat "$WORK"/periodic-sweep-*.log >&2 || true; fail "the array job failed ($format)"; }
    ls "$WORK/parts-$format"
    $PERIODIC merge "$WORK/parts-$format"/part-*."$format" --out "$WORK/merged.$format"
    cmp "$WORK/local.$format" "$WORK/merged.$format" || fail "merged Slurm parts differ from the local run ($format)"
    echo "slurm: 4-task array, merged $format equals the local run byte for byte ($(stat -c %s "$WORK/merged.$format") bytes)"
done
