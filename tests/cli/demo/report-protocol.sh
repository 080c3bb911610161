# scripts/morning-report.sh names packs charged cool or warm only for
# events outside the charge protocol (cw-thermal's protocol column); the
# JEITA scheme allows charging there at reduced current or voltage.
# Hand-made cw-thermal events, the wear of two packs alike:
#   EB-1  cool, within (a 9.95 C reading at reduced current): not named;
#   EB-2  cool, over-current: named, "1 packs charged cool";
#   EB-1  warm, within: not named; EB-2 warm, over-voltage: named;
#   EB-1  use event in the cold: never a charge, not named.
# Then the same events with EB-1's cool event unknown (no capacity): it
# counts, as the verdict is not known, and the report says "not within"
# instead of "outside" for the cool zone; and without a protocol column (an older
# cw-thermal) every cool and warm charge event counts, as before.
# source: hand
d=$TMPDIR_CASE
cat >"$d/cw-wear.csv" <<'CSV'
device,first,last,days,charge_ah,cold_charge_ah,fade_pct,soh_pct,days_to_eol,dominant
EB-1,2026-03-01T00:00:00Z,2026-03-31T00:00:00Z,30,100,0,1,99,900,cycling
EB-2,2026-03-01T00:00:00Z,2026-03-31T00:00:00Z,30,100,0,1,99,800,cycling
CSV
h=device,kind,zone,start,end,duration_s,charge_ah,i_max_a,v_cell_max,protocol
t=2026-03-02T06:00:00Z,2026-03-02T06:10:00Z,600
{
	echo "$h"
	echo "EB-1,charge,cool,$t,0.4,2.8,4.2,within"
	echo "EB-2,charge,cool,$t,1.2,10,4.2,over-current"
	echo "EB-1,charge,warm,$t,0.4,2.8,4.1,within"
	echo "EB-2,charge,warm,$t,0.4,2.8,4.2,over-voltage"
	echo "EB-1,use,below-min,$t,-0.4,,,"
} >"$d/cw-thermal.csv"
scripts/morning-report.sh "$d" | grep 'packs charged'
echo "== EB-1 cool unknown"
sed -i '2s/within$/unknown/' "$d/cw-thermal.csv"
scripts/morning-report.sh "$d" | grep 'packs charged'
echo "== no protocol column"
cut -d, -f1-7 "$d/cw-thermal.csv" >"$d/t" && mv "$d/t" "$d/cw-thermal.csv"
scripts/morning-report.sh "$d" | grep 'packs charged'
