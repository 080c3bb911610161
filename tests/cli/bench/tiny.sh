# make bench keeps working: the whole script on a tiny fleet (timings are
# not compared, only that every row of the tables is there: 8 tool rows
# of the main table, 7 of the memory table and 3 of the day table, whose
# two floors are there too; the day's stream the same on one thread and
# on two, by its sha256).  What an earlier BENCHMARKS.md holds below the
# marker line is kept, once; what it held above is replaced.
# source: spec (the rows of the tables scripts/bench.sh writes; no timing is
#   compared)
printf '%s\n' '# old table, replaced' \
    '<!-- scripts/bench.sh keeps everything below this line -->' \
    '' 'A note of an earlier run, kept.' >$TMPDIR_CASE/b.md
BENCH_NOBUILD=1 BENCH_OUT=$TMPDIR_CASE/b.md sh scripts/bench.sh --tiny >/dev/null || exit 1
grep -c '^| cw-' $TMPDIR_CASE/b.md
grep -c '^| x[12] |' $TMPDIR_CASE/b.md
grep -c 'speed-up [0-9]' $TMPDIR_CASE/b.md
grep -c '^| floor [AB]: ' $TMPDIR_CASE/b.md
grep -c 'one thread [0-9a-f]\{64\} (the same)' $TMPDIR_CASE/b.md
grep -c '^A note of an earlier run, kept\.$' $TMPDIR_CASE/b.md
grep -c 'old table, replaced' $TMPDIR_CASE/b.md
grep -c '^<!-- scripts/bench.sh keeps everything below this line -->$' $TMPDIR_CASE/b.md
