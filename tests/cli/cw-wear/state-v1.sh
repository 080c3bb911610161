# A state of the earlier format, cw-wear-state-1 (without top_used and
# top_lvl_since, the top-off detector's use-dip fields), is still read.
# It is made here from a cw-wear-state-2 one: the two fields dropped,
# the tag renamed, every row's check (FNV-1a 64 of the text before it)
# made again.  Continued with the second half of the log it gives the
# same report as the state-2 state does (snapshot: no top-off dip is open
# at the split, so nothing is lost).
f=testdata/wear-fleet.csv
d=$TMPDIR_CASE
n=$(wc -l <"$f")
h=$(( (n + 1) / 2 ))
head -n "$h" "$f" >"$d/a.csv"
{ head -n 1 "$f"; tail -n +"$(( h + 1 ))" "$f"; } >"$d/b.csv"
cw-wear --state "$d/s2" "$d/a.csv" >/dev/null
/usr/bin/python3 - "$d/s2" "$d/s1" <<'PY'
import sys
src, dst = sys.argv[1], sys.argv[2]
lines = open(src).read().split('\n')[:-1]
head = lines[0].split(',')
i = head.index('top_used')
assert head[i + 1] == 'top_lvl_since'
def fnv(s):
    h = 0xcbf29ce484222325
    for b in s.encode():
        h = ((h ^ b) * 0x100000001b3) & 0xffffffffffffffff
    return '%016x' % h
out = []
for k, l in enumerate(lines):
    f = l.split(',')
    if k == 0:
        f = f[:i] + f[i + 2:]
        f[3] = 'cw-wear-state-1'
        out.append(','.join(f))
        continue
    if f[4] == 'end':
        f[3] = 'cw-wear-state-1'
        body = ','.join(f[:-1])
    else:
        f = f[:i] + f[i + 2:]
        f[3] = 'cw-wear-state-1'
        body = ','.join(f[:-1])
    out.append(body + ',' + fnv(body))
open(dst, 'w').write('\n'.join(out) + '\n')
PY
head -n 1 "$d/s1" | cut -d, -f4
cw-wear --state "$d/s1" "$d/b.csv" >"$d/r1"; echo "rc $?"
cw-wear --state "$d/s2" "$d/b.csv" >"$d/r2"; echo "rc $?"
cmp "$d/r1" "$d/r2" && echo "the same report"
# The state written back is of the new format.
head -n 1 "$d/s1" | cut -d, -f4
