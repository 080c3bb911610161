# cw-wear(1) EXAMPLES: packs that age faster than rest at 25 C, shortest
# life first (SPARE-55, stored at 40 % and 15 C, is left out as "none").
# source: snapshot: the lives and shares of testdata/wear-fleet.csv come from
#   Xu et al. 2018 through rainflow cycles and the trapezoid rule over 2 days
#   of 5 invented packs; not worked by hand (the model is checked against an
#   independent evaluation in tests/ref/wear_*_xu2018.sh, and dominant.sh and
#   missing-values.sh work small cases)
cw-wear --cycle-life 500 testdata/wear-fleet.csv |
    awk -F, 'NR > 1 && $18 != "none" { print $17, $1, $16, $18 }' |
    sort -n
