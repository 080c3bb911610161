# --keep: raw columns carried after soc_pct under the names given, values
# as read (a quoted comma stays quoted, an empty one empty), put back in
# order with their rows (the late 00:01:10 row keeps its D-3); with
# --step each grid point takes the value of the last raw row in its
# interval (t - step, t]: 00:01:00 the row 00:00:50 (D-1), 00:02:00 the
# row 00:01:30 (D-2), 00:03:00 none in (00:02, 00:03], so the last row
# before it (00:01:30, D-2) is held; 00:04:00 frames the run with the
# last row's values (empty).  A name found ignoring case (dock for Dock)
# is written as given.  A column missing, named twice or a stream column
# already is an error; a value over 63 bytes is cut, with a warning.
# source: hand (the rows below; the grid voltages as in step.sh: 00:02:00
#   3.75 + 0.05 * 30/95 = 3.765789474)
cd "$TMPDIR_CASE" || exit 1
cat >a.csv <<'CSV'
dev,ts,pack_mv,pack_ma,temp_c,soc,Dock,note
B,2026-03-01T00:00:07Z,3700,1000,20,50,D-1,"x,y"
B,2026-03-01T00:00:50Z,3720,2000,21,51,D-1,
B,2026-03-01T00:01:30Z,3750,3000,22,52,D-2,z
B,2026-03-01T00:01:10Z,3740,3000,22,52,D-3,late
B,2026-03-01T00:03:05Z,3800,1000,23,,,
CSV
cw-clean --keep Dock,note a.csv
echo "rc=$?"
echo '== --step 1m'
cw-clean --keep dock,note --step 1m a.csv
echo '== the stream without --keep is the same but for the last columns'
cw-clean a.csv >plain.csv
cw-clean --keep Dock,note a.csv | cut -d, -f1-6 | sed 's/,"x$//' |
    cmp - plain.csv && echo same
echo '== errors'
cw-clean --keep nope a.csv
echo "rc=$?"
cw-clean --keep soc_pct a.csv
echo "rc=$?"
cw-clean --keep Dock,Dock a.csv
echo "rc=$?"
cw-clean --keep Dock, a.csv
echo "rc=$?"
cw-clean --keep a,b,c,d,e,f,g,h,i a.csv
echo "rc=$?"
echo '== a value too long for its slot'
awk 'BEGIN { s = ""; for (k = 0; k < 70; k++) s = s "x"
	print "device,time,voltage_v,current_a,site"
	print "B,1772323200,3.7,1," s; print "B,1772323260,3.7,1," s }' >long.csv
cw-clean --keep site long.csv | awk -F, 'NR > 1 { print length($7) }'
