# A header and no rows: the header alone, exit 0.
# source: spec
printf 'device,time,current_a,temp_c,soc_pct\n' | cw-wear
echo "rc $?"
