# A header and nothing else, with and without a final line end, and a
# raw log's header for cw-clean: each tool writes its header, exit 0.
# source: spec
. tests/cli/hostile/common.inc
cd "$TMPDIR_CASE" || exit 1
echo device,time,voltage_v,current_a,temp_c,soc_pct >h.csv
printf 'device,time,voltage_v,current_a,temp_c,soc_pct' >h-noeol.csv
printf 'pack,timestamp,pack_mv,current_ma,temp_dk,soc\r\n' >raw.csv
run_all -v h.csv
run_all h-noeol.csv
run_one cw-clean -v raw.csv
