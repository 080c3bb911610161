# cw-wear(1) EXAMPLES: the morning report of the invented fleet
# (testdata/wear-fleet.py says what each pack was built to show).
# source: snapshot: the report of testdata/wear-fleet.csv (Xu et al. 2018
#   through rainflow cycles and the trapezoid rule over 2 days of 5 invented
#   packs) is pinned as written; the model is checked in
#   tests/ref/wear_*_xu2018.sh, small cases are worked in dominant.sh and
#   missing-values.sh
cw-wear testdata/wear-fleet.csv
