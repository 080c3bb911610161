# cw-clean(1) EXAMPLES: a -c mapping for epoch milliseconds, mV, mA and
# tenths of a kelvin, run as the manual writes it, output compared with
# the manual's.  By hand: 1772352000000 ms = 2026-03-01T08:00:00Z;
# 3812 mV = 3.812 V; -1350 mA = -1.35 A; 2846 dK = 284.6 K = 11.45 C
# (K = C + 273.15).
# source: hand
spec=device=node,time=stamp:ms,voltage=u_pack:mV
spec=$spec,current=i_pack:mA,temp=t_pack:dK
cw-clean -c "$spec" testdata/clean-gauge-ms.csv >"$TMPDIR_CASE/out.csv"
echo "rc=$?"
cat "$TMPDIR_CASE/out.csv"
sed -n '/^\$ cw-clean -c "\$spec"/,/^\.Ed/p' man/cw-clean.1 | sed '1d;$d' |
    cmp - "$TMPDIR_CASE/out.csv" && echo "same as the manual"
grep -q '^\$ spec=device=node,time=stamp:ms,voltage=u_pack:mV$' man/cw-clean.1 &&
    grep -q '^\$ spec=\$spec,current=i_pack:mA,temp=t_pack:dK$' man/cw-clean.1 &&
    echo "the spec is the manual's"
