# cw-dcir --state onto a disk that fills, and under a file size limit
# (tests/tools/fullstate.sh says how): exit 1 with a message that names
# the state and the error, the old state left byte for byte, no temporary
# left.
# source: spec
sh tests/tools/fullstate.sh cw-dcir
