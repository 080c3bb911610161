# cw-topoff(1) EXAMPLES: a band from 90 %, counting drops of 2 % or more
# only.  TERM-31's drops are 3 % (100 -> 97): still 18; its hold now
# starts at its first row at 90 % or more (17:05, 91 %) and ends at the
# last (07:25, 90 %); EB-0107's hold runs from 19:10 (91.9 %) to 20:15
# (90.4 %), still without micro-cycles.
# source: hand
cw-topoff --full 90 --min-depth 2 testdata/topoff-dock.csv
