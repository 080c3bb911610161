# -v prints what was written; silent without it.
# source: spec
cw-synth -n 2 -d 1 -p 60 -o "$TMPDIR_CASE/q"
echo "quiet rc=$?"
cw-synth -v -n 2 -d 1 -p 60 -o "$TMPDIR_CASE/v"
cw-synth -v -n 2 -d 1 -p 90 -o "$TMPDIR_CASE/w" -F none,late=0.5
