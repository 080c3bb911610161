# --charge-sign turns only the current written: format A (negative by
# its own convention) with --charge-sign positive holds, line for line,
# the default's values with the current's sign turned, and the truth is
# the same file; format B with --charge-sign negative likewise.  --docks
# adds a last column dock (depot, dock-01..dock-07, empty away from a
# charger) and packs hop between docks: which docks each pack was seen
# at, and that a pack at a dock or the depot is the one the truth names
# for its charging events.
# source: spec (the sign: cw-synth(1) OUTPUT); snapshot: the docks each
#   pack visits (drawn from a hash of the seed; not independently known)
cd "$TMPDIR_CASE" || exit 1
cw-synth -n 6 -d 1 -p 1m -F none -f both -o def
cw-synth -n 6 -d 1 -p 1m -F none -f a --charge-sign positive -o pos
cw-synth -n 6 -d 1 -p 1m -F none -f b --charge-sign negative -o neg
gzip -dc def/*.a.csv.gz >def.a
gzip -dc pos/*.a.csv.gz >pos.a
gzip -dc def/*.b.csv.gz >def.b
gzip -dc neg/*.b.csv.gz >neg.b
awk -F, 'BEGIN { OFS = "," } NR > 1 && $4 != 0 { $4 = -$4 } { print }' def.a |
    cmp - pos.a && echo "a, positive: the default's current turned"
awk -F';' 'BEGIN { OFS = ";" } NR > 1 && $4 !~ /^0,000$/ {
    $4 = $4 ~ /^-/ ? substr($4, 2) : "-" $4 } { print }' def.b |
    cmp - neg.b && echo "b, negative: the default's current turned"
cmp def/truth-devices.csv pos/truth-devices.csv && echo "the same truth"
echo "rows charging (a, default / positive): $(awk -F, 'NR > 1 && $4 < 0' def.a | wc -l) / $(awk -F, 'NR > 1 && $4 > 0' pos.a | wc -l)"
cw-synth -n 6 -d 2 -p 1m -F none -f both --docks -o docks
gzip -dc docks/*.a.csv.gz | sed -n 1p
gzip -dc docks/*.b.csv.gz | sed -n 1p
echo '== docks seen per pack (a)'
gzip -dc docks/*.a.csv.gz | awk -F, 'FNR > 1 && $7 != "" && $7 != "dock" {
    k = $2 " " $7; if (!(k in s)) { s[k] = 1; print k } }' | sort |
    awk '{ a[$1] = a[$1] " " $2 } END { for (d in a) print d ":" a[d] }' | sort
echo '== the same column in b'
gzip -dc docks/*.a.csv.gz | cut -d, -f7 >dock.a
gzip -dc docks/*.b.csv.gz | cut -d';' -f7 >dock.b
cmp dock.a dock.b && echo same
echo '== every truth charging event at a site where its pack was logged'
gzip -dc docks/*.a.csv.gz | awk -F, 'FNR > 1 { print $2, $7 }' | sort -u >seen
awk -F, 'NR > 1 { print $1, $13 }' docks/truth-charging.csv | sort -u >events
echo "$(wc -l <events) pack and site pairs of events, not logged: $(comm -23 events seen | wc -l)"
echo '== a sign that is not positive or negative'
cw-synth --charge-sign auto -o bad
echo "rc=$?"
