# -h and --help print the usage to standard output and exit 0; the usage
# names every long option that cw-clean(1) documents.
# source: spec
cw-clean -h
cw-clean -h >"$TMPDIR_CASE/h.txt"
cw-clean --help | cmp - "$TMPDIR_CASE/h.txt" && echo "--help is the same"
n=0
for o in $(sed -n 's/^\.It Fl \\-\([a-z\\-]*\).*/\1/p' man/cw-clean.1 |
    sed 's/\\//g' | sort -u); do
	grep -q -- "--$o" "$TMPDIR_CASE/h.txt" || echo "usage lacks --$o"
	n=$((n + 1))
done
echo "$n long options of cw-clean(1) looked for in the usage"
