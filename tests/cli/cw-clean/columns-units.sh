# -c with every unit of every field.  Expected values worked by hand from
# the unit definitions: 1 V = 1000 mV, 1 A = 1000 mA; K = C + 273.15 (SI
# definition of the Celsius scale); F = C * 9/5 + 32; dK and dC are tenths
# of a kelvin and of a degree Celsius; a SoC fraction 1 is 100 %.
# Epoch 1772323200 s is 2026-03-01T00:00:00Z (Python datetime.fromtimestamp
# (1772323200, timezone.utc); tests/ref/clean_time.sh checks many more).
# source: hand
cd "$TMPDIR_CASE" || exit 1
echo '== mV, mA, dK, frac, epoch ms'
# 2931 dK = 293.1 K = 19.95 C; 0.835 = 83.5 %.
printf 'name,ts,u,i,th,lvl\nP7,1772323200123,3812,-2350,2931,0.835\n' >a.csv
cw-clean -c time=ts:ms,voltage=u:mV,current=i:mA,temp=th:dK,soc=lvl:frac,device=name a.csv
echo '== V, A, dC, pct, epoch us'
# 215 dC = 21.5 C.
printf 'name,ts,u,i,th,lvl\nP7,1772323200123456,3.812,-2.35,215,83.5\n' >b.csv
cw-clean -c time=ts:us,voltage=u:V,current=i:A,temp=th:dC,soc=lvl:pct,device=name b.csv
echo '== F, epoch s with a fraction'
# 68 F = (68 - 32) * 5/9 = 20 C; -40 F = -40 C; 212 F = 100 C.
printf 'name,ts,u,i,th\nP7,1772323200.5,3.812,-2.35,68\nP7,1772323201.5,3.812,-2.35,-40\nP7,1772323202.5,3.812,-2.35,212\n' >c.csv
cw-clean -c time=ts:s,temp=th:F,device=name,voltage=u,current=i c.csv
echo '== K, C, iso with an offset'
# 293.15 K = 20 C; 233.15 K = -40 C.  00:00:00.25+01:00 is 23:00:00.25Z
# the day before.
printf 'name,ts,u,i,th,th2\nP7,2026-03-01T00:00:00.25+01:00,3.812,-2.35,293.15,7\nP7,2026-03-01T00:00:01.25+01:00,3.812,-2.35,233.15,7\n' >d.csv
cw-clean -c time=ts:iso,temp=th:K,device=name,voltage=u,current=i d.csv
cw-clean -c time=ts:iso,temp=th2:C,device=name,voltage=u,current=i d.csv
echo '== unit names are not case sensitive'
cw-clean -c time=ts:MS,voltage=u:mv,current=i:MA,temp=th:dk,soc=lvl:FRAC,device=name a.csv
echo '== an epoch time given as iso is a bad time'
cw-clean --rejects rej.csv -c time=ts:iso,device=name,voltage=u,current=i c.csv
echo "rc=$?"
cat rej.csv
echo '== an unknown unit is a usage error'
cw-clean -c time=ts:hours,device=name,voltage=u,current=i c.csv
