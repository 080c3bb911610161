# An output folder that cannot be made, or is a file, is a data/I/O
# error: exit 1 with a message, no file left behind.
# source: spec
: >"$TMPDIR_CASE/file"
cw-synth -n 1 -d 1 -o "$TMPDIR_CASE/file" 2>&1 | sed "s|$TMPDIR_CASE|TMP|"
cw-synth -n 1 -d 1 -o "$TMPDIR_CASE/file" 2>/dev/null; echo "rc=$?"
cw-synth -n 1 -d 1 -o "$TMPDIR_CASE/no/such/dir" 2>&1 |
    sed "s|$TMPDIR_CASE|TMP|"
cw-synth -n 1 -d 1 -o "$TMPDIR_CASE/no/such/dir" 2>/dev/null; echo "rc=$?"
ls -A "$TMPDIR_CASE"
