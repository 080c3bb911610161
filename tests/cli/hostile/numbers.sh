# Numbers a gauge or a spreadsheet can spell that are not plain decimal:
# nan, inf, hex, overflow, underflow, locale forms (decimal comma, digit
# groups, a Unicode minus), signs alone, trailing units.  None may be read
# as a value: the stream tools count them as not a number (-v) and go on;
# cw-clean rejects each such row as bad-number (rejects file shown).
# Underflow (1e-400) is 0, a valid number (out of range for a voltage).
# source: spec
. tests/cli/hostile/common.inc
cd "$TMPDIR_CASE" || exit 1
{
	echo device,time,voltage_v,current_a,temp_c,soc_pct
	t=1772323200
	for v in 3.7 nan NaN -nan inf -Infinity 0x1p2 0x10 1e999 -1e999 \
	    1e-400 '"3,7"' 3.7.1 '"1 234"' "$(printf '\342\210\222')1" + . \
	    - 1e e5 3.7V ' ' 4,2e1; do
		t=$((t + 10))
		echo "A,$t,$v,1,20,50"
	done
	echo "A,$((t + 10)),3.8,-2,21,40"
} >numbers.csv
run_all -v numbers.csv
cw-clean --rejects rej.csv numbers.csv >/dev/null 2>&1
echo "cw-clean rejects:"
cat rej.csv
# With --decimal-comma and ';', "3,7" is 3.7 and "3.7" is not a number.
printf 'device;time;voltage_v;current_a\nA;1772323200;3,7;1\nA;1772323210;3.7;1\nA;1772323220;1.234,5;1\n' >semi.csv
run_one cw-clean -v -d ';' --decimal-comma --bounds voltage=0:2000 semi.csv
cat out.csv
