# Bad input (SPEC.md exit codes: 1 data error, 2 usage error).
# source: spec
top=$(pwd)
cd "$TMPDIR_CASE" || exit 1
# Neither soc_pct nor voltage_v: exit 1, named in the message, with and
# without --full-voltage.
printf 'device,time,current_a,temp_c\nA,0,0,20\n' >none.csv
cw-topoff none.csv; echo "rc=$?"
cw-topoff --full-voltage 4.1 none.csv; echo "rc=$?"
# No current_a: a recharge cannot be told, exit 1.
printf 'device,time,soc_pct\nA,0,100\n' >nocur.csv
cw-topoff nocur.csv; echo "rc=$?"
# Rows that cannot be read are skipped and reported, the rest is used:
# a bad time and a time going back.
printf 'device,time,current_a,soc_pct\nA,0,0,99\nA,x,0,99\nA,120,0,99\nA,60,0,99\n' >skip.csv
cw-topoff skip.csv; echo "rc=$?"
# A file that does not exist, and a truncated gzip: exit 1.
cw-topoff missing.csv; echo "rc=$?"
gzip -c "$top/testdata/topoff-hand.csv" | head -c 300 >cut.csv.gz
cw-topoff cut.csv.gz >/dev/null; echo "rc=$?"
