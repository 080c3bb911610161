# --version prints the program, the suite and its version, exits 0.
cw-clean --version
