# Empty and non-numeric signal values are skipped and counted (-v), never
# read as 0: with them the counts equal those of the stream without them.
# A row with a bad time is skipped by the reader with a message.
# source: spec
cd "$TMPDIR_CASE" || exit 1
f=bad.csv
cat >"$f" <<'CSV'
device,time,soc_pct,temp_c
A,2026-01-01T00:00:00Z,80,20
A,2026-01-01T00:01:00Z,,20
A,2026-01-01T00:02:00Z,40,21
A,2026-01-01T00:03:00Z,n/a,21
A,2026-01-01T00:04:00Z,90,22
A,yesterday,10,22
A,2026-01-01T00:05:00Z,-,22
A,2026-01-01T00:06:00Z,30,23
CSV
cw-rainflow -v "$f"
echo "rc=$?"
cw-rainflow "$f" 2>/dev/null >x
grep -v -e ',,' -e 'n/a' -e yesterday -e ',-,' "$f" | cw-rainflow |
    cmp - x && echo "same as without those rows"
# A stream whose signal is empty everywhere says so (exit 0, no cycles).
printf 'device,time,soc_pct\nA,0,\nA,60,\n' | cw-rainflow -s
echo "rc=$?"
