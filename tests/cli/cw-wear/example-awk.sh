# cw-wear(1) EXAMPLES: packs with a dominant cause, shortest life first
# (SPARE-55, stored at 40 % and 15 C, has none: no cause reaches a share
# of 0.25).  Snapshot of the model's values.
# source: snapshot: Xu et al. 2018 values over 2 days of 5 invented packs, not worked by hand (tests/ref/wear_*_xu2018.sh check the model)
cw-wear --cycle-life 500 testdata/wear-fleet.csv |
    awk -F, 'NR > 1 && $21 != "none" { print $20, $1, $18, $21 }' |
    sort -n
