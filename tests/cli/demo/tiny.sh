# make demo's script on a tiny fleet (4 packs, 2 days) in a scratch
# folder: the morning report it prints, the files it leaves, the header
# of each CSV, the size of each plot (a PNG's IHDR width and height), and
# that morning-report.txt holds what was printed.
# source: snapshot: the morning report of a tiny invented fleet made by
#   cw-synth and run through every tool, pinned as printed; its figures are
#   not worked by hand (each tool's own cases and reference checks cover them)
DEMO_NOBUILD=1 DEMO_DIR=$TMPDIR_CASE DEMO_DEVICES=4 DEMO_DAYS=2 \
    scripts/demo.sh >"$TMPDIR_CASE/printed" 2>"$TMPDIR_CASE/log" ||
    { cat "$TMPDIR_CASE/log" >&2; exit 1; }
cat "$TMPDIR_CASE/printed"
cd "$TMPDIR_CASE/out" || exit 1
ls
for f in *.csv; do
	printf '%s: %s\n' "$f" "$(head -n 1 "$f")"
done
printf 'cw-clean.csv.gz: %s\n' "$(gzip -dc cw-clean.csv.gz | head -n 1)"
for f in *.png; do
	od -An -tu1 -N24 "$f" | tr -s ' \n' '  ' | awk -v f="$f" '{
	    png = ($1 == 137 && $2 == 80 && $3 == 78 && $4 == 71)
	    w = (($17 * 256 + $18) * 256 + $19) * 256 + $20
	    h = (($21 * 256 + $22) * 256 + $23) * 256 + $24
	    print f ": " (png ? "PNG" : "not a PNG") ", " w " x " h }'
done
cmp "$TMPDIR_CASE/printed" morning-report.txt &&
    echo "morning-report.txt: as printed"
