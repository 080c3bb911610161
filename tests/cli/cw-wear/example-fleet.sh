# cw-wear(1) EXAMPLES: packs already in service, from the register
# testdata/wear-register.csv.  Derivations, checked below: CART-11 was
# measured at 91.5 % SoH, so its damage_prior f0 solves L(f0) = 0.085
# and its soh_pct is 91.5 less its fade_pct; SPARE-55 has no prior in
# the register (new, f0 = 0).  The other values are a snapshot.
# source: hand (the prior inversion and soh_pct; the rest snapshot)
cw-wear --cycle-life 500 --fleet testdata/wear-register.csv \
    testdata/wear-fleet.csv >"$TMPDIR_CASE/out.csv"
echo "rc $?"
cat "$TMPDIR_CASE/out.csv"
awk -F, 'function L(f) {
		return 1 - 0.0575 * exp(-121 * f) - 0.9425 * exp(-f) }
	$1 == "CART-11" {
		d = L($24) - 0.085
		e = 91.5 - $18 - $19
		if (d < 1e-9 && d > -1e-9 && e < 1e-6 && e > -1e-6 &&
		    $22 == "soh")
			print "CART-11: L(f0) = 0.085, soh_pct = 91.5 - fade_pct"
	}
	$1 == "SPARE-55" && $22 == "new" && $24 == 0 { print "SPARE-55: new" }
' "$TMPDIR_CASE/out.csv"
