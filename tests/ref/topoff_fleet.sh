#!/bin/sh
# cw-topoff against an invented fleet whose ground truth is known by
# construction, with the comparisons computed independently in Debian's
# Python (numpy, pandas).
#
# A pack model run second by second (coulomb counting, SoC(t) = SoC(0) +
# 100 / C * integral of I dt, the handbook definition of charge) makes:
#   DOCK-*  packs left in a charger: a standby load, a charger that
#           restarts when the true SoC falls below a threshold between 96
#           and 98.5 % and stops at 100 %.  Truth: the number of restarts.
#   FULL-*  packs unplugged as soon as the charger stops.  Truth: none.
#   DEEP-*  ordinary deep cycling 20 <-> 100 % with regenerative pulses
#           during use.  Truth: none.
# Each is logged raw (an instantaneous reading every 10 s) or resampled
# onto a 60 s grid by pandas' resample (mean current over (t - 60, t], the
# SoC at t: the sample stream's convention), with a gauge that rounds to
# whole percent or reports 0.01 % with +-0.2 % noise, current noise
# +-0.02 A.  Thresholds, loads and rates are invented test conditions.
#
# Checked, per device (cw-topoff -s and -e):
#   micro_cycles     = restarts of the model (exact);
#   hours_held       = sum over runs of consecutive samples at >= 95 % of
#                      (last - first), found by pandas (exact);
#   share_at_100     = numpy.trapezoid of the indicator SoC >= 99.5 over
#                      those runs, divided by their time (1e-9);
#   topoff_ah        = the model's charge while the charger was on after
#                      its first stop, within a bound of one row of the
#                      charging current per charger start and stop (a row
#                      straddling one is counted whole or not at all);
#   each depth_pct   = 100 - threshold within the gauge's resolution, the
#                      noise and one row's drift.
set -eu
tmp=$(mktemp -d)
if [ -n "${KEEP:-}" ]; then echo "$tmp" >&2; else trap 'rm -rf "$tmp"' EXIT; fi
/usr/bin/python3 - "$tmp" <<'PY'
import json, sys
import numpy as np
import pandas as pd

tmp = sys.argv[1]
rng = np.random.RandomState(20260202)
T0 = 1770000000
frames, truth = [], {}

