# Without faults every day file holds a header and devices x 86400/period
# rows, in time order, every device once per period (3 devices at 60 s:
# 1 + 3 x 1440 = 4321 lines); -p takes a unit; with faults, the lines
# are 1 + repeated headers + rows - gap rows + duplicates.
# source: hand (without faults: 1 + devices x 86400 / period lines; with
#   faults the balance is recomputed by the case from the truth files)
t=$TMPDIR_CASE
cw-synth -n 3 -d 2 -p 1m -F none -o "$t/clean"
for f in "$t"/clean/*.a.csv.gz; do
	zcat "$f" | awk -F, -v f="${f##*/}" 'NR > 1 { n[$2]++
	    if ($1 < last) bad++; last = $1 }
	    END { printf "%s: %d lines, bad order %d;", f, NR, bad
	    for (d in n) printf " %s %d", d, n[d]; print "" }' | sort
done
cat "$t/clean/truth-days.csv"
cw-synth -n 3 -d 2 -p 30s -s 4 -F default,gap=3,header=2 -o "$t/faulty"
cat "$t/faulty/truth-days.csv"
zcat "$t"/faulty/*.a.csv.gz | wc -l
awk -F, 'NR > 1 { r += $31; g += $39; d += $33; w += $32 }
    END { print "rows", r, "gap_rows", g, "dup", d, "lines", w,
    "rows - gap_rows + dup", r - g + d }' "$t/faulty/truth-devices.csv"
awk -F, 'NR > 1 { h += $4; l += $2 } END { print "day lines", l,
    "headers", h }' "$t/faulty/truth-days.csv"
