# Without -d the delimiter comes from each file's header, and a file whose
# delimiter is not a comma reads a point or a comma as the decimal mark.
# By hand: 41,822 V (10 cells: in 15..50 V), -0,121 A, 18,95 F = -7.25 C
# ((18.95 - 32) * 5/9, the definition of the degree Fahrenheit).
# source: hand
cd "$TMPDIR_CASE" || exit 1
printf 'local_time;pack_id;volts;amps;temp_f;soc\n2026-01-12T00:00:02+01:00;EB-0002;41,822;-0,121;18,95;99\n2026-01-12T00:00:12+01:00;EB-0002;41.8;-0.1;19;99\n' >semi.csv
printf 'time\tdevice\tvoltage_v\tcurrent_a\n2026-01-12 00:00:02\tX\t3,7\t1.5\n' >tab.csv
printf 'time|device|voltage_v|current_a\n1768176002|Y|3.6|-2\n' >pipe.csv
cw-clean -v --cells 10 semi.csv
cw-clean -v tab.csv pipe.csv
echo "== -d ',' given: a semicolon file is one column and fails"
cw-clean -d , --cells 10 semi.csv
echo "exit $?"
