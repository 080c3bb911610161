#!/bin/sh
# cw-thermal --by dock against the truth of cw-synth --docks: packs hop
# between seven docks, and dock-07's charger has no temperature cut-off,
# so (in January) charging below 0 C happens there and nowhere else.
# The truth is the simulator's own record of every charging event below
# 0 C with the dock it happened at (truth-charging.csv, site), which the
# tools never see.  Checks, on 12 packs over 7 winter days:
#  - recall and precision by dock: the docks cw-thermal --by dock --summary
#    gives below-min events are exactly the truth's, and the count per
#    dock is within 10 % of the truth's (event edges differ: the truth
#    merges over its own rule; common practice, no source);
#  - per event: every below-min event of cw-thermal whose start falls in
#    a truth below-min event of the same pack names that event's dock,
#    and at least 90 % of the events are so matched.
set -eu
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
cw-synth -n 12 -d 7 -s 7 --docks -o "$tmp/in"
cw-clean --cells 10 --bounds current=-30:30 --keep dock "$tmp"/in/*.a.csv.gz \
    2>/dev/null >"$tmp/s.csv"
cw-thermal --by dock "$tmp/s.csv" >"$tmp/ev.csv"
cw-thermal --by dock -s "$tmp/s.csv" >"$tmp/sum.csv"
awk -F, 'NR > 1 && $3 > 0 { print $1, $3 }' "$tmp/sum.csv" | sort >"$tmp/got"
awk -F, 'NR > 1 && $3 == "below-min" { n[$13]++ }
    END { for (d in n) print d, n[d] }' "$tmp/in/truth-charging.csv" |
    sort >"$tmp/truth"
echo "below-min events by dock: found $(tr '\n' ' ' <"$tmp/got")/ truth $(tr '\n' ' ' <"$tmp/truth")"
[ -s "$tmp/truth" ] || { echo "FAIL: no cold charging in the truth"; exit 1; }
[ "$(cut -d' ' -f1 "$tmp/got")" = "$(cut -d' ' -f1 "$tmp/truth")" ] ||
    { echo "FAIL: the docks differ"; exit 1; }
join "$tmp/got" "$tmp/truth" | awk '{ e = ($2 - $3) / $3; if (e < 0) e = -e
    if (e > 0.10) { print "FAIL: count off by more than 10 %:", $0; bad++ } }
    END { exit bad > 0 }'
# Per event: truth events (device, start, end, site) against found ones.
awk -F, 'FNR == 1 { f++; next }
    f == 1 && $3 == "below-min" { n[$1]++; s[$1, n[$1]] = $4; e[$1, n[$1]] = $5
	site[$1, n[$1]] = $13; next }
    f == 2 && $3 == "below-min" { tot++
	for (k = 1; k <= n[$1]; k++)
	    if ($4 >= s[$1, k] && $4 <= e[$1, k]) {
		m++; if ($15 != site[$1, k]) { wrong++; print "FAIL: dock", $0 }
		break }
    }
    END { printf "events: %d below-min found, %d in a truth event, %d of them at another dock\n", tot, m, wrong
	exit !(wrong == 0 && m >= 0.9 * tot) }' "$tmp/in/truth-charging.csv" "$tmp/ev.csv"
echo "ok: cold charging attributed to the truth's dock"
