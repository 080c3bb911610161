#!/usr/bin/python3
# Writes testdata/wear-fleet.csv: an invented fleet of five packs over two
# days, a row every 15 minutes, each pack built to be worn mostly by one
# stressor (the dominant column of cw-wear(1)).  Run from the top of the
# tree: /usr/bin/python3 testdata/wear-fleet.py > testdata/wear-fleet.csv
#   CART-11   deep cycling at room temperature (15..95 %, twice a day)
#   TERM-22   held at full on a charger, with top-off micro-cycles
#   TOOL-33   resting half full in a hot van (about 40 C)
#   EB-0044   e-bike charged in a cold shed (about 4 C)
#   SPARE-55  a spare stored at 40 % and 15 C
import datetime, math

T0 = datetime.datetime(2026, 3, 2, tzinfo=datetime.timezone.utc)
STEP = 15  # minutes
N = 2 * 24 * 60 // STEP + 1

def iso(k):
    t = T0 + datetime.timedelta(minutes=STEP * k)
    return t.strftime("%Y-%m-%dT%H:%M:%SZ")

def cart(k):        # 96 rows a day: discharge 4 h, charge 2 h, rest 6 h
    p = k % 48
    if p < 16: soc = 95 - 80 * p / 16
    elif p < 24: soc = 15 + 80 * (p - 16) / 8
    else: soc = 95
    temp = 24 + 1.5 * math.sin(k / 9)
    return soc, temp, 40.0
def term(k):        # on the charger 16 h, in use 8 h, every day
    p = k % 96
    if p < 32: soc = 100 - 30 * p / 32
    elif p < 40: soc = 70 + 30 * (p - 32) / 8
    elif p < 94: soc = (100, 99.5, 99, 98.5, 100, 100)[(p - 40) % 6]
    else: soc = 100     # 9 whole top-offs a day, none cut short
    return soc, 24 + math.sin(k / 7), 3.2
def tool(k):
    soc = 60 - 2 * math.sin(k / 11)
    return soc, 40 + 3 * math.sin(2 * math.pi * k / 96), 5.0
def bike(k):        # ride 3 h down to 25 %, charge 4 h in the shed
    p = k % 96
    if p < 12: soc = 85 - 60 * p / 12
    elif p < 28: soc = 25 + 60 * (p - 12) / 16
    else: soc = 85
    temp = 4 + 2 * math.sin(k / 13) if p >= 12 else 12
    return soc, temp, 14.0
def spare(k):
    return 40 - 0.002 * k, 15 + 0.5 * math.sin(k / 17), 2.5

packs = (("CART-11", cart, 13), ("TERM-22", term, 1), ("TOOL-33", tool, 5),
         ("EB-0044", bike, 10), ("SPARE-55", spare, 4))
print("device,time,voltage_v,current_a,temp_c,soc_pct")
prev = {}
for k in range(N):
    for name, f, cells in packs:
        soc, temp, cap = f(k)
        # Current from the SoC change over the interval ending here.
        ds = soc - prev.get(name, soc)
        prev[name] = soc
        cur = ds / 100 * cap / (STEP / 60)
        volt = cells * (3.3 + 0.9 * soc / 100)
        print("%s,%s,%.3f,%.3f,%.1f,%.1f" % (name, iso(k), volt, cur, temp, soc))
