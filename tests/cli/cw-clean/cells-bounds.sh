# --cells scales the default voltage bounds (1.5..5.0 V per cell) and
# --bounds overrides any bound, in canonical units after conversion; a
# temperature bound takes a unit suffix.  Bounds are inclusive.
# source: hand (the default bounds of cw-clean(1), 1.5..5.0 V per cell,
#   applied row by row; 14 F = -10 C, 140 F = 60 C by C = (F - 32) * 5/9;
#   263.15 K = -10 C, 333.15 K = 60 C by K = C + 273.15)
cd "$TMPDIR_CASE" || exit 1
# One pack, rows at 1 s; the voltage column (V) is the 5th field.
printf 'device,time,voltage_v,current_a,temp_c,soc_pct\n' >a.csv
n=0
for r in 3.7,1,20,50 1.5,1,20,50 5.0,1,20,50 1.49,1,20,50 5.01,1,20,50 \
    15,1,20,50 50,1,20,50 51,1,20,50 3.7,1,-40,50 3.7,1,100,50 \
    3.7,1,-40.5,50 3.7,1,100.5,50 3.7,1,20,0 3.7,1,20,100 3.7,1,20,-0.1 \
    3.7,1,20,100.1 3.7,1000,20,50 3.7,-1000.5,20,50; do
	echo "P,$n,$r" >>a.csv
	n=$((n + 1))
done
show() {
	cw-clean -v --max-reject 1 --rejects rej.csv "$@" a.csv |
	    sed 1d | cut -d, -f2,3,4,5,6 | tr '\n' ' '
	echo
	sed 1d rej.csv | cut -d, -f2,3 | tr '\n' ' '
	echo
}
echo '== defaults: voltage 1.5..5, current +-1000, temp -40..100, soc 0..100'
show
echo '== --cells 10: voltage 15..50'
show --cells 10
echo '== --bounds voltage=3:4 wins over --cells'
show --cells 10 --bounds voltage=3:4
echo '== --bounds temp=14F:140F is -10..60 C; soc=10:90; current=-2:2'
show --bounds temp=14F:140F --bounds soc=10:90 --bounds current=-2:2
echo '== --bounds temp in K: 263.15K:333.15K is -10..60 C'
show --bounds temp=263.15K:333.15K
echo '== usage errors'
cw-clean --bounds volt=1:2 a.csv
echo "rc=$?"
cw-clean --bounds temp=60:10 a.csv
echo "rc=$?"
cw-clean --bounds soc=a:b a.csv
echo "rc=$?"
cw-clean --cells 2.5 a.csv
echo "rc=$?"
cw-clean --cells 0 a.csv
