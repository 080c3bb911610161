# Values of a state checked as the options and inputs are (issue 25 item
# 5): a real state, one value edited the way a tamper would and the row's
# check signed again (FNV-1a 64, as statefmt.c), is refused with exit 1
# and "STATE:LINE: what is wrong"; the command line refuses the same
# settings.  The unedited state, re-signed, is still read (the signer
# changes nothing by itself).
# source: spec
f=testdata/wear-fleet.csv
d=$TMPDIR_CASE
cw-wear --state "$d/good.state" "$f" >/dev/null 2>/dev/null
# edit COLUMN VALUE [COLUMN VALUE ...]: good.state, row 2 edited, re-signed.
edit() {
	/usr/bin/python3 - "$d/good.state" "$@" <<'PY' >"$d/bad.state"
import csv, io, sys
rows = open(sys.argv[1], newline="").read().split("\n")
head = rows[0].split(",")
f = next(csv.reader([rows[1]]))
for k in range(2, len(sys.argv), 2):
    f[head.index(sys.argv[k])] = sys.argv[k + 1]
b = io.StringIO()
csv.writer(b, lineterminator="").writerow(f[:-1])
t = b.getvalue() + ","
h = 0xcbf29ce484222325
for c in t[:-1].encode():
    h = ((h ^ c) * 0x100000001b3) & 0xffffffffffffffff
rows[1] = t + "%016x" % h
sys.stdout.write("\n".join(rows))
PY
	cw-wear --state "$d/bad.state" "$f" >/dev/null 2>"$d/err"
	echo "rc $?"
	sed "s|$d/||" "$d/err"
}
edit device CART-11
edit hysteresis 1e308
cw-wear --hysteresis 1e308 "$f" 2>&1 >/dev/null | head -n 1
edit t1 60 t4 0
cw-wear --limits 60,10,45,0 "$f" 2>&1 >/dev/null | head -n 1
edit t1 -300
edit max_gap_us 0
edit min_depth 0
edit full_v 0
edit charge_ah -50
edit soc_s 1e12
edit gaps 999999
edit rf_full 999999
edit top_hold_end 9000000000000000000
edit top_lvl_since -9000000000000000000
edit soc0_t 1
edit top_hold_at_top2 9000000000000000000
