#!/bin/sh
# helpman.sh TOOL: check that `TOOL --help` agrees with man/TOOL.1.
#   1. The synopsis: the usage lines up to the first blank line, without
#      "usage:", equal the SYNOPSIS that mandoc renders, once blanks are
#      removed and letters folded to lower case (mandoc writes FILE as
#      "file").
#   2. The options: every long option of the OPTIONS list (.It Fl \-name)
#      has a line in the help, and every option line of the help is in the
#      OPTIONS list.
#   3. The defaults: for each option, the value after "default" in its
#      OPTIONS item ("Default 1.", "default 0.95.", ".Cm half (the
#      default, ...)") equals the one after "default" in its help lines,
#      or neither has one.
# Prints one line per option ("--name: default V" or "--name: no
# default"), then a line for each disagreement; exits 1 if there is one.
# Run from the top of the tree with the tool on PATH.
tool=$1
man=man/$tool.1
[ -f "$man" ] || { echo "helpman: no $man" >&2; exit 2; }
tmp=${TMPDIR_CASE:-/tmp}/helpman.$$
trap 'rm -f "$tmp".*' EXIT
"$tool" --help >"$tmp.help" || { echo "$tool --help failed"; exit 1; }
bad=0

# 1. Synopsis.
sed -n '1,/^$/p' "$tmp.help" | sed 's/^usage://' | tr -d ' \t\n' |
    tr 'A-Z' 'a-z' >"$tmp.syn1"
mandoc -Tascii -Owidth=1000 "$man" | col -b |
    sed -n '/^SYNOPSIS/,/^[A-Z]/p' | sed '1d;$d' | tr -d ' \t\n' |
    tr 'A-Z' 'a-z' >"$tmp.syn2"
if cmp -s "$tmp.syn1" "$tmp.syn2"; then
	echo "synopsis: as in $man"
else
	echo "synopsis differs from $man:"
	echo "  help: $(cat "$tmp.syn1")"
	echo "  man:  $(cat "$tmp.syn2")"
	bad=1
fi

# 2 and 3.  NAME<TAB>DEFAULT (or NAME<TAB>-) from each side.
norm='
function dflt(text,   v) {
	# "default V", "Default V" or "V (the default".
	v = ""
	gsub(/[ \t]+/, " ", text)
	if (match(text, /[Dd]efault [^ ]+/))
		v = substr(text, RSTART + 8, RLENGTH - 8)
	else if (match(text, /[^ ]+ \(the default/))
		v = substr(text, RSTART, RLENGTH - 13)
	sub(/[.,;:)]+$/, "", v)
	return v == "" ? "-" : v
}
'
awk "$norm"'
/^\.Sh OPTIONS/ { on = 1; next }
/^\.Sh / { on = 0 }
!on { next }
/^\.Bl/ { depth++; next }
/^\.El/ {
	if (--depth == 0 && name != "")
		print name "\t" dflt(text)
	if (depth == 0)
		name = ""
	next
}
depth == 1 && /^\.It / {
	if (name != "")
		print name "\t" dflt(text)
	line = $0
	name = ""
	if (match(line, /Fl \\-[a-z\\-]+/)) {
		name = substr(line, RSTART + 4, RLENGTH - 4)
		gsub(/\\/, "", name)
		name = "-" name
	}
	text = ""
	next
}
name != "" {
	line = $0
	gsub(/\\-/, "-", line)
	gsub(/\\~/, " ", line)
	if (line ~ /^\./) {
		# A macro line: drop the macro and lone punctuation.
		sub(/^\.[A-Za-z]+ */, "", line)
		gsub(/(^| )[.,:;()|]( |$)/, " ", line)
	}
	text = text " " line
}
' "$man" | sort >"$tmp.man"
awk "$norm"'
function out() { if (name != "") print name "\t" dflt(text); name = "" }
/^  -[A-Za-z], --[a-z-]+/ || /^      --[a-z-]+/ {
	out()
	match($0, /--[a-z-]+/)
	name = substr($0, RSTART, RLENGTH)
	text = substr($0, RSTART + RLENGTH)
	next
}
/^       +[^ ]/ && name != "" { text = text " " $0; next }
{ out() }
END { out() }
' "$tmp.help" | sort >"$tmp.hlp"

join -t '	' -a 1 -a 2 -e '?' -o 0,1.2,2.2 "$tmp.man" "$tmp.hlp" |
    while IFS='	' read -r name m h; do
	if [ "$m" = "?" ]; then
		echo "$name: in the help, not in $man"
	elif [ "$h" = "?" ]; then
		echo "$name: in $man, not in the help"
	elif [ "$m" != "$h" ]; then
		echo "$name: default $m in $man, $h in the help"
	elif [ "$m" = "-" ]; then
		echo "$name: no default"
		continue
	else
		echo "$name: default $m"
		continue
	fi
	echo x >>"$tmp.bad"
done
[ -f "$tmp.bad" ] && bad=1
[ $bad -eq 0 ] && echo "$tool: --help agrees with $man"
exit $bad
