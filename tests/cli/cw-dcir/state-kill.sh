# cw-dcir --state killed with SIGKILL at 50 random points of its write of a
# state (tests/tools/killstate.sh says how): the state is always the one
# before or the one after, whole and readable, never a mix; a killed run
# leaves at most its own temporary, which the next run removes.
# source: spec
# cli: no-valgrind
PATH=$(pwd)/bin:$PATH sh tests/tools/killstate.sh cw-dcir 200 50
