# cw-wear(1) EXAMPLES: packs that age faster than rest at 25 C, shortest
# life first (SPARE-55, stored at 40 % and 15 C, is left out as "none").
cw-wear --cycle-life 500 testdata/wear-fleet.csv |
    awk -F, 'NR > 1 && $18 != "none" { print $17, $1, $16, $18 }' |
    sort -n
