# A plain file's last line without a line end (issue 25, item 7): a log
# still being appended to ends in "...,9" of a coming "99".  By default the
# line is taken with a warning naming the file and line; with --growing it
# is held back (not read) and counted by -v.  A gzip file and a blank tail
# give no warning.  On main before the fix the row was taken silently as
# SoC 9 %.
# source: hand: 2 complete rows and a cut third row; the expected SoC of
# each row is the text written below.
cd "$TMPDIR_CASE" || exit 1
printf 'device,time,voltage_v,current_a,soc_pct\nEB-1,1772323200,3.8,1,97\nEB-1,1772323260,3.8,1,98\nEB-1,1772323320,3.8,1,9' >live.csv
echo '== default: 3 rows, the last with a warning'
cw-clean live.csv
echo "rc $?"
echo '== --growing: 2 rows, one line held'
cw-clean -v --growing live.csv
echo "rc $?"
echo '== --growing on a file that ends its last line: all 3 rows'
printf '9\n' >>live.csv
cw-clean --growing live.csv | tail -n 1
echo '== a gzip member without a last line end: taken, no warning'
printf 'device,time,voltage_v,current_a,soc_pct\nEB-1,1772323200,3.8,1,97' |
    gzip >z.csv.gz
cw-clean z.csv.gz
echo '== blanks after the last line end are no line'
printf 'device,time,voltage_v,current_a,soc_pct\nEB-1,1772323200,3.8,1,97\n\r' >b.csv
cw-clean b.csv
