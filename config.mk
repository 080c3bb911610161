# cellwear build configuration.  Anything here can be replaced on the
# command line: make CC=clang CFLAGS='-O1 -g -fsanitize=address'.

VERSION = 0.1.0

PREFIX = /usr/local
MANPREFIX = $(PREFIX)/share/man

CC = cc
CFLAGS = -O2 -g -Wall -Wextra -Wshadow -Wstrict-prototypes
LDFLAGS =

# Always applied, whatever CFLAGS says: the language level and the
# include path are part of the source, not a tuning choice.  The option
# tables (lib/optab.h) leave the storing fields of an entry that the tool
# handles itself at zero, which -Wextra would flag in every table.
CWFLAGS = -std=c11 -D_POSIX_C_SOURCE=200809L -Ilib -DCW_VERSION=\"$(VERSION)\" \
	-Wno-missing-field-initializers
LDLIBS = -lcsv -lz -lm -lpthread
