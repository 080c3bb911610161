# cw-synth reads no logs; its hostile input is its options and its output
# folder.  Bad values are usage errors (exit 2) that say what is wrong,
# never a silent default; an output path that is a file is an error
# (exit 1).  Then SIGTERM in the middle of a run: the tool dies of the
# signal, no temporary file is left, and every file already in the folder
# is complete (gzip -t).
# cli: no-valgrind
# source: spec
. tests/cli/hostile/common.inc
cd "$TMPDIR_CASE" || exit 1
for args in "-n 0" "-n x" "-n 1e99" "-d 0" "-d -1" "-S 2026-02-30" \
    "-S 2026-13-01" "-p 7" "-p 0" "-p 10x" "-F bogus" "-F dup=2" \
    "-F dup=nan" "--mix 0,0,0,0" "--mix 1,2" "-z 10" "-s -1" \
    "--aging -1" "--tz +25:00" "-f c"; do
	echo "== cw-synth $args" >&2
	cw-synth -o out $args >/dev/null
	echo "cw-synth $args: exit $?"
done
: >afile
echo "== cw-synth -o afile" >&2
cw-synth -n 1 -d 1 -o afile
echo "cw-synth -o afile: exit $?"
# A run of many days, stopped once its first file is being written.
cw-synth -n 30 -d 400 -o run 2>/dev/null &
pid=$!
n=0
while [ -z "$(ls -a run 2>/dev/null | grep 'tmp')" ] && [ $n -lt 300 ]; do
	sleep 0.1
	n=$((n + 1))
done
kill -TERM $pid
wait $pid 2>/dev/null
echo "cw-synth killed by SIGTERM: exit $?," \
    "temporaries left: $(ls -a run | grep -c tmp)," \
    "incomplete gzip files: $(for f in run/*.gz; do [ -f "$f" ] &&
    ! gzip -t "$f" 2>/dev/null && echo "$f"; done | wc -l | tr -d ' ')"
