# The canonical header of the sample stream, its columns in another order
# and with columns cw-clean does not know, which are ignored.  Output
# columns are always device,time,voltage_v,current_a,temp_c,soc_pct.
# source: spec
cd "$TMPDIR_CASE" || exit 1
printf 'note,soc_pct,temp_c,current_a,voltage_v,time,device,site\nok,83.5,11.4,-2.35,3.9812,2026-03-01T00:01:00Z,EB-0042,north\n' >a.csv
cw-clean a.csv
echo '== the sample stream passes through unchanged'
printf 'device,time,voltage_v,current_a,temp_c,soc_pct\nEB-0042,2026-03-01T00:01:00Z,3.9812,-2.35,11.4,83.5\nEB-0042,2026-03-01T00:02:00Z,3.98,-2.3,,\n' >b.csv
cw-clean b.csv | cmp - b.csv && echo same
