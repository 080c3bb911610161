# A truncated gzip stream: exit 1, a message naming the file, and every
# row read before the cut written (valid CSV, the reorder window drained).
# source: spec
cd "$TMPDIR_CASE" || exit 1
awk 'BEGIN { print "device,time,voltage_v,current_a";
    for (i = 0; i < 20000; i++) print "A," 1000 + i ",3.8,1" }' | gzip >big.gz
head -c 30000 big.gz >cut.gz
cw-clean cut.gz >out.csv
echo "rc=$?"
# The whole lines the cut holds, by gzip itself (which reports the
# truncation too), less the header, are the rows to expect; the exact
# count depends on how gzip compressed, so it is not printed.
gzip -dc <cut.gz 2>/dev/null | awk -F, 'NR > 1 && NF == 4 && /,1$/' |
    sed 's/^A,//' >want.txt
cut -d, -f2 out.csv | sed 1d >got.txt
wc -l <want.txt | awk '{ print ($1 > 10000) ? "more than 10000 rows before the cut" : "too few rows" }'
/usr/bin/python3 - want.txt got.txt <<'PY'
# Each row before the cut, its epoch time converted by Python's datetime.
import sys
from datetime import datetime, timezone
want = [datetime.fromtimestamp(int(l.split(',')[0]), timezone.utc)
        .strftime('%Y-%m-%dT%H:%M:%SZ') for l in open(sys.argv[1])]
got = [l.strip() for l in open(sys.argv[2])]
print('every whole row kept' if want == got else
      'rows differ: %d wanted, %d got' % (len(want), len(got)))
PY
echo '== a file that is not gzip but starts like one'
printf '\037\213garbage' >bad.gz
cw-clean bad.gz
