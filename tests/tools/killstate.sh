#!/bin/sh
# killstate.sh TOOL DEVICES KILLS: the kill test of TOOL --state (cw-wear,
# cw-dcir), run by tests/cli/TOOL/state-kill.sh from the top of the tree.
#
# A state of DEVICES devices (night 1, generated here) is continued with
# night 2, KILLS times, each run killed with SIGKILL (tests/tools/killat.c)
# a random time after its temporary .s.state.tmpXXXXXX shows, uniform over
# 0 to 1.1 times the time an unkilled run takes from there to its end, so
# that the kills fall all over the state's write, the fsync and the rename,
# and a few after the end.  After each: the state must be byte for byte
# night 1's or night 2's and read back whole by TOOL --merge; beside it
# there may be at most the one temporary of the run killed, never one of
# an ended run.  Last, a run killed at once leaves its temporary, and the
# next run removes it (and says so) and ends with night 2's state.
#
# The files live in /dev/shm when it can be written to (a tmpfs: fsync
# costs nothing there, which keeps the 2 x 50 runs to seconds; a SIGKILL
# tests the rename, not the disk), else in TMPDIR_CASE.  Prints fixed
# lines; the details of a failure go to stdout too.
tool=$1 n=$2 kills=$3
top=$(pwd)
killat=$top/build/tests/killat
[ -x "$killat" ] || { echo "no $killat (make tests)"; exit 1; }
if [ -d /dev/shm ] && [ -w /dev/shm ]; then
	d=$(mktemp -d /dev/shm/cw-kill.XXXXXX) || exit 1
else
	d=$(mktemp -d "${TMPDIR_CASE:-/tmp}/cw-kill.XXXXXX") || exit 1
fi
trap 'rm -rf "$d"' EXIT
cd "$d" || exit 1

. "$top/tests/tools/nights.sh"
gen 2 24 >night1.csv
gen 3 3 >night2.csv
"$tool" --state s.state night1.csv >/dev/null || echo "night 1 failed"
cp s.state old.state
# An unkilled run, timed from its temporary to its end.
w=$("$killat" . .s.state.tmp -1 "$tool" --state s.state night2.csv)
case $w in
"exited 0 seen "*) w=${w##* } ;;
*) echo "the unkilled run: $w"; exit 1 ;;
esac
cp s.state new.state
cmp -s old.state new.state && echo "night 2 changed nothing"
for f in old new; do
	"$tool" --merge $f.state >/dev/null 2>&1 || echo "$f.state unread"
done
seed=$$
bad=0 killed=0 strays=0
awk -v s="$seed" -v k="$kills" -v w="$w" 'BEGIN { srand(s)
	for (i = 0; i < k; i++) printf "%d\n", rand() * w * 1.1 }' >delays
while read -r delay; do
	cp old.state s.state
	r=$("$killat" . .s.state.tmp "$delay" "$tool" --state s.state \
	    night2.csv)
	if cmp -s s.state old.state; then v=old
	elif cmp -s s.state new.state; then v=new
	else v=mixed; fi
	"$tool" --merge s.state >/dev/null 2>&1 || v="$v, unread"
	left=$(ls -A | grep -c '^\.s\.state\.tmp')
	case $r in
	killed*) killed=$((killed + 1)); max=1 ;;
	"exited 0"*) max=0 ;;
	*) echo "delay $delay: $r"; bad=$((bad + 1)); max=0 ;;
	esac
	case $v in
	old|new) ;;
	*) echo "delay $delay ($r): the state is $v"; bad=$((bad + 1)) ;;
	esac
	if [ "$left" -gt "$max" ]; then
		echo "delay $delay ($r): $left temporaries left"
		strays=$((strays + 1))
	fi
	rm -f .s.state.tmp*
done <delays
echo "$kills runs, killed at random points of the write: every state" \
    "night 1's or night 2's, whole: $([ $bad -eq 0 ] && echo yes ||
    echo "no ($bad, seed $seed)")"
echo "no temporary beyond the killed run's: $([ $strays -eq 0 ] &&
    echo yes || echo "no ($strays)")"
echo "most runs killed before their end:" \
    "$([ $killed -ge $((kills / 4)) ] && echo yes ||
    echo "no ($killed of $kills, seed $seed)")"
# A run killed as soon as its temporary shows leaves it; the next one
# removes it and writes night 2.
cp old.state s.state
"$killat" . .s.state.tmp 0 "$tool" --state s.state night2.csv
ls -A | grep -c '^\.s\.state\.tmp'
"$tool" --state s.state night2.csv >/dev/null 2>err
echo "rc $?"
sed -e "s|$d/||g" -e 's/tmp[A-Za-z0-9]*/tmpXXXXXX/' err
ls -A | grep '^\.s\.state\.tmp' || echo "no temporary left"
cmp -s s.state new.state && echo "the state is night 2's"
