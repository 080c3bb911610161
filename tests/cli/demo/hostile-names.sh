# No data reaches gnuplot or the shell as code (issue 25, item 6): the
# demo in a folder named with a quote and an "=" (which awk would take as
# an assignment), and the DCIR plot of a pack named
# X';system('touch PWNED');y=' (its names go to gnuplot as a data file).
# On main before the fix the folder broke the gnuplot -e strings and the
# pack name ran the command.
# source: spec: files made and not made, no number to derive
dir="$TMPDIR_CASE/it's a=b"
DEMO_NOBUILD=1 DEMO_DIR=$dir DEMO_DEVICES=4 DEMO_DAYS=2 \
    scripts/demo.sh >/dev/null 2>"$TMPDIR_CASE/log" ||
    { cat "$TMPDIR_CASE/log" >&2; echo "demo failed"; }
ls "$dir/out" | grep -c '\.png$'
cd "$dir/out" || exit 1
bad="X';system('touch PWNED');y='"
p=$(head -n 1 dcir-packs.txt)
for f in cw-dcir.csv cw-dcir-trend.csv; do
	awk -F, -v OFS=, -v p="$p" -v bad="$bad" \
	    'NR > 1 && $1 == p { $1 = bad } { print }' "$f" >"h-$f"
done
printf '%s\n' "$bad" >h-packs.txt
gnuplot -e "steps='h-cw-dcir.csv'; trend='h-cw-dcir-trend.csv'" \
    -e "packsfile='h-packs.txt'; out='h-dcir.png'" \
    "$OLDPWD/scripts/plot-dcir.gp" 2>/dev/null
echo "gnuplot: rc $?"
[ -s h-dcir.png ] && echo "plot made"
ls PWNED "$TMPDIR_CASE/PWNED" 2>/dev/null | wc -l