def log(name, t, i, soc, raw, integer):
    """Turn a 1 s history into a logged one, with gauge and noise."""
    df = pd.DataFrame({'i': i, 'soc': soc},
                      index=pd.to_datetime(T0 + t, unit='s'))
    if raw:
        out = df.iloc[::10].copy()
    else:
        out = pd.DataFrame({
            'i': df['i'].resample('60s', closed='right',
                                  label='right').mean(),
            'soc': df['soc'].resample('60s', closed='right',
                                      label='right').last()})
        out = out.dropna()
        out.iloc[0, out.columns.get_loc('i')] = 0.0
    n = len(out)
    out['i'] = out['i'] + rng.uniform(-0.02, 0.02, n)
    if integer:
        out['soc'] = np.floor(out['soc'] + 0.5)
    else:
        out['soc'] = np.round(out['soc'] + rng.uniform(-0.2, 0.2, n), 2)
    out['device'] = name
    out['time'] = (out.index.astype('int64') // 10**9)
    frames.append(out)
    return out

caps = {}

def dock(name, raw, integer):
    cap = rng.uniform(1.5, 20.0)
    caps[name] = cap
    load = rng.uniform(0.02, 0.05) * cap
    chg = rng.uniform(0.2, 0.5) * cap
    thr = rng.uniform(96.0, 98.5)
    hours = rng.uniform(8, 16)
    n = int(hours * 3600)
    soc, on, restarts, stopped = 85.0, True, 0, False
    ts = np.arange(n + 3600)
    cur = np.zeros(len(ts)); lvl = np.zeros(len(ts))
    ah_on = 0.0
    for k in range(len(ts)):
        if k == 0:
            i = 0.0
        elif k <= n:
            if not on and soc < thr:
                on, restarts = True, restarts + 1
            i = chg - load if on else -load
            if on and stopped:
                ah_on += i / 3600.0
        else:
            i = -0.5 * cap        # taken out and used
        soc += 100.0 * i / 3600.0 / cap
        if k <= n and on and soc >= 100.0:
            on, stopped = False, True
        cur[k], lvl[k] = i, soc
    out = log(name, ts, cur, lvl, raw, integer)
    dt = 10 if raw else 60
    truth[name] = dict(cycles=restarts, ah=ah_on, drop=100.0 - thr,
                       bound=(2 * restarts + 2) * (chg + 0.02) * dt / 3600,
                       res=(1.0 if integer else 0.4) + 100.0 * load * dt /
                       3600.0 / cap + 0.01)
    return out

def full(name, raw, integer):
    cap = rng.uniform(2.0, 20.0)
    caps[name] = cap
    soc = 40.0
    cur, lvl = [0.0], [soc]
    while soc < 100.0:
        i = cap * (0.5 if soc < 95 else 0.1)
        soc = min(100.0, soc + 100.0 * i / 3600.0 / cap)
        cur.append(i); lvl.append(soc)
    for k in range(int(rng.uniform(0, 600))):
        cur.append(0.0); lvl.append(soc)
    while soc > 50.0:
        i = -cap * rng.uniform(0.2, 1.0)
        soc += 100.0 * i / 3600.0 / cap
        cur.append(i); lvl.append(soc)
    log(name, np.arange(len(cur)), np.array(cur), np.array(lvl), raw,
        integer)
    truth[name] = dict(cycles=0)

def deep(name, raw, integer):
    cap = rng.uniform(5.0, 20.0)
    caps[name] = cap
    soc = 20.0
    cur, lvl = [0.0], [soc]
    for c in range(3):
        while soc < 100.0:
            i = 0.5 * cap
            soc = min(100.0, soc + 100.0 * i / 3600.0 / cap)
            cur.append(i); lvl.append(soc)
        k = 0
        while soc > 20.0:
            # Use at 1 C with a 0.5 C regenerative pulse of 20 s a minute.
            i = 0.5 * cap if k % 60 >= 40 else -1.0 * cap
            soc += 100.0 * i / 3600.0 / cap
            cur.append(i); lvl.append(soc)
            k += 1
    log(name, np.arange(len(cur)), np.array(cur), np.array(lvl), raw,
        integer)
    truth[name] = dict(cycles=0)

k = 0
for raw in (True, False):
    for integer in (True, False):
        for rep in range(2):
            dock('DOCK-%02d' % k, raw, integer)
            k += 1
        full('FULL-%02d' % k, raw, integer)
        deep('DEEP-%02d' % k, raw, integer)
        k += 1

# Hours held and time at the top, from the logged rows, independently.
for f in frames:
    name = f['device'].iloc[0]
    band = (f['soc'] >= 95.0).to_numpy()
    run = np.cumsum(np.r_[True, band[1:] != band[:-1]])
    held = top = 0.0
    for r in np.unique(run[band]):
        sel = (run == r) & band
        t = f['time'].to_numpy()[sel].astype(float)
        ind = (f['soc'].to_numpy()[sel] >= 99.5).astype(float)
        held += t[-1] - t[0]
        top += np.trapezoid(ind, t) if hasattr(np, 'trapezoid') \
            else np.trapz(ind, t)
    truth[name]['hours'] = held / 3600.0
    truth[name]['share'] = top / held if held > 0 else None

allrows = pd.concat(frames).sort_values(['time', 'device'], kind='stable')
allrows['voltage_v'] = ''
allrows['temp_c'] = 20
allrows[['device', 'time', 'voltage_v', 'i', 'temp_c', 'soc']].rename(
    columns={'i': 'current_a', 'soc': 'soc_pct'}).to_csv(
    tmp + '/in.csv', index=False, float_format='%.6g')
json.dump(truth, open(tmp + '/truth.json', 'w'))
with open(tmp + '/fleet.csv', 'w') as f:
    f.write('device,capacity_ah\n')
    for d in sorted(caps):
        f.write('%s,%.6f\n' % (d, caps[d]))
PY
# The standby loads run up to C/20 (1 A on a 20 Ah pack): the standby
# level from the fleet file's capacities, C/10, between them and the use
# at C/2.
opts="--fleet $tmp/fleet.csv --standby-rate 0.1"
cw-topoff -s $opts "$tmp/in.csv" >"$tmp/sum.csv"
cw-topoff -e $opts "$tmp/in.csv" >"$tmp/ev.csv"
/usr/bin/python3 - "$tmp" <<'PY'
import json, sys
import pandas as pd

tmp = sys.argv[1]
truth = json.load(open(tmp + '/truth.json'))
s = pd.read_csv(tmp + '/sum.csv').set_index('device')
e = pd.read_csv(tmp + '/ev.csv')
bad = 0

def check(ok, what):
    global bad
    print('%s %s' % ('ok  ' if ok else 'FAIL', what))
    if not ok:
        bad += 1

assert sorted(s.index) == sorted(truth), 'devices differ'
for d, tr in sorted(truth.items()):
    row = s.loc[d]
    check(row['micro_cycles'] == tr['cycles'],
          '%s micro_cycles %d, truth %d' % (d, row['micro_cycles'],
                                             tr['cycles']))
    check(abs(row['hours_held'] - tr['hours']) <= 1e-6,
          '%s hours_held %.6f, pandas %.6f' % (d, row['hours_held'],
                                                tr['hours']))
    if tr['share'] is not None:
        check(abs(row['share_at_100'] - tr['share']) <= 1e-9,
              '%s share_at_100 %.9f, numpy %.9f' % (d, row['share_at_100'],
                                                     tr['share']))
    if 'ah' in tr:
        err = abs(row['topoff_ah'] - tr['ah'])
        check(err <= tr['bound'], '%s topoff_ah %.5f, model %.5f '
              '(|err| %.5f <= %.5f)' % (d, row['topoff_ah'], tr['ah'],
                                        err, tr['bound']))
        dep = e[e['device'] == d]['depth_pct']
        worst = (dep - tr['drop']).abs().max()
        check(worst <= tr['res'], '%s depths %.3f..%.3f, truth %.3f '
              '(worst %.3f <= %.3f)' % (d, dep.min(), dep.max(),
                                        tr['drop'], worst, tr['res']))
print('%d failed' % bad)
sys.exit(1 if bad else 0)
PY
