# An empty file, a file of one line end, and an empty gzip member (a
# device that logged nothing): no header, no rows.  Nothing is lost, so
# each tool writes its header and exits 0; with -v it says it read
# nothing.
# source: spec
. tests/cli/hostile/common.inc
cd "$TMPDIR_CASE" || exit 1
: >empty.csv
printf '\n' >newline.csv
printf '' | gzip -c >empty.csv.gz
run_all -v empty.csv
run_all newline.csv
run_all empty.csv.gz
