#!/bin/sh
# tests/run must fail when a stage fails, whatever the stage says.  Each
# case builds a throwaway tree holding a copy of tests/run and fake
# stages, runs it and checks its exit status and last line:
#   1. tests/cli/run prints "cli: 5 passed, 0 failed" and is killed;
#   2. tests/cli/run exits 0 without a count line;
#   3. a reference check skips (exit 77): counted as a skip, and under
#      CI=true as a failure;
#   4. a saved fuzz input breaks its harness's invariant (abort);
#   5. a unit test binary that runs no test.
set -u
top=$(cd "$(dirname "$0")/../.." && pwd)
tmp=$(mktemp -d) || exit 2
trap 'rm -rf "$tmp"' EXIT
bad=0

# mk NAME: a fresh tree $tmp/NAME with tests/run and a passing CLI stage.
mk() {
	t=$tmp/$1
	mkdir -p "$t/tests/cli" "$t/tests/ref" "$t/build/tests" "$t/bin" \
	    "$t/man"
	cp "$top/tests/run" "$t/tests/run"
	printf '#!/bin/sh\necho "cli: 5 passed, 0 failed"\n' >"$t/tests/cli/run"
	chmod +x "$t/tests/cli/run"
}

# expect NAME RC LAST [ENV...]: run the tree's tests/run; its exit status
# must be RC (0 or "nonzero") and its last line LAST.
expect() {
	name=$1 want=$2 last=$3
	shift 3
	env CW_NO_VALGRIND=1 CI= "$@" sh "$tmp/$name/tests/run" \
	    >"$tmp/$name.log" 2>&1
	rc=$?
	got=$(tail -n 1 "$tmp/$name.log")
	ok=1
	if [ "$want" = 0 ]; then [ "$rc" -eq 0 ] || ok=0
	else [ "$rc" -ne 0 ] || ok=0; fi
	[ "$got" = "$last" ] || ok=0
	if [ $ok -eq 1 ]; then
		echo "ok   $name: exit $rc, \"$got\""
	else
		echo "FAIL $name: exit $rc, \"$got\" (wanted exit $want," \
		    "\"$last\")"
		sed 's/^/  /' "$tmp/$name.log"
		bad=$((bad + 1))
	fi
}

mk pass
expect pass 0 "5 passed, 0 failed, 0 skipped"

mk killed
printf '#!/bin/sh\necho "cli: 5 passed, 0 failed"\nkill -9 $$\n' \
    >"$tmp/killed/tests/cli/run"
expect killed nonzero "5 passed, 1 failed, 0 skipped"

mk silent
printf '#!/bin/sh\nexit 0\n' >"$tmp/silent/tests/cli/run"
expect silent nonzero "0 passed, 1 failed, 0 skipped"

mk skip
printf 'echo "SKIP (not checked): no daemon here"\nexit 77\n' \
    >"$tmp/skip/tests/ref/needs_daemon.sh"
expect skip 0 "5 passed, 0 failed, 1 skipped"
expect skip nonzero "5 passed, 1 failed, 1 skipped" CI=true

mk fuzz
mkdir -p "$tmp/fuzz/tests/fuzz/regress/fuzz_x"
echo input >"$tmp/fuzz/tests/fuzz/regress/fuzz_x/saved-1"
printf '#!/bin/sh\necho "invariant broken" >&2\nkill -ABRT $$\n' \
    >"$tmp/fuzz/build/tests/replay_x"
chmod +x "$tmp/fuzz/build/tests/replay_x"
expect fuzz nonzero "5 passed, 1 failed, 0 skipped"

mk empty
printf '#!/bin/sh\necho "[==========] 0 test(s) run."\n' \
    >"$tmp/empty/build/tests/test_x"
chmod +x "$tmp/empty/build/tests/test_x"
expect empty nonzero "5 passed, 1 failed, 0 skipped"

[ $bad -eq 0 ]
