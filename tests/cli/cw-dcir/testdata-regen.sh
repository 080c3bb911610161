# testdata/dcir-fleet.csv is what testdata/dcir-fleet.awk writes.
# source: spec (the test data equal what their generator writes; no number to
#   derive)
awk -f testdata/dcir-fleet.awk | cmp - testdata/dcir-fleet.csv &&
    echo testdata/dcir-fleet.csv is up to date
