# --device @file: each file's base name without any extension names its
# rows, gzip or not; standard input is named "stdin".
# source: spec
cd "$TMPDIR_CASE" || exit 1
mkdir -p logs/site-a
printf 'time,voltage_v,current_a\n1772323200,3.8,-1\n' >logs/site-a/EB-0042.2026-03-01.csv
printf 'time,voltage_v,current_a\n1772323200,3.7,-2\n' >logs/EB-0043.csv
gzip logs/EB-0043.csv
printf 'time,voltage_v,current_a\n1772323200,3.6,-3\n' >CART-07
cw-clean --device @file logs/site-a/EB-0042.2026-03-01.csv logs/EB-0043.csv.gz CART-07
cw-clean --device @file <CART-07
