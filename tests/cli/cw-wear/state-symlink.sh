# A state behind a symbolic link (issue 25, item 1): fleet.state ->
# data/fleet.state, mode 0600.  A night over a cut gzip fails (exit 1) and
# leaves data/fleet.state whole and the link a link; the next good night
# writes the new state through the link (the temporary beside the target,
# renamed over it), keeps the link and the mode.  On main before the fix
# the failed night left a 0-byte data/fleet.state.
# source: spec: exit codes and file states only, no number to derive
cd "$TMPDIR_CASE" || exit 1
f=$OLDPWD/testdata/wear-fleet.csv
awk -F, 'NR == 1 || $2 < "2026-03-03"' "$f" >day1.csv
awk -F, 'NR == 1 || $2 >= "2026-03-03"' "$f" >day2.csv
gzip -c day2.csv >day2.csv.gz
head -c 2000 day2.csv.gz >cut.csv.gz
mkdir data
ln -s data/fleet.state fleet.state
cw-wear --state fleet.state day1.csv >/dev/null 2>&1
echo "night 1: rc $?"
chmod 600 data/fleet.state
cp data/fleet.state night1.state
cw-wear --state fleet.state cut.csv.gz >/dev/null
echo "cut night: rc $?"
cmp night1.state data/fleet.state && echo "data/fleet.state whole"
[ -L fleet.state ] && echo "fleet.state still a link"
cw-wear --state fleet.state day2.csv.gz >/dev/null
echo "night 2: rc $?"
[ -L fleet.state ] && echo "fleet.state still a link"
cmp -s night1.state data/fleet.state || echo "data/fleet.state moved on"
cw-wear --merge data/fleet.state >r.csv
cw-wear day1.csv day2.csv | cmp - r.csv && echo "its report = one pass"
ls -l data/fleet.state | cut -c1-10
ls -a data | grep -c tmp
