# A file whose header is no tool output cw-report knows is exit 1 with
# "cw-report: FILE:1: unknown header", and a hint when it is a tool's
# other form (events instead of --summary, steps instead of --trend), a
# fleet file or an earlier report.  A header that lacks one of the
# columns the tool writes (cw-wear's without days_to_eol) is unknown too.
# Nothing is written on stdout.
# source: spec
cp -R testdata/report "$TMPDIR_CASE/d" && cp testdata/report-fleet.csv "$TMPDIR_CASE/fleet.csv" || exit 1
cd "$TMPDIR_CASE" || exit 1
d=d
printf 'pack,when,what\nA,1,2\n' >other.csv
cw-report other.csv; echo "exit $?"
printf 'device,kind,zone,start,end,duration_s,temp_min_c,temp_max_c,charge_ah,soc_start_pct,soc_end_pct,i_max_a,v_cell_max,protocol\n' >events.csv
cw-report "$d/wear.csv" events.csv; echo "exit $?"
printf 'device,time,soc_pct,temp_c,delta_i_a,delta_v_v,r_ohm,r_ref_ohm,dt_s,i_pre_a\n' >steps.csv
cw-report steps.csv; echo "exit $?"
cw-report fleet.csv; echo "exit $?"
cw-report --csv -o last.csv "$d/wear.csv"
cw-report last.csv; echo "exit $?"
sed '1s/,days_to_eol//' "$d/wear.csv" >short.csv
cw-report short.csv; echo "exit $?"
: >empty.csv
cw-report empty.csv; echo "exit $?"
# A --since file without device and reason columns.
cw-report --since other.csv "$d/wear.csv"; echo "exit $?"
