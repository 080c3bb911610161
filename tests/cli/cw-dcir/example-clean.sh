# cw-dcir(1) EXAMPLES: through gzip and cw-clean at the log's own rate.
# The log is already clean, so the trend must equal that of the file.
# source: snapshot: the trend is that of example-trend.sh (worked by hand
#   there); what this case adds is that gzip and cw-clean leave it byte for
#   byte the same
gzip -c testdata/dcir-fleet.csv |
    cw-clean --bounds voltage=1.5:70 | cw-dcir -t
cw-dcir -t testdata/dcir-fleet.csv >"$TMPDIR_CASE/direct.csv"
gzip -c testdata/dcir-fleet.csv |
    cw-clean --bounds voltage=1.5:70 | cw-dcir -t |
    cmp - "$TMPDIR_CASE/direct.csv" && echo same as the file read directly
