# -h/--help prints the usage to stdout and exits 0; --version the version.
# source: spec
cw-rainflow -h
echo "rc=$?"
cw-rainflow --version
echo "rc=$?"
