# --charge-sign negative is --charge-negative; --charge-sign positive
# leaves the sign as logged and, coming later, overrides an earlier
# --charge-negative.  Hand derivation: the log's -4.5 A (charging,
# counted negative) is written +4.5 with negative, -4.5 with positive;
# 'auto' and other words are usage errors (exit 2).
# source: hand
cd "$TMPDIR_CASE" || exit 1
printf 'device,time,voltage_v,current_a\nC,1772323200,3.9,-4.5\nC,1772323260,3.8,3\n' >a.csv
cw-clean --charge-sign negative a.csv
cw-clean --charge-negative a.csv | cmp - "$(cw-clean --charge-sign negative a.csv >n.csv; echo n.csv)" && echo same
cw-clean --charge-negative --charge-sign positive a.csv
cw-clean --charge-sign sideways a.csv
echo "rc=$?"
