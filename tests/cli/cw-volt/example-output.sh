# cw-volt(1) EXAMPLES: events of at least 5 minutes to a file.  A change
# of kind must now last 5 minutes to split an event, so EB-0101's charge
# and rest (240 s each, example-events.sh) are one charge event,
# 05:02..05:10, 480 s, 4.24..4.30 V, 0.1383333 Ah; EB-0102's rest
# (05:05..05:12, 420 s) lasts 5 minutes and splits from its use event,
# which (120 s) is then dropped as short.  -o is atomic: on a data error
# (a missing file after a good one) the old contents stay and no
# temporary is left.
# source: hand (the manual's examples over hand-made testdata; the derivation in the comments)
cd "$TMPDIR_CASE" || exit 1
top=$OLDPWD
cw-volt --min-duration 5m --fleet "$top/testdata/volt-register.csv" \
    -o long.csv "$top/testdata/volt-fleet.csv"
echo "rc=$?"
cat long.csv
echo old >long.csv
cw-volt -o long.csv "$top/testdata/volt-fleet.csv" nosuch.csv
echo "rc=$?"
cat long.csv
ls
