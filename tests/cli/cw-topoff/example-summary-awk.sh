# cw-topoff(1) EXAMPLES: the devices topped off more than 12 times per
# calendar day (field 8 is micro_cycles_per_day).  TERM-31: 18 in its span
# of 15 h (17:00 to 08:00) is 18 * 24 / 15 = 28.8 a day, and 18 / 14 h
# held = 1.2857 per held hour; EB-0107 has none.  The full summary first.
# source: hand (18 * 24 / 15 and 18 / 14; the other columns of the full
#   summary are those of example-holds.sh)
cw-topoff -s testdata/topoff-dock.csv
echo
cw-topoff -s testdata/topoff-dock.csv | awk -F, 'NR > 1 && $8 > 12'
