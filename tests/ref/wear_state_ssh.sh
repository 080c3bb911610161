#!/bin/sh
# A multi-host run for real: GNU parallel maps the day files of the
# invented fleet of cw-synth(1) over two ssh logins (cw-node-a and
# cw-node-b, both this machine through an sshd this test starts on
# 127.0.0.1 only), each job cw-clean then cw-wear --state-out, with the
# command of README.md ("More than one machine"); the shuffle is
# sort -t, -k1,1 and the reduce cw-wear --merge.  The reference is the
# definition (cw-wear(1), "Keeping state"): one pass of cw-wear over every
# day, which the merged report must equal (the same text, and every number
# within 1e-9, compared by Debian's Python).  The job log must show jobs
# on both logins.
#
# The sshd is Debian's (openssh-server, in scripts/deps), with its own
# config, a throwaway host key and user key in a temporary folder, a port
# above 20000, password logins off, and it is stopped at the end.  Where
# it cannot run (no openssh-server, the port or the privilege separation
# folder refused) the test says why and exits 77: tests/run counts it as a
# skip, not a pass, and under CI=true as a failure.
set -u
top=$(cd "$(dirname "$0")/../.." && pwd)
PATH="$top/bin:$PATH"
export PATH
tmp=$(mktemp -d)
sshd_pid=
cleanup() {
	if [ -n "$sshd_pid" ]; then
		kill "$sshd_pid" 2>/dev/null
		wait "$sshd_pid" 2>/dev/null
	fi
	rm -rf "$tmp"
}
trap cleanup EXIT
skip() {
	echo "SKIP (not checked): $*"
	exit 77
}
for p in /usr/sbin/sshd ssh ssh-keygen parallel; do
	command -v "$p" >/dev/null 2>&1 ||
	    skip "$p is missing (Debian packages openssh-server, openssh-client, parallel; see scripts/deps)"
done
# sshd started as root needs its privilege separation folder, which the
# Debian service makes at boot; make it (empty, as the service would) if
# it is missing.  It stays: another run of this test at the same time may
# be using it.
if [ "$(id -u)" -eq 0 ] && [ ! -d /run/sshd ]; then
	mkdir -m 755 /run/sshd 2>/dev/null || [ -d /run/sshd ] ||
	    skip "cannot make /run/sshd, which sshd needs when run as root"
fi

user=$(id -un)
ssh-keygen -q -t ed25519 -N '' -C cw-test-host -f "$tmp/host_key" ||
    skip "ssh-keygen failed"
ssh-keygen -q -t ed25519 -N '' -C cw-test-user -f "$tmp/user_key" ||
    skip "ssh-keygen failed"
cp "$tmp/user_key.pub" "$tmp/authorized_keys"
chmod 600 "$tmp/authorized_keys"

port=
try=0
while [ $try -lt 5 ] && [ -z "$port" ]; do
	p=$((20000 + ($$ * 7 + try * 1009) % 40000))
	try=$((try + 1))
	cat >"$tmp/sshd_config" <<EOF
ListenAddress 127.0.0.1
Port $p
HostKey $tmp/host_key
AuthorizedKeysFile $tmp/authorized_keys
AllowUsers $user
PermitRootLogin prohibit-password
PubkeyAuthentication yes
PasswordAuthentication no
KbdInteractiveAuthentication no
UsePAM no
StrictModes no
PidFile $tmp/sshd.pid
LogLevel ERROR
EOF
	/usr/sbin/sshd -t -f "$tmp/sshd_config" 2>"$tmp/sshd.log" ||
	    skip "sshd refuses its config: $(cat "$tmp/sshd.log")"
	/usr/sbin/sshd -D -e -f "$tmp/sshd_config" 2>>"$tmp/sshd.log" &
	sshd_pid=$!
	cat >"$tmp/ssh_config" <<EOF
