# -h prints the usage to stdout and exits 0; --version prints the version.
# source: spec
cw-dcir -h
echo "rc=$?"
cw-dcir --help | head -n 1
cw-dcir --version | sed 's/[0-9][0-9.]*$/VERSION/'
