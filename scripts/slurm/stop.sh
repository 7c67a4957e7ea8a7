#!/usr/bin/env bash
# Stops a cluster started by scripts/slurm/start.sh DIR: cancels its jobs, then ends slurmd,
# slurmctld and munged by the pids recorded in DIR (never by name), waiting up to 10 s for each.
#
#   scripts/slurm/stop.sh DIR
set -uo pipefail
export PATH="$PATH:/usr/sbin:/sbin"
if [ $# -lt 1 ]; then echo "usage: $0 DIR" >&2; exit 2; fi
dir=$(realpath -m "$1")

if [ -f "$dir/slurm.conf" ] && [ -f "$dir/slurmctld.pid" ]; then
  SLURM_CONF="$dir/slurm.conf" scancel --user="$(id -un)" 2>/dev/null || true
  # Give running job steps a moment to end before their slurmd goes away.
  for _ in $(seq 1 20); do
    [ -z "$(SLURM_CONF="$dir/slurm.conf" squeue -h -t R,CG -o %i 2>/dev/null)" ] && break
    sleep 0.5
  done
fi

for name in slurmd slurmctld munge; do
  pidfile="$dir/$name.pid"
  [ -f "$pidfile" ] || continue
  pid=$(cat "$pidfile" 2>/dev/null || true)
  [[ "$pid" =~ ^[0-9]+$ ]] || continue
  if kill -TERM "$pid" 2>/dev/null; then
    for _ in $(seq 1 40); do kill -0 "$pid" 2>/dev/null || break; sleep 0.25; done
    kill -0 "$pid" 2>/dev/null && kill -KILL "$pid" 2>/dev/null
  fi
  rm -f "$pidfile"
  echo "stopped $name ($pid)"
done
exit 0