Host cw-node-a cw-node-b
	HostName 127.0.0.1
	Port $p
	User $user
	IdentityFile $tmp/user_key
	IdentitiesOnly yes
	UserKnownHostsFile $tmp/known_hosts
	GlobalKnownHostsFile /dev/null
	StrictHostKeyChecking yes
	BatchMode yes
	LogLevel ERROR
EOF
	echo "[127.0.0.1]:$p $(cut -d' ' -f1,2 "$tmp/host_key.pub")" \
	    >"$tmp/known_hosts"
	n=0
	while [ $n -lt 50 ]; do
		if ssh -F "$tmp/ssh_config" cw-node-a true 2>/dev/null; then
			port=$p
			break
		fi
		kill -0 "$sshd_pid" 2>/dev/null || break
		sleep 0.1
		n=$((n + 1))
	done
	if [ -z "$port" ]; then
		kill "$sshd_pid" 2>/dev/null
		wait "$sshd_pid" 2>/dev/null
		sshd_pid=
	fi
done
[ -n "$port" ] ||
    skip "sshd did not start on 127.0.0.1: $(tail -n 3 "$tmp/sshd.log")"
echo "sshd on 127.0.0.1:$port (pid $sshd_pid), logins cw-node-a, cw-node-b"

set -e
# The folder the jobs share, as /srv/cellwear in README.md.
home=$tmp/srv
mkdir -p "$home/map"
cd "$home"
cw-synth -n 6 -d 10 -p 60 -s 5 -o inbox
C='-c time=ts_ms:ms,device=dev_id,voltage=pack_mv:mV,current=pack_ma:mA,temp=temp_dk:dK --charge-negative --cells 10'
# One pass over every day, the reference.
for f in inbox/*.csv.gz; do
	cw-clean $C --rejects /dev/null "$f"
done 2>/dev/null | awk 'NR == 1 || $0 !~ /^device,/' | cw-wear >one.csv

# The map on the two logins, one job at a time on each, as README.md has
# it ("More than one machine"), with the test's ssh config and a job log.
# The hosts share this file system, as cluster nodes often share one, so
# the jobs read and write the day files where they are.
ls "$home"/inbox/*.csv.gz |
    parallel --ssh "ssh -F $tmp/ssh_config" --joblog "$tmp/jobs" \
    -S 1/cw-node-a,1/cw-node-b --env PATH --halt now,fail=1 \
    "cw-clean $C --rejects $home/map/{/.}.rejects -o $home/map/{/.} {} && cw-wear --state-out $home/map/{/.}" \
    >map.state && sort -t, -k1,1 map.state | cw-wear --merge >report.csv

awk -F'\t' 'NR > 1 { n[$2]++; if ($7 != 0) bad++ }
    END { for (h in n) print "jobs on " h ": " n[h]; exit bad > 0 }' \
    "$tmp/jobs"
[ "$(awk -F'\t' 'NR > 1 { print $2 }' "$tmp/jobs" | sort -u | wc -l)" -eq 2 ]
[ "$(ls map/*.rejects | wc -l)" -eq 10 ]
echo "rejects written by the jobs: $(cat map/*.rejects | grep -vc '^source,') lines in 10 files"
/usr/bin/python3 - one.csv report.csv <<'PY'
import csv, sys

def load(path):
    with open(path, newline="") as f:
        return {r["device"]: r for r in csv.DictReader(f)}

one, got = load(sys.argv[1]), load(sys.argv[2])
assert sorted(one) == sorted(got)
w = 0.0
for dev, r in one.items():
    for col, a in r.items():
        b = got[dev][col]
        try:
            x, y = float(a), float(b)
        except ValueError:
            assert a == b, (dev, col, a, b)
            continue
        if x != y:
            w = max(w, abs(x - y) / max(abs(x), abs(y)))
print(f"merged from two logins: {len(one)} devices, largest relative "
      f"difference from one pass {w:.3g} (bound 1e-9)")
assert w <= 1e-9
PY
cmp one.csv report.csv && echo "merged from two logins: the same text as one pass"
