# --reorder: a row late by up to the window (measured from the latest time
# seen for its device) is put back in order; a row later than that is
# rejected as out-of-order, even when it could still be slotted in.
# Devices have windows of their own.
# source: spec
cd "$TMPDIR_CASE" || exit 1
# A: 150 arrives after 200, 50 s late: put back.  130 arrives after 200
# too, 70 s late: rejected, though nothing after 110 has left the window
# yet.  300 then releases everything up to 240.  B is not held up by A.
printf 'device,time,voltage_v,current_a\nA,100,3.8,1\nA,110,3.8,1\nB,100,3.9,2\nA,200,3.8,1\nA,150,3.8,1\nA,130,3.8,1\nB,90,3.9,2\nA,300,3.8,1\nA,260,3.8,1\nA,239,3.8,1\n' >a.csv
echo '== default window 60 s'
cw-clean -v --max-reject 1 --rejects rej.csv a.csv | cut -d, -f1,2
cat rej.csv
echo '== 0: every row older than the latest is out of order'
cw-clean -v --max-reject 1 --rejects rej.csv --reorder 0 a.csv | cut -d, -f1,2
cat rej.csv
echo '== 2m: 150 and 130 put back; the window at the end (300 - 120 s) takes 239'
cw-clean -v --max-reject 1 --rejects rej.csv --reorder 2m a.csv | cut -d, -f1,2
cat rej.csv
echo '== a row exactly at the window edge is still put back (late by 60 s)'
printf 'device,time,voltage_v,current_a\nA,100,3.8,1\nA,160,3.8,1\nA,100.5,3.8,1\nA,99.999,3.8,1\n' >b.csv
cw-clean -v --max-reject 1 --rejects rej.csv b.csv | cut -d, -f1,2
cat rej.csv
cw-clean --reorder 1x a.csv
