# cw-synth(1) EXAMPLES, every command exactly as the manual renders it,
# run in order in a scratch folder (lines after "$ ", with "\" joining
# continued lines).  What they made is listed and checked below: the
# files of each run, a week being 7 day files per format; the stream
# that the documented cw-clean line makes from format A has the header of
# the sample stream and one row per data line that was not rejected; the
# fault counts (the seed is the default, so they are the same each run).
# source: snapshot: the fault counts of the default seed are whatever its
#   random stream draws (tests/ref/synth_faults.sh finds the faults in the
#   files and checks them against the truth files); the file lists and the
#   balance rows + rejects = lines are the manual's, checked here
top=$(pwd)
mandoc -Tutf8 man/cw-synth.1 | col -b |
    sed -n '/^EXAMPLES/,/^SEE ALSO/p' |
    awk '/^[ \t]*\$ / { sub(/^[ \t]*\$ /, ""); cmd = $0; cont = /\\$/
	    if (!cont) print cmd
	    next }
	cont { sub(/^[ \t]*/, ""); cmd = cmd "\n" $0; cont = /\\$/
	    if (!cont) print cmd }' >"$TMPDIR_CASE/ex.sh"
cat "$TMPDIR_CASE/ex.sh"
echo "--"
cd "$TMPDIR_CASE" && sh -e ex.sh && echo "examples: rc=0"
for d in fleet raw summer bench; do
	printf '%s: %s\n' "$d" "$(ls "$d" | tr '\n' ' ')"
done
ls fleet/*.a.csv.gz | wc -l | sed 's/^/fleet a files: /'
ls fleet/*.b.csv.gz | wc -l | sed 's/^/fleet b files: /'
head -n 1 raw/stream.csv
rows=$(($(wc -l <raw/stream.csv) - 1))
rej=$(($(wc -l <raw/rejects.csv) - 1))
lines=$(awk -F, 'NR > 1 { s += $32 } END { print s }' raw/truth-devices.csv)
echo "stream rows $rows + rejects $rej = lines $lines: $((rows + rej == lines))"
awk -F, 'NR > 1 { s += $31 } END { print "bench rows sampled", s }' \
    bench/truth-devices.csv
