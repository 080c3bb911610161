# cw-thermal(1) EXAMPLES: which dock charges in the cold, the manual's
# commands run as written (taken out of the page, roff's \e a backslash)
# and its output compared.
# source: snapshot: an invented fleet of cw-synth --docks (its one dock
#   without a cut-off, dock-07, is the one to charge below 0 C, which
#   tests/ref/thermal_by_dock.sh checks against the truth)
top=$(pwd)
cd "$TMPDIR_CASE" || exit 1
awk '/^\$ cw-synth -n 12 -d 3 --docks/ { go = 1 } go' "$top/man/cw-thermal.1" |
    sed -n '1,/^\.Ed/p' | sed '/^\.Ed/d; s/\\e/\\/g' >page.txt
sed -n '1,4p' page.txt | sed 's/^\$ //' >cmd.sh
cat cmd.sh
sh cmd.sh >got.txt
echo "rc=$?"
sed -n '5,$p' page.txt | cmp - got.txt && echo "the output is the manual's"
cat got.txt
