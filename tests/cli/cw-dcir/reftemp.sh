# --ref-temp takes units: 77F = 25 C = 298.15K give the default output;
# --ea 0 switches the correction off (r_ref_ohm = r_ohm).
# source: hand (77 F = 25 C by C = (F - 32) * 5/9, 298.15 K = 25 C by K = C +
#   273.15; with Ea = 0 the Arrhenius factor is exp(0) = 1)
f=testdata/dcir-fleet.csv
cw-dcir "$f" >"$TMPDIR_CASE/c.csv"
for r in 77F 298.15K 25C; do
	cw-dcir --ref-temp $r "$f" | cmp - "$TMPDIR_CASE/c.csv" &&
	    echo "--ref-temp $r: same as the default 25"
done
cw-dcir --ea 0 "$f" | awk -F, 'NR > 1 && $7 != $8 { bad++ }
    END { print (bad ? bad " rows differ" : "--ea 0: r_ref_ohm = r_ohm") }'
