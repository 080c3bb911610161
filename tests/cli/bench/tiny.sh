# make bench keeps working: the whole script on a tiny fleet (timings are
# not compared, only that every row of the tables is there: 8 tool rows
# of the main table and 7 of the memory table).
# source: spec (the rows of the tables scripts/bench.sh writes; no timing is
#   compared)
BENCH_NOBUILD=1 BENCH_OUT=$TMPDIR_CASE/b.md sh scripts/bench.sh --tiny >/dev/null || exit 1
grep -c '^| cw-' $TMPDIR_CASE/b.md
grep -c '^| x[12] |' $TMPDIR_CASE/b.md
grep -c 'speed-up [0-9]' $TMPDIR_CASE/b.md
