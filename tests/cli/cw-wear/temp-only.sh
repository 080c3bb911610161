# Temperature but no SoC column: zones and hours at 45 C are known, the
# model is not (it needs both): those fields are empty, never nan.
# source: hand.  Rows at 0, 60, 120, 180 s, 1 A each; a row's current and
# reading hold over the interval ending at it (cw-wear(1)), so the row at
# 0 s carries nothing: charge 3 * 60 s * 1 A = 0.05 Ah, of which the row
# at 60 s (5 C, cool) 1/60 = 0.01666666667 Ah cold and the rows at 120
# and 180 s (50 C, warm) 1/30 = 0.03333333333 Ah hot.  (An earlier
# version of this comment said 1/30 Ah each, counting the first row.)
# Time at 45 C or more, the temperature linear between rows: from 5 C at
# 60 s to 50 C at 120 s it is above 45 for the last 60 * 5/45 = 6.667 s,
# then 60 s: 66.67 s = 0.01851851852 h.  days = 180 / 86400.  Cold charge
# is a third of the charge, over 2 %: dominant cold-charge.
printf 'device,time,current_a,temp_c\nA,0,1,5\nA,60,1,5\nA,120,1,50\nA,180,1,50\n' |
    cw-wear
