# README.md "Which dock, charger or site charges in the cold": the join
# of a site from the fleet file, run as written there (bin/ as on PATH),
# against the output the README shows after it.
# source: snapshot: cw-thermal's per-site summary of the testdata fleet
#   (its numbers are derived in cw-thermal's own cases); pinned here is
#   that the README's recipe runs as written and prints what it shows
top=$(pwd)
cd "$TMPDIR_CASE" || exit 1
awk '/^### Which dock, charger or site/ { go = 1 } go' "$top/README.md" |
    awk '/^    awk -F, -v OFS=,/ { go = 1 } go && /^$/ { exit } go' |
    sed 's/^    //; s#bin/##g; s#testdata/#'"$top"'/testdata/#g' >cmd.sh
awk '/^### Which dock, charger or site/ { go = 1 } go' "$top/README.md" |
    awk '/^which prints$/ { go = 1; next } go && /^    / { print substr($0, 5) }
    go && /^Put the stream/ { exit }' >shown.txt
sh cmd.sh >got.txt
echo "rc=$?"
cat got.txt
cmp shown.txt got.txt && echo "as the README shows"
