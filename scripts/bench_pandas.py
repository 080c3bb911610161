#!/usr/bin/python3
"""The cleaning cw-clean --step 60 does, written the way a practitioner
would in pandas, for the benchmark (scripts/bench.sh).  Reads cw-synth's
format a (epoch ms, mV, mA charging negative, 0.1 K), converts units and
sign, drops duplicates and implausible rows, sorts, and resamples each
device onto a 60 s grid: mean current over each interval, voltage,
temperature and SoC interpolated in time.  Writes the sample stream.

usage: bench_pandas.py OUT.csv FILE.csv.gz...
"""
import sys

import numpy as np
import pandas as pd


def main():
    out, files = sys.argv[1], sys.argv[2:]
    df = pd.concat((pd.read_csv(f, on_bad_lines="skip") for f in files),
                   ignore_index=True)
    df = df[df["ts_ms"] != "ts_ms"] if df["ts_ms"].dtype == object else df
    for c in ("ts_ms", "pack_mv", "pack_ma", "temp_dk", "soc_pct"):
        df[c] = pd.to_numeric(df[c], errors="coerce")
    df = df.dropna(subset=["ts_ms", "pack_mv", "pack_ma", "dev_id"])
    df = pd.DataFrame({
        "device": df["dev_id"],
        "time": pd.to_datetime(df["ts_ms"], unit="ms", utc=True),
        "voltage_v": df["pack_mv"] / 1000.0,
        "current_a": -df["pack_ma"] / 1000.0,
        "temp_c": df["temp_dk"] / 10.0 - 273.15,
        "soc_pct": df["soc_pct"],
    })
    df = df[(df.voltage_v >= 15) & (df.voltage_v <= 50) &
            (df.temp_c >= -40) & (df.temp_c <= 100) &
            (df.soc_pct.isna() | ((df.soc_pct >= 0) & (df.soc_pct <= 100)))]
    df = df.drop_duplicates(subset=["device", "time"])
    df = df.sort_values(["device", "time"])
    parts = []
    for dev, g in df.groupby("device", sort=True):
        g = g.set_index("time")
        cur = g["current_a"].resample("60s", label="right",
                                      closed="right").mean()
        grid = cur.index
        t = g.index.asi8.astype(np.float64)
        tg = grid.asi8.astype(np.float64)
        r = pd.DataFrame({"current_a": cur.values}, index=grid)
        for c in ("voltage_v", "temp_c", "soc_pct"):
            r[c] = np.interp(tg, t, g[c].to_numpy(dtype=np.float64))
        r.insert(0, "device", dev)
        parts.append(r)
    res = pd.concat(parts)
    res.index.name = "time"
    res = res.reset_index()[["device", "time", "voltage_v", "current_a",
                             "temp_c", "soc_pct"]]
    res["time"] = res["time"].dt.strftime("%Y-%m-%dT%H:%M:%SZ")
    res.to_csv(out, index=False, float_format="%.10g")


if __name__ == "__main__":
    main()
