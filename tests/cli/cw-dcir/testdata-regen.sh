# testdata/dcir-fleet.csv is what testdata/dcir-fleet.awk writes.
awk -f testdata/dcir-fleet.awk | cmp - testdata/dcir-fleet.csv &&
    echo testdata/dcir-fleet.csv is up to date
