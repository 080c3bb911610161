# testdata/capacity-fleet.csv is what testdata/capacity-fleet.py writes.
# source: snapshot: the generator's output pinned byte for byte
cd "$TMPDIR_CASE" || exit 2
top=$OLDPWD
cp "$top/testdata/capacity-fleet.py" .
/usr/bin/python3 capacity-fleet.py
cmp capacity-fleet.csv "$top/testdata/capacity-fleet.csv" &&
    echo testdata/capacity-fleet.csv is up to date
