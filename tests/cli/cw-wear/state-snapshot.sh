# The whole text of two saved states, byte for byte, so that a change in
# any engine's state fields (lib/rainflow.c rf_state_fields(),
# lib/topoff.c topoff_state_fields(), lib/wearstate.c) or in how
# lib/wearstate.c composes them shows here; and each read back with
# --merge --state-out comes out the same.
# source: snapshot: the states cw-wear wrote over testdata before the
#   engines owned their fields (commit 09352ab), the same bytes; behaviour
#   pinned, values not independently known
cw-wear --state-out testdata/wear-fleet.csv >"$TMPDIR_CASE/a"
echo "rc $?"
cat "$TMPDIR_CASE/a"
cw-wear --state-out --full-voltage 4.2 --residue repeat \
    testdata/topoff-dock.csv >"$TMPDIR_CASE/b"
echo "rc $?"
cat "$TMPDIR_CASE/b"
for s in a b; do
	cw-wear --merge --state-out "$TMPDIR_CASE/$s" >"$TMPDIR_CASE/$s.2"
	echo "rc $?"
	cmp "$TMPDIR_CASE/$s" "$TMPDIR_CASE/$s.2" && echo "$s read back the same"
done
