# Random byte mutations of real logs (a fixed seed): 12 copies of the
# invented wear fleet's sample stream (m0-*) and of a raw log (m1-*),
# each with 1 to 40 bytes replaced, inserted or deleted.  No tool may
# crash or hang: every run exits 0 or 1, and every message is "TOOL: ..."
# (with FILE:LINE when it is about a place in the input).  Counts only;
# the messages vary.  The fuzzers (make fuzz) go much further.
# source: snapshot: the exit counts of 24 mutated logs from a fixed seed; what
#   they must show (no crash, no stray message, whole CSV) is the contract,
#   the exact counts are not known beforehand
. tests/cli/hostile/common.inc
cd "$TMPDIR_CASE" || exit 1
$PY - "$top/testdata/wear-fleet.csv" "$top/testdata/rainflow-raw.csv" <<'PYEOF'
import random, sys
r = random.Random(1049)
for k, path in enumerate(sys.argv[1:]):
    data = bytearray(open(path, "rb").read())
    for m in range(12):
        d = bytearray(data)
        for _ in range(r.randint(1, 40)):
            op = r.randrange(3)
            pos = r.randrange(len(d))
            if op == 0:
                d[pos] = r.randrange(256)
            elif op == 1:
                d.insert(pos, r.choice(b',"\n\r\t;.-e0123456789\x00\xff'))
            else:
                del d[pos]
        open("m%d-%02d.csv" % (k, m), "wb").write(bytes(d))
PYEOF
# The stream tools read the mutated sample streams (m0-*), cw-clean both
# kinds, with voltage bounds that fit the mixed fleet.
for t in $TOOLS; do
	ok=0 data=0 other=0 badmsg=0
	files=m0-*.csv args=
	if [ "$t" = cw-clean ]; then
		files="m0-*.csv m1-*.csv" args="--bounds voltage=1:100"
	fi
	for f in $files; do
		"$t" $args "$f" >"o-$t-$f" 2>err.txt
		rc=$?
		case $rc in
		0) ok=$((ok + 1)) ;;
		1) data=$((data + 1)) ;;
		*) other=$((other + 1)); echo "$t $f: exit $rc" ;;
		esac
		badmsg=$((badmsg + $(grep -cv "^$t: " err.txt)))
	done
	echo "$t: $ok exit 0, $data exit 1, $other other, $badmsg stray message lines"
done
# Every output, whatever the exit status, is whole CSV.
$PY - o-*.csv <<'PYEOF'
import csv, io, sys
csv.field_size_limit(1 << 30)
bad = 0
for p in sys.argv[1:]:
    text = open(p, newline="", encoding="latin-1").read()
    try:
        rows = list(csv.reader(io.StringIO(text, newline=""), strict=True))
        ok = (text == "" or text.endswith("\n")) and \
            all(len(r) == len(rows[0]) for r in rows)
    except csv.Error:
        ok = False
    if not ok:
        bad += 1
        print("not whole CSV:", p)
print("%d outputs checked, %d not whole CSV" % (len(sys.argv) - 1, bad))
PYEOF
