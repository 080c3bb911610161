# --version prints the program, the suite and its version, exits 0.
# source: spec
cw-clean --version
