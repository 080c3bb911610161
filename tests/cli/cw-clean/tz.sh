# --tz: the offset of local times without a zone; times with Z or an
# offset keep theirs.  08:00 local at +05:30 is 02:30Z; at -03:00 it is
# 11:00Z; 2026-03-01T00:30 at +01:00 is 2026-02-28T23:30Z (ISO 8601
# offsets are local minus UTC, east positive).
# source: standard ISO 8601 (a UTC offset is local time minus UTC, east
#   positive)
cd "$TMPDIR_CASE" || exit 1
printf 'device,time,voltage_v,current_a\nA,2026-03-01 08:00:00,3.8,1\nB,2026-03-01T08:00:00Z,3.8,1\nC,2026-03-01T08:00:00+02:00,3.8,1\nD,2026-03-01T00:30,3.8,1\n' >a.csv
echo '== default UTC'
cw-clean a.csv
echo '== +05:30'
cw-clean --tz +05:30 a.csv
echo '== -0300'
cw-clean --tz -0300 a.csv
echo '== +01'
cw-clean --tz +01 a.csv
echo '== bad offsets'
cw-clean --tz 5 a.csv
echo "rc=$?"
cw-clean --tz +25:00 a.csv
