# cw-topoff(1) EXAMPLES: the devices topped off more than 12 times per day
# held (field 8 is micro_cycles_per_day).  TERM-31: 18 in 14 h held is
# 18 * 24 / 14 = 30.857 a day; EB-0107 has none.  The full summary first.
# source: hand (18 * 24 / 14; the other columns of the full summary are those
#   of example-holds.sh)
cw-topoff -s testdata/topoff-dock.csv
echo
cw-topoff -s testdata/topoff-dock.csv | awk -F, 'NR > 1 && $8 > 12'
