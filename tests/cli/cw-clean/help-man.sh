# --help against cw-clean(1): the synopsis as the manual renders it, every
# option of OPTIONS in the help and no other, each with the manual's
# default (tests/tools/helpman.sh); -h prints the same as --help.
# source: spec
sh tests/tools/helpman.sh cw-clean
echo "rc=$?"
cw-clean -h >"$TMPDIR_CASE/h"
cw-clean --help | cmp - "$TMPDIR_CASE/h" && echo "-h is --help"
