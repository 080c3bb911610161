# The largest finite numbers a log can hold (1e308), which num.h accepts:
# no sum or interpolation may overflow into an infinite or empty result.
# Found by make fuzz (tests/fuzz/regress/fuzz_wear/): a temperature of
# 1e308 next to 20 C made cw-wear's hours_temp_ge_45 (now hours_hot)
# infinite (written as an empty field).  Over 60 s from 20 C to 1e308 C the pack is at 45 C or
# more for all but a vanishing part of the interval: 60 s, 0.01666... h;
# the third row, -1e308 C, is below absolute zero and left out of the
# temperature terms (wear.h).  --dwell likewise: the 60 s go to the bands
# the line from 20 to 1e308 C crosses, almost all of it above T3 = 45 C
# (its crossings of the edges at 25, 35 and 45 C lie within 3e-307 of its
# start), none lost.
# source: hand
. tests/cli/hostile/common.inc
cd "$TMPDIR_CASE" || exit 1
printf '%s\n' device,time,voltage_v,current_a,temp_c,soc_pct \
    A,1772323200,3.7,1,20,50 A,1772323260,3.7,1,1e308,50 \
    A,1772323320,3.7,-1,-1e308,50 >huge.csv
run_all huge.csv
cw-wear huge.csv | cut -d, -f1,9
cw-wear --dwell huge.csv
