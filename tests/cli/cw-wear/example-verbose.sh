# cw-wear(1) EXAMPLES: the counts behind the report, on standard error.
cw-wear -v testdata/wear-fleet.csv >/dev/null
