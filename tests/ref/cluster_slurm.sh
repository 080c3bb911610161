#!/bin/bash
# The fleet job on a real one-node Slurm cluster (Debian's slurm-wlm and
# munge, in scripts/deps): munged with a throwaway key, slurmctld and
# slurmd on 127.0.0.1 with their own slurm.conf, spool, state and logs in
# a temporary folder.  Case 1: the job array of scripts/slurm-day.sh over
# three days of a cw-synth fleet and scripts/slurm-merge.sh after it
# (--dependency=afterok); the reference is the definition of cw-wear(1)
# --merge, one pass cw-clean day1 day2 day3 | cw-wear, which the merged
# summary must equal byte for byte.  Case 2: one task fails (a cut gzip)
# and one is killed (scancel while it waits on a FIFO); the afterok merge
# must never run, and the merge run anyway must exit 1 naming both
# tasks, with no summary written.  Skips (exit 77) when not root or the
# binaries are missing.  Daemons are stopped by their pids on any exit.
set -u
top=$(cd "$(dirname "$0")/../.." && pwd)
PATH="$top/bin:$PATH"
export PATH
skip() { echo "SKIP: $*"; exit 77; }
[ "$(id -u)" -eq 0 ] || skip "needs root to run slurmd and munged"
for p in /usr/sbin/munged /usr/sbin/slurmctld /usr/sbin/slurmd sbatch squeue scancel scontrol; do
	command -v "$p" >/dev/null 2>&1 || skip "$p missing (slurm-wlm, munge; see scripts/deps)"
done
tmp=$(mktemp -d)
stop() {
	for f in "$tmp"/slurmd.pid "$tmp"/slurmctld.pid "$tmp"/munge/pid; do
		[ -s "$f" ] || continue
		p=$(cat "$f")
		kill "$p" 2>/dev/null
		for _ in $(seq 50); do kill -0 "$p" 2>/dev/null || break; sleep 0.1; done
	done
	rm -rf "$tmp"
}
trap stop EXIT
mkdir -m 700 "$tmp/munge" && mkdir "$tmp/spool" "$tmp/state" "$tmp/log"
head -c 1024 /dev/urandom >"$tmp/munge/key" && chmod 400 "$tmp/munge/key"
port=$((20000 + ($$ * 7) % 30000))
h=$(hostname)
cat >"$tmp/slurm.conf" <<CONF
ClusterName=cwtest
SlurmctldHost=$h(127.0.0.1)
SlurmctldPort=$port
SlurmdPort=$((port + 1))
AuthType=auth/munge
AuthInfo=socket=$tmp/munge/sock
CredType=cred/munge
SlurmUser=root
SlurmdUser=root
ProctrackType=proctrack/linuxproc
TaskPlugin=task/none
SelectType=select/cons_tres
SelectTypeParameters=CR_Core
AccountingStorageType=accounting_storage/none
JobCompType=jobcomp/none
JobAcctGatherType=jobacct_gather/none
SlurmctldPidFile=$tmp/slurmctld.pid
SlurmdPidFile=$tmp/slurmd.pid
SlurmdSpoolDir=$tmp/spool
StateSaveLocation=$tmp/state
SlurmctldLogFile=$tmp/log/slurmctld.log
SlurmdLogFile=$tmp/log/slurmd.log
ReturnToService=2
SchedulerParameters=sched_interval=2
KillWait=2
MpiDefault=none
NodeName=$h NodeAddr=127.0.0.1 CPUs=2 RealMemory=2000 State=UNKNOWN
PartitionName=cw Nodes=$h Default=YES MaxTime=INFINITE State=UP
CONF
export SLURM_CONF=$tmp/slurm.conf
/usr/sbin/munged -f --key-file="$tmp/munge/key" --socket="$tmp/munge/sock" \
    --pid-file="$tmp/munge/pid" --log-file="$tmp/munge/log" \
    --seed-file="$tmp/munge/seed" || skip "munged did not start"
