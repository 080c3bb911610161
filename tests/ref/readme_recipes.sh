#!/bin/sh
# The recipes of README.md's "Running it every night" and "More than one
# machine", run as they are written there (with /srv/cellwear moved to a
# scratch folder), on the invented fleet the README names: nightly.sh and
# its crontab command for three nights, a day fed again, a day without
# logs and a held lock, against the log and the exit codes the README
# shows; then every "$ " command of the second section (GNU parallel over
# cores, the Hadoop Streaming mapper and reducer with the shuffle
# simulated by sort), against the output the README shows after it.  The
# reference for the numbers themselves is one pass (each recipe compares
# its report with the nightly one with cmp).  The --sshlogin command is
# run by tests/ref/wear_state_ssh.sh; the Hadoop submission cannot run
# here (no cluster).
set -eu
top=$(cd "$(dirname "$0")/../.." && pwd)
PATH="$top/bin:$PATH"
export PATH
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
home=$tmp/srv
mkdir -p "$home"

/usr/bin/python3 - "$top/README.md" "$tmp" <<'PY'
import os, re, sys

readme, tmp = sys.argv[1], sys.argv[2]
text = open(readme).read()

def section(name):
    m = re.search(r"^## " + re.escape(name) + r"\n(.*?)(?=^## )", text,
                  re.S | re.M)
    assert m, name
    return m.group(1)

def blocks(sec):
    """Runs of lines indented by four spaces, without the indent."""
    out, cur = [], []
    for line in sec.split("\n"):
        if line.startswith("    "):
            cur.append(line[4:])
        else:
            if cur:
                out.append(cur)
            cur = []
    if cur:
        out.append(cur)
    return out

def put(name, lines):
    with open(os.path.join(tmp, name), "w") as f:
        f.write("\n".join(lines) + "\n")

night = blocks(section("Running it every night"))
script = [b for b in night if b[0] == "#!/bin/sh"]
cron = [b for b in night if any("flock" in l for l in b)]
log = [b for b in night if any(l.startswith("nightly: ") for l in b)]
assert len(script) == 1 and len(cron) == 1 and len(log) == 1
put("nightly.sh", script[0])
line = [l for l in cron[0] if "flock" in l][0]
put("cron-command", [" ".join(line.split()[5:])])
put("log-want", log[0])
gen = re.search(r"`(cw-synth [^`]*)`", section("Running it every night"))
assert gen, "the README names the cw-synth run of its example"
put("synth", [gen.group(1)])

more = blocks(section("More than one machine"))
for b in more:
    if b[0] == "#!/bin/sh":
        put(b[1].split(":")[0].lstrip("# "), b)
# The "$ " commands, their continuation lines, the output after each.
cmds = []
for b in more:
    if not b[0].startswith("$ "):
        continue
    for l in b:
        if l.startswith("$ "):
            cmds.append([[l[2:]], []])
        elif l.startswith("      ") and cmds[-1][0][-1].rstrip()[-1:] in \
                ("\\", "|"):
            cmds[-1][0].append(l)
        else:
            cmds[-1][1].append(l)
run = [c for c in cmds if not any("cw-node-a" in l for l in c[0])]
assert len(run) >= 5, len(run)
with open(os.path.join(tmp, "more.sh"), "w") as f:
    for k, (cmd, _) in enumerate(run):
        f.write("\n".join(cmd) + "\n" + f"echo '@@ {k}'\n")
with open(os.path.join(tmp, "more-want"), "w") as f:
    for k, (_, want) in enumerate(run):
        f.write("".join(w + "\n" for w in want) + f"@@ {k}\n")
print(f"README: nightly.sh, its crontab command, {len(log[0])} log lines, "
      f"{len(run)} commands of 'More than one machine'")
PY

sub() {
	sed "s|/srv/cellwear|$home|g" "$@"
}
# The counts depend on cw-synth's and cw-clean's details, which move on;
# the lines, their order and their form must be as the README shows.
mask() {
	sed -E "s|$home|/srv/cellwear|g; s/[0-9]+ (rows|rejected)/N \1/g" "$@"
}
# The fleet the README's example is of.
sh -c "$(sub "$tmp/synth")"
ls "$home/inbox" | grep -c 'csv.gz$'
sub "$tmp/nightly.sh" >"$home/nightly.sh"
chmod +x "$home/nightly.sh"
cron=$(sub "$tmp/cron-command")
echo "crontab command: $(cat "$tmp/cron-command")"

# The nights, the day again, the day without logs, the lock held.
night() {	# night DAY: the crontab command, with DAY given
	set +e
	sh -c "$(echo "$cron" | sed "s|nightly.sh|nightly.sh $1|")"
	echo "rc $?" >>"$tmp/rcs"
	set -e
}
for d in 2026-01-12 2026-01-13 2026-01-14 2026-01-14 2026-01-15; do
	night $d
done
flock "$home/.lock" sleep 3 &
holder=$!
sleep 0.5
night 2026-01-14
wait $holder
mask "$tmp/log-want" >"$tmp/log-masked"
printf 'rc 0\nrc 0\nrc 0\nrc 0\nrc 1\nrc 75\n' | cmp - "$tmp/rcs"
echo "exit codes as README.md says: $(tr '\n' ' ' <"$tmp/rcs")"
mask "$home/nightly.log" | cmp - "$tmp/log-masked" || {
	diff "$tmp/log-masked" "$home/nightly.log"
	exit 1
}
echo "nightly.log as README.md shows it (the counts aside):"
sed "s|$home|/srv/cellwear|g" "$home/nightly.log"
cw-wear "$home"/clean/*.csv | cmp - "$home/reports/2026-01-14.csv"
echo "the last night's report: that of one pass over the cleaned days"
ls "$home/rejects"

# More than one machine, command by command.
cp "$tmp/mapper.sh" "$tmp/reducer.sh" "$home/"
(cd "$home" && sub "$tmp/more.sh" | sh) >"$tmp/more-got"
diff "$tmp/more-want" "$tmp/more-got"
echo "'More than one machine': every command's output as README.md shows it"
