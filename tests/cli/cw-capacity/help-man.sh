# --help against cw-capacity(1): the synopsis as the manual renders it,
# every option of OPTIONS in the help and no other, each with the manual's
# default (tests/tools/helpman.sh); -h prints the same as --help;
# --version prints the version.
# source: spec
sh tests/tools/helpman.sh cw-capacity
echo "rc=$?"
cw-capacity -h >"$TMPDIR_CASE/h"
cw-capacity --help | cmp - "$TMPDIR_CASE/h" && echo "-h is --help"
cw-capacity --version | sed 's/[0-9][0-9.]*/VERSION/'
