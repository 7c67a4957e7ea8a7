#!/usr/bin/env bash
# Starts a throwaway single-node Slurm cluster (munged + slurmctld + slurmd) whose whole state lives
# under one directory, for tests and local trials. Nothing under /etc is written; clients reach this
# cluster through SLURM_CONF=<dir>/slurm.conf.
#
#   scripts/slurm/start.sh DIR [CTLD_PORT] [SLURMD_PORT]
#
# On success prints "SLURM_CONF=<dir>/slurm.conf" on stdout and leaves the daemons' pids in
# DIR/*.pid (stop them with scripts/slurm/stop.sh DIR). Exit codes: 0 started, 3 missing binaries,
# 4 a daemon did not come up (its log is printed to stderr).
set -euo pipefail
export PATH="$PATH:/usr/sbin:/sbin"

if [ $# -lt 1 ]; then echo "usage: $0 DIR [CTLD_PORT] [SLURMD_PORT]" >&2; exit 2; fi
dir=$(realpath -m "$1")
ctld_port=${2:-6817}
slurmd_port=${3:-6818}

for bin in munged slurmctld slurmd sbatch squeue scontrol scancel sinfo; do
  command -v "$bin" >/dev/null || { echo "start.sh: $bin not found (install slurm-wlm and munge)" >&2; exit 3; }
done

mkdir -p "$dir/munge" "$dir/state" "$dir/spool"
chmod 700 "$dir" "$dir/munge"
user=$(id -un)
host=$(hostname -s)

fail() { # name logfile
  echo "start.sh: $1 did not start; last lines of $2:" >&2
  tail -n 20 "$2" >&2 2>/dev/null || true
  echo "start.sh: stop what did start with: $(dirname "$0")/stop.sh $dir" >&2
  exit 4
}

# --- munge: own key, socket, pid and log under DIR -------------------------------------------------
[ -f "$dir/munge/munge.key" ] || dd if=/dev/urandom bs=1 count=1024 of="$dir/munge/munge.key" 2>/dev/null
chmod 400 "$dir/munge/munge.key"
munged --force \
  --key-file="$dir/munge/munge.key" --socket="$dir/munge/munge.socket" \
  --pid-file="$dir/munge.pid" --log-file="$dir/munge/munged.log" --seed-file="$dir/munge/munged.seed" \
  || fail munged "$dir/munge/munged.log"

# --- slurm.conf: the real hardware line from slurmd -C, ports and paths of our own; daemons talk over
# the loopback address, so the test does not depend on the host name resolving --------------------
node_line=$(slurmd -C | head -n 1)
cat > "$dir/slurm.conf" <<CONF
ClusterName=lightfold-local
SlurmctldHost=$host(127.0.0.1)
SlurmctldPort=$ctld_port
SlurmdPort=$slurmd_port
SlurmUser=$user
SlurmdUser=$user
AuthType=auth/munge
CredType=cred/munge
AuthInfo=socket=$dir/munge/munge.socket
StateSaveLocation=$dir/state
SlurmdSpoolDir=$dir/spool
SlurmctldPidFile=$dir/slurmctld.pid
SlurmdPidFile=$dir/slurmd.pid
SlurmctldLogFile=$dir/slurmctld.log
SlurmdLogFile=$dir/slurmd.log
ProctrackType=proctrack/linuxproc
TaskPlugin=task/none
ReturnToService=2
SchedulerType=sched/backfill
SchedulerParameters=bf_interval=1,sched_min_interval=0
SelectType=select/cons_tres
SelectTypeParameters=CR_Core
MpiDefault=none
MailProg=/bin/true
JobCompType=jobcomp/filetxt
JobCompLoc=$dir/jobcomp.log
MinJobAge=600
$node_line NodeAddr=127.0.0.1 State=UNKNOWN
PartitionName=debug Nodes=ALL Default=YES MaxTime=INFINITE State=UP
CONF
export SLURM_CONF="$dir/slurm.conf"

slurmctld -c -f "$SLURM_CONF" || fail slurmctld "$dir/slurmctld.log"
slurmd -f "$SLURM_CONF" -N "$host" || fail slurmd "$dir/slurmd.log"

# --- wait until the node reports idle ---------------------------------------------------------------
for _ in $(seq 1 60); do
  state=$(sinfo -h -o %T 2>/dev/null | head -n 1 || true)
  if [ "$state" = "idle" ]; then echo "SLURM_CONF=$SLURM_CONF"; exit 0; fi
  sleep 0.5
done
echo "start.sh: node never became idle (state: ${state:-none})" >&2
tail -n 20 "$dir/slurmctld.log" "$dir/slurmd.log" >&2 || true
exit 4
