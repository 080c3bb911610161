# -h and --help print the same usage on stdout and exit 0; --version
# prints the program's name and version (the number masked here).
# source: spec
cw-synth -h
echo "rc=$?"
cw-synth -h >"$TMPDIR_CASE/h"
cw-synth --help | cmp - "$TMPDIR_CASE/h" && echo "--help: the same"
cw-synth --version | sed 's/ [0-9][0-9.]*$/ VERSION/'
