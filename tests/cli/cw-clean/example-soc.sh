# cw-clean(1) EXAMPLES: coulomb-counted SoC of a 10-cell, 14 Ah pack,
# full voltage 41.2 V, run as the manual writes it on an invented log.
# By hand: C/20 = 0.7 A.  00:10 (41.3 V, 0.5 A) is full: 100.  Then
# 30 min at -7 A = -3.5 Ah = -25 % of 14 Ah: 75 at 00:40; 30 more min at
# -7 A: 50 at 01:10.  00:05 (41.3 V but 3 A) is not full.
# source: hand
top=$(pwd)
cd "$TMPDIR_CASE" || exit 1
cat >log.csv <<'CSV'
device,time,voltage_v,current_a,temp_c
EB-0042,2026-03-01T00:00:00Z,40.9,3.0,18
EB-0042,2026-03-01T00:05:00Z,41.3,3.0,18
EB-0042,2026-03-01T00:10:00Z,41.3,0.5,18
EB-0042,2026-03-01T00:25:00Z,39.8,-7.0,19
EB-0042,2026-03-01T00:40:00Z,39.2,-7.0,20
EB-0042,2026-03-01T00:55:00Z,38.6,-7.0,21
EB-0042,2026-03-01T01:10:00Z,38.0,-7.0,22
CSV
cw-clean --cells 10 --soc-from-charge 14 --full-voltage 41.2 log.csv
grep -q '^\$ cw-clean --cells 10 --soc-from-charge 14 --full-voltage 41.2 log.csv$' \
    "$top/man/cw-clean.1" && echo "the command is the manual's"
