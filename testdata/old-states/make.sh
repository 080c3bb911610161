#!/bin/sh
# How the saved states here were made; they are kept as they came out,
# so that every later cellwear is tested on reading them (or refusing
# them with what to do: tests/cli/cw-wear/state-old.sh,
# tests/cli/cw-dcir/state-old.sh).  Run from the top of the tree.
#   cw-wear-state-1.state  cw-wear at commit aa8dc79 (the last before
#                          cw-wear-state-2), its --state FILE over
#                          testdata/wear-fleet.csv
#   cw-wear-state-2.state  cw-wear at commit b71bb96, --state-out over
#                          testdata/wear-fleet.csv
#   cw-dcir-state-1.state  cw-dcir at commit b71bb96, --state-out over
#                          testdata/dcir-fleet.csv
# Remaking one from a later commit is not the point: these are what the
# older tools wrote.
set -e
old=$(mktemp -d)
trap 'rm -rf "$old"' EXIT
git archive aa8dc79 | tar -x -C "$old"
make -C "$old" -s bin/cw-wear
rm -f "$old/s"
"$old/bin/cw-wear" --state "$old/s" testdata/wear-fleet.csv >/dev/null
cp "$old/s" testdata/old-states/cw-wear-state-1.state
rm -rf "$old"/*
git archive b71bb96 | tar -x -C "$old"
make -C "$old" -s bin/cw-wear bin/cw-dcir
"$old/bin/cw-wear" --state-out testdata/wear-fleet.csv \
    >testdata/old-states/cw-wear-state-2.state
"$old/bin/cw-dcir" --state-out testdata/dcir-fleet.csv \
    >testdata/old-states/cw-dcir-state-1.state
