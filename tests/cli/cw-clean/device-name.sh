# --device NAME for a log without a device column, from a file and from
# standard input; -c device= and --device together are a usage error.
# source: spec
cd "$TMPDIR_CASE" || exit 1
printf 'time,voltage_v,current_a\n1772323200,3.8,-1\n1772323260,3.79,-1\n' >a.csv
cw-clean --device TERM-12 a.csv
cw-clean --device TERM-12 <a.csv
echo '== a device column is then not needed, and not read'
printf 'device,time,voltage_v,current_a\nX,1772323200,3.8,-1\n' >b.csv
cw-clean --device TERM-12 b.csv
echo '== empty name'
cw-clean --device '' a.csv
echo "rc=$?"
cw-clean --device TERM-12 -c device=device b.csv
