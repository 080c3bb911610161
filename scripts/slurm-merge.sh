#!/bin/bash
# slurm-merge.sh LIST OUT [cw-wear option ...]
#
# The merge job of cellwear's fleet job on Slurm (README.md, "On a Slurm
# cluster"), submitted with --dependency=afterok on the job array of
# slurm-day.sh over the same LIST.  It expects exactly one state per
# line of LIST, map/NAME.state as slurm-day.sh names them, each written
# after LIST was; it checks that every one is there before anything is
# merged, and when one is missing (its task failed, was killed, or never
# ran because the array was smaller than the list) or older than LIST
# (left from an earlier run) it names each such task, input and state
# and exits 1 without writing OUT.  Otherwise it runs cw-wear --merge
# over those states, and only those, with the options given (the same
# cw-wear options as the tasks had), which writes OUT atomically: a
# damaged or cut state also fails the merge and leaves OUT as it was.
# Exit status: 0 OUT written; 1 a state missing or stale, or a data or
# I/O error; 2 a usage error.
#SBATCH --job-name=cw-merge
#SBATCH --output=logs/%x-%j.log
#SBATCH --ntasks=1
#SBATCH --cpus-per-task=1
set -u
me=slurm-merge
if [ $# -lt 2 ]; then
	echo "$me: need LIST and OUT" >&2
	echo "usage: sbatch --dependency=afterok:JOB $me.sh LIST OUT [cw-wear option ...]" >&2
	exit 2
fi
list=$1
out=$2
shift 2
[ -r "$list" ] || { echo "$me: $list: cannot read the list" >&2; exit 1; }
states=()
bad=()
k=0
declare -A seen
while IFS= read -r f || [ -n "$f" ]; do
	k=$((k + 1))
	[ -n "$f" ] || { echo "$me: $list:$k: empty line" >&2; exit 1; }
	name=${f##*/}
	name=${name%.gz}
	name=${name%.csv}
	s=map/$name.state
	if [ -n "${seen[$s]:-}" ]; then
		echo "$me: $list:$k: $f has the state of line ${seen[$s]} ($s): give the inputs distinct names" >&2
		exit 1
	fi
	seen[$s]=$k
	if [ ! -f "$s" ]; then
		bad+=("task $((k - 1)) ($f): $s missing")
	elif [ ! "$s" -nt "$list" ]; then
		bad+=("task $((k - 1)) ($f): $s older than $list, from an earlier run")
	else
		states+=("$s")
	fi
done <"$list"
[ "$k" -gt 0 ] || { echo "$me: $list: no input files listed" >&2; exit 1; }
if [ ${#bad[@]} -gt 0 ]; then
	for b in "${bad[@]}"; do
		echo "$me: $b" >&2
	done
	echo "$me: ${#bad[@]} of $k states missing or stale; nothing merged, $out not written" >&2
	exit 1
fi
cw-wear --merge "$@" -o "$out" "${states[@]}" || {
	rc=$?
	echo "$me: cw-wear --merge exited $rc; $out not written" >&2
	exit "$rc"
}
echo "$me: the $k states of $list merged into $out" >&2
