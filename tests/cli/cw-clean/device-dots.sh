# --device @file keeps the dots of a name (issue 25, item 9): only known
# extensions go (compression, then .csv .tsv .txt .log .dat, any case),
# then a daily date part, so 10.0.0.1.csv and 10.0.0.2.csv stay two
# devices.  On main before the fix both were "10" (one device, the second
# file's row rejected as a duplicate).
# source: spec: the names follow from the rule above
cd "$TMPDIR_CASE" || exit 1
for n in 10.0.0.1.csv 10.0.0.2.csv pack.A.LOG EB-7.20260301.txt.gz \
    cart.v2.tsv plain; do
	printf 'time,voltage_v,current_a\n1772323200,3.8,-1\n' >"$n"
done
gzip -c EB-7.20260301.txt.gz >x && mv x EB-7.20260301.txt.gz
cw-clean --device @file 10.0.0.1.csv 10.0.0.2.csv pack.A.LOG \
    EB-7.20260301.txt.gz cart.v2.tsv plain | cut -d, -f1,2
echo "rc $?"
