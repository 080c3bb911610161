# An invented fleet of 4 packs over 2 days (cw-synth, without faults):
# three charge in the normal window or, from the dock's pads, just below
# 10 C within the protocol; EB-0004, at dock-07 whose charger has no
# temperature cut-off, is charged below 0 C (cw-synth's truth says so:
# its truth-devices row is the only one with cold charge).  Every
# analysis tool writes its per-device output and cw-report reads them
# all: EB-0004 must come first (here it is the only pack), with exit 3.
# The cool-zone charging of EB-0002 and EB-0003 within the protocol is
# not a reason.
# source: snapshot: the reason's figures are cw-thermal's on this fleet
#   (its own cases check them); the order and the exit status are the spec
cd "$TMPDIR_CASE" || exit 1
cw-synth -n 4 -d 2 -F none -o in || exit 1
cw-clean --charge-negative --cells 10 -o s.csv in/*.a.csv.gz || exit 1
awk -F, 'NR == 1 { print "device,site,model,capacity_ah"; next }
    { print $1 "," $4 ",EB14,14" }' in/truth-devices.csv >fleet.csv
awk -F, 'NR == 1 { for (i = 1; i <= NF; i++) c[$i] = i; next }
    $c["cold_charge_ah"] > 0 { print "truth: cold charge:", $1 }' \
    in/truth-devices.csv
cw-wear --fleet fleet.csv -o wear.csv s.csv || exit 1
cw-thermal -s --fleet fleet.csv --cells 10 -o thermal.csv s.csv || exit 1
cw-topoff -s -o topoff.csv s.csv || exit 1
cw-dcir -t -o dcir.csv s.csv || exit 1
cw-capacity -t --fleet fleet.csv -o capacity.csv s.csv || exit 1
cw-volt -s --cells 10 -o volt.csv s.csv || exit 1
cw-report --fleet fleet.csv wear.csv thermal.csv topoff.csv dcir.csv \
    capacity.csv volt.csv
echo "exit $?"
cw-report --fleet fleet.csv --csv volt.csv capacity.csv dcir.csv \
    topoff.csv thermal.csv wear.csv
echo "exit $?"
