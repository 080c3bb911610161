# -h and --help print the usage on standard output and exit 0.
# source: spec
cw-wear -h
echo "rc $?"
cw-wear -h >"$TMPDIR_CASE/h"
cw-wear --help | cmp - "$TMPDIR_CASE/h" && echo "--help same"
