# -o FILE under hostile conditions (issue 25, item 8), with cw-clean:
# SIGTERM, SIGQUIT and SIGALRM mid-run leave no temporary and the old file
# as it was; a file size limit (ulimit -f, SIGXFSZ) is a write error, exit
# 1, no temporary; an old file's mode 0600 is kept; one's own FIFO is
# written in place (its reader may start later); a name of 250 bytes works (its
# temporary's name is cut to the file system's limit).  On main before the
# fix SIGQUIT, SIGALRM and SIGXFSZ left .res.csv.tmpXXXXXX behind, the new
# file was 0644 and names of 245 bytes or more failed.  The links and
# FIFOs of another user in a shared folder: tests/ref/outf_foreign.sh.
# cli: no-valgrind
# source: spec: exit codes and file states only, no number to derive
cd "$TMPDIR_CASE" || exit 1
ulimit -c 0
awk 'BEGIN { print "device,time,voltage_v,current_a,temp_c,soc_pct"
	for (k = 0; k < 2000; k++)
		printf "EB-%02d,%d,%.3f,%.2f,%.1f,%.1f\n", k % 5,
		    1772323200 + 10 * k, 3.6 + (k % 50) / 100,
		    (k % 40 < 20) ? 2.5 : -3, 5 + k % 50, 20 + (k % 60) }' \
    >rows.csv
old="the result of an earlier good run"
for sig in TERM QUIT ALRM; do
	echo "$old" >res.csv
	rm -f in.fifo
	mkfifo in.fifo
	cw-clean -o res.csv in.fifo 2>/dev/null &
	pid=$!
	exec 3>in.fifo
	cat rows.csv >&3
	n=0
	while [ -z "$(ls -a | grep '^\.res\.csv\.tmp')" ] && [ $n -lt 300 ]; do
		sleep 0.1
		n=$((n + 1))
	done
	kill -$sig $pid
	wait $pid 2>/dev/null
	rc=$?
	exec 3>&-
	echo "SIG$sig: exit $rc, old file kept: $(echo "$old" |
	    cmp -s - res.csv && echo yes || echo NO), temporaries left:" \
	    "$(ls -a | grep -c '^\.res\.csv\.tmp')"
done
echo '== ulimit -f 8 (4 KiB in 512-byte blocks, or 8 KiB): SIGXFSZ'
echo "$old" >res.csv
(ulimit -f 8; cw-clean -o res.csv rows.csv)
echo "exit $?, old file kept: $(echo "$old" | cmp -s - res.csv && echo yes ||
    echo NO), temporaries left: $(ls -a | grep -c '^\.res\.csv\.tmp')"
echo '== mode 0600 kept'
chmod 600 res.csv
cw-clean -o res.csv rows.csv 2>/dev/null
echo "exit $?: $(ls -l res.csv | cut -c1-10)"
umask 022
rm -f new.csv
cw-clean -o new.csv rows.csv 2>/dev/null
echo "a new file, umask 022: $(ls -l new.csv | cut -c1-10)"
echo '== one'"'"'s own FIFO: written in place, its reader started after'
rm -f out.fifo
mkfifo out.fifo
cw-clean -o out.fifo rows.csv 2>/dev/null &
wc -l <out.fifo
wait $!
echo "exit $?"
echo '== a 250-byte name'
long=$(printf '%0250d' 0 | tr 0 n)
cw-clean -o "$long" rows.csv 2>/dev/null
echo "exit $?, $(wc -l <"$long") lines, temporaries left: $(ls -a |
    grep -c 'tmp......$')"
