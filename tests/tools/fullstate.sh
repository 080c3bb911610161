#!/bin/sh
# fullstate.sh TOOL: TOOL --state writing a state that does not fit, run
# by tests/cli/TOOL/state-full.sh from the top of the tree with TMPDIR_CASE
# set.  Twice:
#   1. under `ulimit -f` (writes past the limit fail with EFBIG; SIGXFSZ
#      is ignored here so that the write error, not the signal, is what
#      the tool meets), which works for any user;
#   2. on a full file system: a 1 MiB tmpfs mounted for the case, its
#      space taken by a filler file, when the user may mount (root, as
#      here and in CI's container); otherwise `ulimit -f` again, so that
#      the case prints the same lines and never skips.
# Each time: exit 1, a message naming the state and the write error
# (ENOSPC or EFBIG, shown as ERRNO), the old state byte for byte, no
# temporary left beside it.
tool=$1 n=50
top=$(pwd)
d=$TMPDIR_CASE
. "$top/tests/tools/nights.sh"
gen 2 24 >"$d/night1.csv"
gen 3 3 >"$d/night2.csv"
"$tool" --state "$d/s.state" "$d/night1.csv" >/dev/null 2>&1 || echo "night 1"
cp "$d/s.state" "$d/old.state"

# Run night 2 onto the state in folder $1; the old state is there.
night2() {
	"$tool" --state "$1/s.state" "$d/night2.csv" >/dev/null 2>"$d/err"
	echo "rc $?"
	sed -e "s|$1/||g" -e 's/: No space left on device$/: ERRNO/' \
	    -e 's/: File too large$/: ERRNO/' "$d/err"
	cmp -s "$1/s.state" "$d/old.state" && echo "state left as it was"
	ls -A "$1" | grep '^\.s\.state\.tmp' || echo "no temporary left"
}
# The same under a file size limit far below the new state's size.
limited() {
	( trap '' XFSZ; ulimit -f 16; night2 "$d" )
}

echo "file size limit:"
limited
echo "full file system:"
m=$d/mnt
mkdir "$m"
if mount -t tmpfs -o size=1m tmpfs "$m" 2>/dev/null; then
	trap 'umount "$m"' EXIT
	cp "$d/old.state" "$m/s.state"
	dd if=/dev/zero of="$m/fill" bs=4096 2>/dev/null
	[ "$(df -k "$m" | awk 'NR == 2 { print $4 }')" -eq 0 ] ||
	    echo "the tmpfs is not full"
	night2 "$m"
	cmp -s "$m/s.state" "$d/old.state" || echo "state on the tmpfs changed"
else
	cp "$d/old.state" "$d/s.state"
	limited
fi
