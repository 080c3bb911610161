# cw-clean(1) EXAMPLES: a dock column carried by --keep, the manual's
# commands run as written (taken out of the page, roff's \e a backslash)
# and its output compared.
# source: hand (one row: 3.91 V, 2.5 A, no temperature or SoC, dock D-3)
top=$(pwd)
cd "$TMPDIR_CASE" || exit 1
awk "/^\\\$ printf '%s/ { go = 1 } go" "$top/man/cw-clean.1" |
    sed -n '1,/^\.Ed/p' | sed '/^\.Ed/d; s/\\e/\\/g' >page.txt
sed -n '1,3p' page.txt | sed 's/^\$ //' >cmd.sh
cat cmd.sh
sh cmd.sh >got.txt
echo "rc=$?"
sed -n '4,$p' page.txt | cmp - got.txt && echo "the output is the manual's"
cat got.txt
