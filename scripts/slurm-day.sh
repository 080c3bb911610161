#!/bin/bash
# slurm-day.sh LIST [cw-clean option ...] [-- cw-wear option ...]
#
# One task of cellwear's fleet job as a Slurm job array (README.md, "On a
# Slurm cluster").  Task I (SLURM_ARRAY_TASK_ID, counted from 0) takes
# line I + 1 of LIST, the name of one raw log file (a day, or a day of
# some of the devices), cleans it with cw-clean and the options given,
# and writes the states of its devices with cw-wear --state-out (and the
# cw-wear options after --) to map/NAME.state, NAME being the file's base
# name without .gz and .csv; cw-clean's rejected lines go to
# map/NAME.rejects.  Relative names are from the job's working directory
# (where sbatch was run, or its --chdir).
#
# The state is put in place only when both tools succeeded: it is
# written beside as map/NAME.state.part and renamed at the end, and a
# state from an earlier run of the task is removed first, so a task that
# fails or is killed leaves no state, and slurm-merge.sh refuses to merge
# without it.  Exit status: 0 done; 1 a data or I/O error (the log says
# which tool); 2 a usage error (no LIST, no task index, an index past
# the end of LIST).
#SBATCH --job-name=cw-day
#SBATCH --output=logs/%x-%A_%a.log
#SBATCH --ntasks=1
#SBATCH --cpus-per-task=1
set -u -o pipefail
me=slurm-day
usage() {
	echo "$me: $*" >&2
	echo "usage: sbatch --array=0-N $me.sh LIST [cw-clean option ...] [-- cw-wear option ...]" >&2
	exit 2
}
[ $# -ge 1 ] || usage "no LIST of input files"
list=$1
shift
clean=()
wear=()
while [ $# -gt 0 ]; do
	if [ "$1" = -- ]; then
		shift
		wear=("$@")
		break
	fi
	clean+=("$1")
	shift
done
i=${SLURM_ARRAY_TASK_ID:-}
case $i in
''|*[!0-9]*)
	usage "SLURM_ARRAY_TASK_ID is '${i}', not a task index (submit with sbatch --array)" ;;
esac
[ -r "$list" ] || { echo "$me: $list: cannot read the list" >&2; exit 1; }
n=$(wc -l <"$list")
[ "$i" -lt "$n" ] ||
    usage "task $i: $list has $n lines (tasks 0 to $((n - 1))); the array is larger than the list"
f=$(sed -n "$((i + 1))p" "$list")
[ -n "$f" ] || { echo "$me: $list:$((i + 1)): empty line" >&2; exit 1; }
name=${f##*/}
name=${name%.gz}
name=${name%.csv}
state=map/$name.state
mkdir -p map || exit 1
rm -f "$state" "$state.part" || exit 1
echo "$me: task $i of job ${SLURM_ARRAY_JOB_ID:-?} on $(hostname): $f -> $state" >&2
cw-clean "${clean[@]}" --rejects "map/$name.rejects" "$f" |
    cw-wear --state-out "${wear[@]}" -o "$state.part"
rc=("${PIPESTATUS[@]}")
if [ "${rc[0]}" -ne 0 ] || [ "${rc[1]}" -ne 0 ]; then
	rm -f "$state.part"
	echo "$me: task $i: $f: cw-clean exited ${rc[0]}, cw-wear ${rc[1]}; no state written" >&2
	[ "${rc[0]}" -ne 0 ] && exit "${rc[0]}"
	exit "${rc[1]}"
fi
mv -f "$state.part" "$state" || exit 1
echo "$me: task $i: $state written" >&2