/usr/sbin/slurmctld -f "$SLURM_CONF" || skip "slurmctld did not start"
/usr/sbin/slurmd -f "$SLURM_CONF" || skip "slurmd did not start"
for _ in $(seq 100); do
	sinfo -h -o %T 2>/dev/null | grep -qx idle && break
	sleep 0.2
done
sinfo -h -o %T | grep -qx idle || { echo "FAIL: node not idle"; tail "$tmp"/log/*; exit 1; }
echo "one-node cluster up on 127.0.0.1:$port"

wait_jobs() {	# wait_jobs IDS: until squeue lists none of them (120 s at most)
	for _ in $(seq 480); do
		[ -z "$(squeue -h -t PD,R,CG -j "$1" -o %i 2>/dev/null | grep -v DependencyNever)" ] && return 0
		[ -n "${2:-}" ] && squeue -h -j "$2" -o %r | grep -q DependencyNeverSatisfied && return 0
		sleep 0.25
	done
	echo "FAIL: jobs $1 still queued after 120 s"; squeue; exit 1
}
set -e
S=$top/scripts
C='-c time=ts_ms:ms,device=dev_id,voltage=pack_mv:mV,current=pack_ma:mA,temp=temp_dk:dK --charge-negative --cells 10'
home=$tmp/srv
mkdir -p "$home" && cd "$home"
cw-synth -n 4 -d 3 -p 60 -s 3 -o inbox
cw-clean $C --rejects /dev/null inbox/*.csv.gz | cw-wear >one.csv

# Case 1: the recipe of README.md, "On a Slurm cluster".
mkdir -p logs map
ls inbox/*.csv.gz >days.txt
jid=$(sbatch --parsable --array=0-$(($(wc -l <days.txt) - 1)) $S/slurm-day.sh days.txt $C)
mid=$(sbatch --parsable --dependency=afterok:$jid $S/slurm-merge.sh days.txt fleet.csv)
wait_jobs "$jid,$mid"
scontrol show job "$mid" | grep -q 'JobState=COMPLETED' || { cat logs/*; exit 1; }
cmp one.csv fleet.csv
echo "case 1: merged summary of the array equals one pass, byte for byte ($(($(wc -l <fleet.csv) - 1)) devices)"

# Case 2: task 1 fails (a cut gzip), task 2 is killed.
rm -rf map logs fleet.csv && mkdir -p logs map bad
cp inbox/2026-01-12.a.csv.gz bad/
head -c 30000 inbox/2026-01-13.a.csv.gz >bad/2026-01-13.a.csv.gz
mkfifo bad/2026-01-14.a.csv.gz
ls bad/*.csv.gz >days.txt
jid=$(sbatch --parsable --array=0-2 $S/slurm-day.sh days.txt $C)
mid=$(sbatch --parsable --dependency=afterok:$jid $S/slurm-merge.sh days.txt fleet.csv)
for _ in $(seq 240); do
	[ "$(squeue -h -j "${jid}_2" -o %T 2>/dev/null)" = RUNNING ] && break
	sleep 0.25
done
sleep 1
scancel "${jid}_2"
wait_jobs "$jid" "$mid"
squeue -h -j "$mid" -o %r | grep -q DependencyNeverSatisfied
echo "case 2: the afterok merge is held: $(squeue -h -j "$mid" -o %r)"
scancel "$mid"
set +e
bash $S/slurm-merge.sh days.txt fleet.csv 2>merge.err
rc=$?
set -e
cat merge.err
[ "$rc" -eq 1 ]
grep -q 'task 1 (bad/2026-01-13.a.csv.gz): map/2026-01-13.a.state missing' merge.err
grep -q 'task 2 (bad/2026-01-14.a.csv.gz): map/2026-01-14.a.state missing' merge.err
[ ! -e fleet.csv ]
echo "case 2: merge refused the partial set (exit $rc), no summary written"
