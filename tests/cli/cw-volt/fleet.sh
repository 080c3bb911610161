# The fleet file's cells override --cells per pack; a pack it does not
# list, or lists with an empty cells, gets --cells; a pack listed but
# not in the logs is no error.  Every pack reads 42.6 V at rest for 60 s
# (rows at 0, 30, 60 s): 10 cells give 4.26 V (over, 0..60 s), 12 cells
# 3.55 V (no event), 1 cell 42.6 V (over).
# source: hand
f=$TMPDIR_CASE/p.csv
echo device,time,voltage_v,current_a >"$f"
for d in TEN TWELVE NOTLISTED EMPTY; do
	for t in 0 30 60; do echo "$d,$t,42.6,0"; done
done >>"$f"
printf 'site,cells,device\nx,10,TEN\ny,12,TWELVE\nz,,EMPTY\nw,10,GONE\n' \
    >"$TMPDIR_CASE/reg.csv"
# --cells 12: TEN keeps 10 (over); TWELVE, NOTLISTED and EMPTY 12.
cw-volt --cells 12 --fleet "$TMPDIR_CASE/reg.csv" "$f"; echo "rc=$?"
# --cells 10: TWELVE keeps 12 (no event); the others 10 (over).
cw-volt --cells 10 --fleet "$TMPDIR_CASE/reg.csv" "$f"; echo "rc=$?"
# A bad fleet file: exit 1 with FILE:LINE, no output.
printf 'device,cells\nTEN,ten\n' >"$TMPDIR_CASE/bad.csv"
cw-volt --fleet "$TMPDIR_CASE/bad.csv" "$f" 2>&1 |
    sed "s|$TMPDIR_CASE/||"
cw-volt --fleet "$TMPDIR_CASE/bad.csv" "$f" >/dev/null 2>&1; echo "rc=$?"
cw-volt --fleet "$TMPDIR_CASE/nosuch.csv" "$f" >/dev/null 2>&1; echo "rc=$?"
