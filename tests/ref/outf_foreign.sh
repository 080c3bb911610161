#!/bin/sh
# outf in a shared folder (sticky and writable by all, as /tmp), against
# the rule the Linux kernel applies there (fs.protected_symlinks and
# fs.protected_fifos, Documentation/admin-guide/sysctl/fs.rst): a symbolic
# link or FIFO of another user is not followed or written to.  Issue 25,
# item 8: on main before the fix `-o FILE` followed a link planted by
# another user (the target overwritten) and a planted FIFO hung the run.
# Needs root (to plant files as user nobody); exits 77 otherwise.
top=$(cd "$(dirname "$0")/../.." && pwd)
PATH="$top/bin:$PATH"
if [ "$(id -u)" != 0 ] || ! id nobody >/dev/null 2>&1; then
	echo "outf_foreign: needs root and a user nobody to plant files: skipped"
	exit 77
fi
tmp=$(mktemp -d) || exit 1
trap 'rm -rf "$tmp"' EXIT
fail=0
mkdir "$tmp/shared" && chmod 1777 "$tmp/shared"
printf 'device,time,voltage_v,current_a\nEB-1,1772323200,3.8,1\n' >"$tmp/in.csv"
echo "precious" >"$tmp/victim"
ln -s "$tmp/victim" "$tmp/shared/out.csv"
chown -h nobody "$tmp/shared/out.csv"
cw-clean -o "$tmp/shared/out.csv" "$tmp/in.csv" 2>"$tmp/err"
rc=$?
if [ $rc -eq 1 ] && [ "$(cat "$tmp/victim")" = precious ] &&
    grep -q 'not followed' "$tmp/err"; then
	echo "ok   a link of nobody in a shared folder: refused, target kept"
else
	echo "FAIL a link of nobody: exit $rc, victim: $(cat "$tmp/victim")"
	fail=1
fi
mkfifo "$tmp/shared/fifo.csv"
chown nobody "$tmp/shared/fifo.csv"
timeout 20 cw-clean -o "$tmp/shared/fifo.csv" "$tmp/in.csv" 2>"$tmp/err"
rc=$?
if [ $rc -eq 1 ] && grep -q 'FIFO of another user' "$tmp/err"; then
	echo "ok   a FIFO of nobody in a shared folder: refused at once"
else
	echo "FAIL a FIFO of nobody: exit $rc ($(cat "$tmp/err"))"
	fail=1
fi
# One's own link in the same folder is followed (the kernel's rule too).
ln -s "$tmp/mine.csv" "$tmp/shared/mine.csv"
if cw-clean -o "$tmp/shared/mine.csv" "$tmp/in.csv" 2>/dev/null &&
    [ -L "$tmp/shared/mine.csv" ] && [ "$(wc -l <"$tmp/mine.csv")" -eq 2 ]; then
	echo "ok   one's own link: followed, kept a link"
else
	echo "FAIL one's own link"
	fail=1
fi
[ -z "$(ls -a "$tmp/shared" | grep tmp)" ] || { echo "FAIL temporaries left"; fail=1; }
exit $fail
