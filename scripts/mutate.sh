#!/bin/sh
# make mutate: apply each mutation of tests/mutate/list alone to a copy of
# the tree and run the fast part of make check against it, stopping at
# the first check that fails.  Prints a table (mutation, what caught it)
# and exits 1 when a mutation survives or no longer applies.
set -u
top=$(cd "$(dirname "$0")/.." && pwd)
list=$top/tests/mutate/list
tmp=$(mktemp -d) || exit 2
trap 'rm -rf "$tmp"' EXIT INT TERM
cd "$top" || exit 2
git ls-files -z | xargs -0 tar -cf - | tar -xf - -C "$tmp" || exit 2
cd "$tmp" || exit 2
PATH="$tmp/bin:$PATH"
LC_ALL=C
export PATH LC_ALL
make -s tests >build.log 2>&1 || { cat build.log; exit 2; }

# caught: the name of the first check that fails, or nothing.
caught() {
	make -s tests >build.log 2>&1 || { echo "the build"; return; }
	for t in build/tests/test_*; do
		"$t" >/dev/null 2>&1 || { echo "$t"; return; }
	done
	for d in tests/fuzz/regress/fuzz_*; do
		[ -d "$d" ] || continue
		r=build/tests/replay_${d##*/fuzz_}
		for i in "$d"/*; do
			"$r" "$i" >/dev/null 2>&1 || { echo "$r $i"; return; }
		done
	done
	f=$(tests/cli/run 2>/dev/null | sed -n 's/^FAIL //p' | head -n 3 |
	    tr '\n' ' ')
	[ -n "$f" ] && { echo "$f"; return; }
	for t in tests/ref/*.sh; do
		case $t in *slurm*|*ssh*) continue ;; esac
		sh "$t" >/dev/null 2>&1 || { echo "$t"; return; }
	done
}

n=0 bad=0
printf '| mutation | caught by |\n| --- | --- |\n'
tab=$(printf '\t')
while IFS="$tab" read -r file sub what; do
	case $file in ''|'#'*) continue ;; esac
	n=$((n + 1))
	cp "$file" "$tmp/orig" || exit 2
	perl -0pi -e "$sub" "$file"
	if cmp -s "$file" "$tmp/orig"; then
		printf '| %s (%s) | STALE: the substitution changes nothing |\n' \
		    "$what" "$file"
		bad=$((bad + 1))
		continue
	fi
	c=$(caught)
	cp "$tmp/orig" "$file"
	touch "$file"
	if [ -z "$c" ]; then
		printf '| %s (%s) | SURVIVED |\n' "$what" "$file"
		bad=$((bad + 1))
	else
		printf '| %s (%s) | %s |\n' "$what" "$file" "$c"
	fi
done <"$list"
echo "$n mutations, $bad survived or stale"
[ "$bad" -eq 0 ]
