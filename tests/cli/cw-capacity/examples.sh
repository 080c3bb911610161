# cw-capacity(1) EXAMPLES, as written there.  By hand from
# testdata/capacity-fleet.py: EB-0103 holds 14.1 Ah (its discharges give
# 8.4 Ah over 59.6 points, 14.094 Ah: 10-minute rows of 2.8 A, so each
# step row carries 0.467 Ah and resolution_pct is 11 %); EB-0102 starts
# at 12.6 Ah and loses 0.012 Ah a day, 2.86 % of 12.6 per 30 days, and
# reaches 80 % of 14 Ah (11.2 Ah) after (12.6 - 11.2) / 0.012 = 116.7
# days from 2026-03-03, about 2026-06-28 (the line through the estimates
# gives 2026-06-26, and from the rest voltages 2026-06-27); EB-0101
# starts at 13.9 Ah and loses 0.004 Ah a day;
# its gauge jumps by 4 points on 2026-05-01, which ends that discharge
# early (89 to 75.3, 13.7 points: rejected, jump) and begins another.
# Everything else: snapshot.
# source: hand
cd "$TMPDIR_CASE" || exit 2
top=$OLDPWD
ln -s "$top/testdata" testdata
cw-capacity testdata/capacity-fleet.csv | head -n 7
cw-capacity -t -v --rated 14 testdata/capacity-fleet.csv
cw-capacity -t --rated 14 --eol 70 testdata/capacity-fleet.csv |
    awk -F, 'NR > 1 && $9 != "" && $9 < 90 { print $1, $9, $10 }'
cw-capacity --ocv testdata/ocv-synth.csv --cells 10 \
    testdata/capacity-fleet.csv | head -n 4
cw-capacity --rejects rejects.csv -o est.csv \
    testdata/capacity-fleet.csv
echo "rc=$? $(wc -l <est.csv) lines"
cat rejects.csv
cw-synth -n 3 -d 7 -F none -o week &&
    cw-clean --charge-negative --cells 10 week/*.a.csv.gz |
    cw-capacity -t --temp any
