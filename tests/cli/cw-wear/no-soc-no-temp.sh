# A stream with neither soc_pct nor temp_c: exit 1 naming them.
# source: spec
printf 'device,time,voltage_v,current_a\nA,0,3.7,1\n' | cw-wear
