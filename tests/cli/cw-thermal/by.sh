# --by dock: each event row ends with the dock of the event's first row;
# --summary: one row per dock.  Two packs hop between two docks; P1 rides
# between (no dock: a group of its own, written first).
# By hand (each row's current over the minute before it, charge.h):
#  P1 at D-1: 08:01..08:03 at 3.6 A, -2..-1 C: one below-min event of
#    3 * 3.6 / 60 = 0.18 Ah, from 08:00 (the row before) to 08:03.
#  P2 at D-2: 08:01, 08:02 at 1.2 A, 5 C: cool, 0.04 Ah.  Then at D-1:
#    08:03, 08:04 at 2.4 A, -3 C: below-min, 0.08 Ah, from 08:02.
#    Without --by all four rows are one run on the cold side, one event
#    (below-min, 08:00..08:04, 0.12 Ah); with --by the change of dock
#    ends it (charging at another dock is another event, and events of
#    two docks are never merged).
#  P1 at D-2 from 10:00: 10:01, 10:02 at 6 A, 20 C: normal, 0.2 Ah.
#  Summary: D-1 2 devices, 2 below-min events, 0.18 + 0.08 = 0.26 Ah
#    below min, all outside (100 %); D-2 2 devices, 1 cool event, 0.04 Ah
#    cool of 0.24, outside 0.04 / 0.24 = 16.66666667 %; "" 1 device
#    (P1 riding), nothing charged.
# source: hand
cd "$TMPDIR_CASE" || exit 1
cat >s.csv <<'CSV'
device,time,voltage_v,current_a,temp_c,soc_pct,dock
P1,2026-03-01T08:00:00Z,39.0,0,-2,40,D-1
P1,2026-03-01T08:01:00Z,39.1,3.6,-2,41,D-1
P1,2026-03-01T08:02:00Z,39.2,3.6,-1,42,D-1
P1,2026-03-01T08:03:00Z,39.3,3.6,-1,43,D-1
P1,2026-03-01T09:00:00Z,39.0,-5,5,40,
P1,2026-03-01T09:01:00Z,39.0,-5,5,39,
P1,2026-03-01T10:00:00Z,39.0,0,20,38,D-2
P1,2026-03-01T10:01:00Z,39.1,6,20,39,D-2
P1,2026-03-01T10:02:00Z,39.1,6,20,40,D-2
P2,2026-03-01T08:00:00Z,39.0,0,5,40,D-2
P2,2026-03-01T08:01:00Z,39.1,1.2,5,41,D-2
P2,2026-03-01T08:02:00Z,39.2,1.2,5,42,D-2
P2,2026-03-01T08:03:00Z,39.2,2.4,-3,42,D-1
P2,2026-03-01T08:04:00Z,39.2,2.4,-3,42,D-1
CSV
cw-thermal --by dock s.csv
echo '== without --by: one P2 event'
cw-thermal s.csv
echo '== --summary'
cw-thermal --by dock --summary s.csv
echo '== the per-dock Ah add up to the per-device ones'
cw-thermal --summary s.csv | awk -F, 'NR > 1 { a += $4; b += $5 }
    END { printf "%.9g %.9g\n", a, b }'
cw-thermal --by dock -s s.csv | awk -F, 'NR > 1 { a += $11; b += $7 }
    END { printf "%.9g %.9g\n", a, b }'
echo '== a column the stream lacks'
cw-thermal --by site s.csv
echo "rc=$?"
cw-thermal --by '' s.csv
echo "rc=$?"
