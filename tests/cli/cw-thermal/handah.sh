# Charge of an event against hand-integrated values (1 Ah = 1 A for
# 3600 s; a row's current stands for the interval ending at the row).
# CC: 2 A for 30 min at 5 C in rows 60 s apart: 2 A * 0.5 h = 1 Ah.
# Uneven: 3 A for 10 s, 1.2 A for 50 s, 0.5 A for 120 s, all at 50 C:
# 30 + 60 + 60 = 150 As = 0.04166666667 Ah over 180 s.
# source: hand
f=$TMPDIR_CASE/a.csv
echo device,time,current_a,temp_c,soc_pct >"$f"
echo CC,1767225600,0,20,30 >>"$f"
s=1; while [ $s -le 30 ]; do
	echo "CC,$((1767225600 + s * 60)),2,5,$((30 + s))"; s=$((s + 1))
done >>"$f"
echo CC,1767227460,0,20,60 >>"$f"
cat >>"$f" <<'ROWS'
UN,1767225600,0,25,
UN,1767225610,3,50,50
UN,1767225660,1.2,50,
UN,1767225780,0.5,50,52.5
UN,1767225840,0,25,52.5
ROWS
cw-thermal "$f"
