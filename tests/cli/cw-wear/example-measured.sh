# cw-wear(1) EXAMPLES: the model against an invented cw-capacity --trend
# file of the five packs (testdata/wear-fleet-trend.csv), and the scales
# fitted to it.  Derivation, checked below: the span is 2 days and R the
# --capacity 10 Ah, so measured_fade_pct = -slope * 2 / 10 * 100: CART-11
# 0.24, EB-0044 0.04, TERM-22 0.16, TOOL-33 0.2; SPARE-55's interval
# holds zero: empty.  The fitted scales: snapshot (fit-scales.sh checks
# the fit against scales it must find).
# source: hand (measured_fade_pct); snapshot (the fit)
cw-wear --cycle-life 500 --capacity 10 \
    --measured testdata/wear-fleet-trend.csv testdata/wear-fleet.csv \
    >"$TMPDIR_CASE/out.csv"
echo "rc $?"
cat "$TMPDIR_CASE/out.csv"
awk -F, 'BEGIN { w["CART-11"] = 0.24; w["EB-0044"] = 0.04
		w["TERM-22"] = 0.16; w["TOOL-33"] = 0.2; w["SPARE-55"] = "" }
	NR > 1 { d = $28 - w[$1]
		if (($28 == "") != (w[$1] == "") || d > 1e-9 || d < -1e-9)
			bad++ }
	END { print bad ? "measured wrong: " bad : "measured as derived" }' \
    "$TMPDIR_CASE/out.csv"
cw-wear --cycle-life 500 --capacity 10 --fit-scales \
    --measured testdata/wear-fleet-trend.csv testdata/wear-fleet.csv
echo "rc $?"
