# --charge-negative turns the sign of a log that counts charging current
# as negative; the sample stream counts charging as positive.  Bounds
# apply after the sign is turned (--bounds current=-1:5 keeps +4.5 A of
# charge, written -4.5 in the log, and rejects the -3 A of discharge,
# written +3).
# source: hand
cd "$TMPDIR_CASE" || exit 1
printf 'device,time,voltage_v,current_a\nC,1772323200,3.9,-4.5\nC,1772323260,3.8,3\nC,1772323320,3.8,0\n' >a.csv
cw-clean a.csv
cw-clean --charge-negative a.csv
cw-clean --charge-negative --bounds current=-1:5 --max-reject 1 -v a.csv
