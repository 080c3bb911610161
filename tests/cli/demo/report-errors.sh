# scripts/morning-report.sh on bad input: no folder, a bad -n, a folder
# without the tools' outputs, a cw-wear.csv without a column it needs.
# source: spec
scripts/morning-report.sh; echo "exit $?"
scripts/morning-report.sh -n 0 "$TMPDIR_CASE"; echo "exit $?"
scripts/morning-report.sh -n x "$TMPDIR_CASE"; echo "exit $?"
scripts/morning-report.sh "$TMPDIR_CASE" a b; echo "exit $?"
scripts/morning-report.sh "$TMPDIR_CASE/none" 2>"$TMPDIR_CASE/err"
echo "exit $?"
sed "s|$TMPDIR_CASE|DIR|" "$TMPDIR_CASE/err"
printf 'device,first,last,days,charge_ah\nEB-1,x,y,1,2\n' \
    >"$TMPDIR_CASE/cw-wear.csv"
printf 'device,kind,zone,start,end,duration_s,charge_ah\n' \
    >"$TMPDIR_CASE/cw-thermal.csv"
scripts/morning-report.sh "$TMPDIR_CASE" 2>"$TMPDIR_CASE/err"
echo "exit $?"
sed "s|$TMPDIR_CASE|DIR|" "$TMPDIR_CASE/err"
