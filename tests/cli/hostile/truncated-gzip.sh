# A gzip log cut short in the middle of its deflate data, as a device
# that lost power while uploading leaves it.  SPEC.md: exit 1, the
# message names the file, and the rows before the damage are kept (the
# CSV written so far stays whole).  cw-clean, which streams, must have
# written every complete row of the good part.
# source: spec
. tests/cli/hostile/common.inc
cd "$TMPDIR_CASE" || exit 1
{
	echo device,time,voltage_v,current_a,temp_c,soc_pct
	awk 'BEGIN { for (k = 0; k < 3000; k++)
		printf "EB-%02d,%d,%.3f,%.2f,%.1f,%.1f\n", k % 7,
		    1772323200 + 10 * k, 3.6 + (k % 50) / 100,
		    (k % 40 < 20) ? 2.5 : -3, 20 + k % 9, 20 + (k % 60) }'
} | gzip -c -6 >full.csv.gz
size=$(wc -c <full.csv.gz)
head -c $((size / 2)) full.csv.gz >cut.csv.gz
good=$(gzip -dc <cut.csv.gz 2>/dev/null | wc -l)
echo "complete lines before the damage, header included: $good"
run_all cut.csv.gz
# cw-clean again, to count what it kept.
cw-clean cut.csv.gz 2>/dev/null >clean.csv
echo "cw-clean kept $(($(wc -l <clean.csv) - 1)) rows of $((good - 1))"
# A file after the damaged one is not read: the run stops at the error.
run_one cw-rainflow --summary cut.csv.gz full.csv.gz
