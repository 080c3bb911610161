# Usage errors exit 2 with a hint; -h and --version exit 0.
# source: spec
cw-topoff -h; echo "rc=$?"
cw-topoff --version >/dev/null; echo "rc=$?"
cw-topoff --full abc </dev/null; echo "rc=$?"
cw-topoff --full 101 </dev/null; echo "rc=$?"
cw-topoff --min-depth 0 </dev/null; echo "rc=$?"
cw-topoff --min-current -1 </dev/null; echo "rc=$?"
cw-topoff --max-gap 5x </dev/null; echo "rc=$?"
cw-topoff --full-voltage 0 </dev/null; echo "rc=$?"
cw-topoff -e -s </dev/null; echo "rc=$?"
cw-topoff --bogus </dev/null; echo "rc=$?"
cw-topoff -x </dev/null; echo "rc=$?"
cw-topoff --full </dev/null; echo "rc=$?"
