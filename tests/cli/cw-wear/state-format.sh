# The state of one device: its header, its first columns, the residue,
# the top-off prefix and the end row; then every row's field count.
# source: spec (the state file's layout; its numbers are whatever the run
#   accumulated, only the field counts are checked)
f=testdata/wear-fleet.csv
grep -E '^(device|TOOL-33),' "$f" | cw-wear --state-out >"$TMPDIR_CASE/s"
echo "rc $?"
head -n 1 "$TMPDIR_CASE/s" | tr , '\n' | head -n 16
cut -d, -f1-16 "$TMPDIR_CASE/s"
awk -F, '{ print NR ": " NF " fields" }' "$TMPDIR_CASE/s"
