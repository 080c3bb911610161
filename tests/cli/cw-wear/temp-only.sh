# Temperature but no SoC column: zones and hours at 45 C are known, the
# model is not (it needs both): those fields are empty, never nan.
# 1 A for two 60 s intervals at 5 C and at 50 C: 1/30 Ah each.
printf 'device,time,current_a,temp_c\nA,0,1,5\nA,60,1,5\nA,120,1,50\nA,180,1,50\n' |
    cw-wear
