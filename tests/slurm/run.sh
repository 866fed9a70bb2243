#!/usr/bin/env bash
# Integration test (npm run test:slurm): a single-node Slurm on this machine runs examples/slurm/rank-array.sh
# as a job array of 4 tasks for the 7-cell equal-area census and for 5 distinct areas; the parts are merged
# and compared byte for byte with single runs. Needs root and apt-get (Debian's slurm-wlm and munge); where
# Slurm cannot start it says so on one line and exits 0, so `npm test` never depends on it.
set -uo pipefail
cd "$(dirname "$0")/../.."
root=$PWD
skip() { echo "test:slurm skipped: $*"; exit 0; }

[ "$(id -u)" = 0 ] || skip "not root (Slurm's daemons and munge need it)"
if ! command -v slurmctld >/dev/null || ! command -v munged >/dev/null; then
  command -v apt-get >/dev/null || skip "no slurmctld/munged and no apt-get to install them"
  DEBIAN_FRONTEND=noninteractive apt-get install -y -q slurm-wlm munge >/tmp/lather-slurm-apt.log 2>&1 \
    || skip "apt-get install slurm-wlm munge failed (see /tmp/lather-slurm-apt.log)"
fi

work=$(mktemp -d /tmp/lather-slurm.XXXXXX)
pids=()
keep=0
stop() {
  for p in "${pids[@]}"; do kill "$p" 2>/dev/null; done
  for p in "${pids[@]}"; do while kill -0 "$p" 2>/dev/null; do sleep 0.1; done; done
  if [ "$keep" = 1 ]; then echo "test:slurm: logs and parts kept in $work"; else rm -rf "$work"; fi
}
trap stop EXIT
set -e

# munge: a key of its own and a socket in the work folder
mkdir -p "$work/munge" "$work/spool" "$work/state" "$work/log"
dd if=/dev/urandom of="$work/munge/munge.key" bs=1024 count=1 status=none
chmod 700 "$work/munge"; chmod 400 "$work/munge/munge.key"
munged --force --key-file="$work/munge/munge.key" --socket="$work/munge/munge.socket" \
  --pid-file="$work/munge/munged.pid" --log-file="$work/log/munged.log" --seed-file="$work/munge/seed"
pids+=("$(cat "$work/munge/munged.pid")")

host=$(hostname -s)
cores=$(nproc)
cat >"$work/slurm.conf" <<CONF
ClusterName=lather
SlurmctldHost=$host
AuthType=auth/munge
AuthInfo=socket=$work/munge/munge.socket
CredType=cred/munge
ProctrackType=proctrack/pgid
TaskPlugin=task/none
SwitchType=switch/none
MpiDefault=none
ReturnToService=2
SlurmUser=root
SlurmdUser=root
StateSaveLocation=$work/state
SlurmdSpoolDir=$work/spool
SlurmctldPidFile=$work/slurmctld.pid
SlurmdPidFile=$work/slurmd.pid
SlurmctldLogFile=$work/log/slurmctld.log
SlurmdLogFile=$work/log/slurmd.log
SchedulerType=sched/backfill
SelectType=select/cons_tres
SelectTypeParameters=CR_Core
NodeName=$host CPUs=$cores State=UNKNOWN
PartitionName=main Nodes=$host Default=YES MaxTime=INFINITE State=UP
CONF
export SLURM_CONF=$work/slurm.conf
slurmctld -f "$SLURM_CONF"
for _ in $(seq 50); do [ -s "$work/slurmctld.pid" ] && break; sleep 0.1; done
pids+=("$(cat "$work/slurmctld.pid")")
slurmd -f "$SLURM_CONF"
for _ in $(seq 50); do [ -s "$work/slurmd.pid" ] && break; sleep 0.1; done
pids+=("$(cat "$work/slurmd.pid")")
for _ in $(seq 100); do sinfo -h -o %t 2>/dev/null | grep -qE '^(idle|mix|alloc)' && break; sleep 0.2; done
sinfo -h -o %t | grep -qE '^(idle|mix|alloc)' || { keep=1; tail -20 "$work/log/slurmctld.log" "$work/log/slurmd.log"; echo "test:slurm failed: the node did not come up"; exit 1; }

npm run -s build
export LATHER="node $root/dist/cli/lather.js"
fail=0
for query in "equal-7 1,1,1,1,1,1,1" "distinct-5 1,2,3,4,5"; do
  set -- $query
  name=$1 areas=$2
  (cd "$work" && sbatch --wait --array=1-4 --output="$work/log/%x-%A_%a.log" --export=ALL \
    "$root/examples/slurm/rank-array.sh" "$areas" "$work/parts/$name" >/dev/null)
  $LATHER merge "$work"/parts/"$name".part*.json --out "$work/$name.merged.json" >/dev/null
  $LATHER rank --areas "$areas" --out "$work/$name.single.json" >/dev/null
  if cmp -s "$work/$name.merged.json" "$work/$name.single.json"; then
    echo "test:slurm $name: 4 array tasks merged = the single run, byte for byte ($(wc -c <"$work/$name.single.json") bytes)"
  else
    echo "test:slurm $name: FAILED, the merged catalogue differs from the single run"
    fail=1 keep=1
  fi
done
exit $fail
