# cw-clean(1) EXAMPLES: the cron line.  Its command (after the five time
# fields, /srv/packs replaced by a scratch folder) is taken from the
# manual and run twice: on a good night it writes clean/fleet.csv; on a
# night with a truncated upload it exits 1, names the file, and the
# previous clean/fleet.csv stays as it was.
# source: spec
top=$(pwd)
line=$(grep '^30 1 \* \* \* cd /srv/packs && ' "$top/man/cw-clean.1")
cmd=${line#30 1 \* \* \* cd /srv/packs && }
echo "command: $cmd"
mkdir -p "$TMPDIR_CASE/packs/incoming" "$TMPDIR_CASE/packs/clean"
cd "$TMPDIR_CASE/packs" || exit 1
printf 'device,time,voltage_v,current_a\nT-1,2026-03-01T01:00:00Z,3.9,-0.5\nT-1,2026-03-01T01:00:30Z,3.9,-0.5\nT-1,2026-03-01T01:01:00Z,3.9,-0.5\n' |
    gzip >incoming/T-1.csv.gz
echo '== night 1'
sh -c "$cmd"
echo "rc=$?"
cat clean/fleet.csv
cat clean/rejects.csv
echo '== night 2: a truncated upload'
awk 'BEGIN { print "device,time,voltage_v,current_a";
    for (i = 0; i < 20000; i++) print "T-2," 1772326800 + i ",3.9,-0.5" }' |
    gzip | head -c 20000 >incoming/T-2.csv.gz
sh -c "$cmd"
echo "rc=$?"
cat clean/fleet.csv
ls -a clean
