# cw-wear(1) EXAMPLES: the counts behind the report, on standard error.
# source: snapshot: the counts of testdata/wear-fleet.csv as cw-wear reports
#   them (965 rows of 5 packs, all used); the cycle and gap counts are not
#   worked by hand
cw-wear -v testdata/wear-fleet.csv >/dev/null
