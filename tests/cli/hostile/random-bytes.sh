# 64 KiB of random bytes (a fixed seed), plain and behind a valid header:
# no tool may crash or hang; each reports what it cannot use with
# FILE:LINE and exits 1 (no usable header) or 0 (rows skipped, counted).
# source: spec (exit codes and messages for 64 KiB of noise: 1 without a
#   usable header, 0 with one)
. tests/cli/hostile/common.inc
cd "$TMPDIR_CASE" || exit 1
$PY -c '
import random, sys
r = random.Random(20260301)
sys.stdout.buffer.write(r.getrandbits(8 * 65536).to_bytes(65536, "little"))
' >noise.bin
{ echo device,time,voltage_v,current_a,temp_c,soc_pct; cat noise.bin; } \
    >header-noise.csv
run_all noise.bin
run_all -v header-noise.csv
