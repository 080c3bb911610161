# Duplicates: a second row of a device at a time it already has is
# rejected (the first one read is kept, whatever the values), in the
# window and right after its release; the same time on another device is
# no duplicate.  The same instant written two ways is a duplicate too.
# source: spec (which row of a duplicate is kept is cw-clean(1)'s rule; no
#   number to derive)
cd "$TMPDIR_CASE" || exit 1
printf 'device,time,voltage_v,current_a\nA,2026-03-01T00:00:00Z,3.8,1\nA,2026-03-01T00:00:00Z,3.8,1\nB,2026-03-01T00:00:00Z,3.9,2\nA,2026-03-01T00:00:30Z,3.7,1\nA,2026-03-01T00:00:00Z,3.6,1\nA,2026-03-01T01:00:00+01:00,3.5,1\nA,2026-03-01T00:05:00Z,3.7,1\nA,2026-03-01T00:00:30Z,3.7,1\nA,1772323500,3.7,1\n' >a.csv
cw-clean -v --max-reject 1 --rejects rej.csv a.csv
cat rej.csv
