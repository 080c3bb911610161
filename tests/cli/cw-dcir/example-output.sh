# cw-dcir(1) EXAMPLES: Ea 35 kJ/mol, cold steps to 0 C, EOL at 150 %, to
# a file.  EB-0042 now keeps its two steps at 5 C (38 steps).  The data
# were made with Ea = 30, so with 35 the corrected values keep a factor
# exp(-(5000 / 8.314462618) (1/T - 1/298.15)): warm steps read high, cold
# ones low, and EB-0042, whose temperature wanders from day to day, is no
# longer flat and gets a wide interval, whose lower end is 0: so no
# eol_date (only a sure growth, the interval above zero, gets one) and
# growth_lo_pct_per_30d 0.  The output file appears only
# after success, and stdout stays empty.
# source: snapshot: with --ea 35 on data made with 30 the corrected values
#   come from a Theil-Sen fit of 38 steps each off by its own temperature
#   factor; not worked by hand, only the documented effects (EB-0042's 38
#   steps, its wide interval, the file appearing only on success) are
cw-dcir -t --ea 35 --temp 0,45 --eol 150 -o "$TMPDIR_CASE/trend.csv" \
    testdata/dcir-fleet.csv
echo "rc=$?"
cat "$TMPDIR_CASE/trend.csv"
