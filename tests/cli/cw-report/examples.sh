# cw-report(1) EXAMPLES, run as written there: each "$ " command of the
# section (continuation lines joined; /tmp/ moved to this case's scratch
# folder, testdata/ linked into it), then the cron script with
# /srv/cellwear moved to the scratch folder and a stand-in for mail(1)
# that logs its arguments and what it was given.  On testdata/report (see
# ranking.sh: 7 packs need attention) the script mails the report; on the
# healthy packs alone (healthy.sh) it mails nothing.  The script in
# README.md is the manual's, line for line.
# source: hand (the lists are those of ranking.sh); spec for exit codes
top=$PWD
cd "$TMPDIR_CASE" || exit 2
ln -s "$top/testdata" testdata
sec() {
	sed -n '/^\.Sh EXAMPLES/,/^\.Sh /p' "$top/man/cw-report.1"
}
sec | awk '/^\$ / { cmd = substr($0, 3); more = /\\e$/; if (!more) out(); next }
    more { cmd = cmd "\n" $0; more = /\\e$/; if (!more) out() }
    function out() { print cmd; print "echo \"exit $?\"" }' |
    sed 's/\\e$/\\/; s|/tmp/|'"$TMPDIR_CASE"'/|g' >cmds.sh
grep -v '^echo' cmds.sh | sed "s|$TMPDIR_CASE|TMP|g"
echo "=="
sh -x cmds.sh 2>&1 | grep -v '^+ echo' | sed "s|$TMPDIR_CASE|TMP|g" |
    grep -v -e '^These tools' -e '^cell below' -e '^it hot' \
    -e '^pack charged' -e '^out of service' -e '^charger that' \
    -e '^licensed'
echo "== cron"
sec | sed -n '/^#!\/bin\/sh$/,/^\.Ed$/p' | sed '$d' >morning.sh
mkdir -p srv/out bin
sed -i "s|/srv/cellwear|$TMPDIR_CASE/srv|" morning.sh
printf '#!/bin/sh\n{ echo "mail $*"; cat; } >>"%s/mailed"\n' \
    "$TMPDIR_CASE" >bin/mail
chmod +x bin/mail
cp testdata/report-fleet.csv srv/fleet.csv
cp testdata/report/*.csv srv/out/
night() {
	PATH=$TMPDIR_CASE/bin:$PATH sh morning.sh
	echo "exit $?"
	if [ -e mailed ]; then
		grep -e '^mail' -e '^Attention' -e 'new' mailed
		rm mailed
	else
		echo "nothing mailed"
	fi
	echo "last.csv: $(($(wc -l <srv/last.csv) - 1)) rows"
}
# The first morning: everything is new; the second: nothing is.
night
night
# A healthy night.
for f in srv/out/*.csv; do
	awk -F, 'NR == 1 || /^EB-1[258],/' "testdata/report/${f##*/}" >"$f"
done
night
echo "== README"
awk '/^    / { b = b substr($0, 5) "\n"; next }
    { if (b ~ /cw-report/ && b ~ /mail -s/) printf "%s", b; b = "" }' \
    "$top/README.md" | sed "s|/srv/cellwear|$TMPDIR_CASE/srv|" |
    diff - morning.sh && echo "README's script is the manual's"
