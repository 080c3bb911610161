# cellwear: see README.md.  `make`, `make check`, `make install`.
include config.mk

# make check SANITIZE=1: the whole suite under ASan and UBSan (clang).
SANITIZE =
ifeq ($(SANITIZE),1)
SANFLAGS = -fsanitize=address,undefined -fno-sanitize-recover=all -fno-omit-frame-pointer
CC = clang
CFLAGS = -O1 -g $(SANFLAGS)
LDFLAGS = $(SANFLAGS)
endif

BIN     = $(patsubst cmd/%.c,bin/%,$(wildcard cmd/*.c))
LIBSRC  = $(wildcard lib/*.c)
LIBOBJ  = $(patsubst lib/%.c,build/lib/%.o,$(LIBSRC))
LIBHDR  = $(wildcard lib/*.h)
MAN     = $(wildcard man/*.1)
UNITSRC = $(wildcard tests/unit/test_*.c)
UNIT    = $(patsubst tests/unit/%.c,build/tests/%,$(UNITSRC))
TOOLSRC = $(wildcard tests/tools/*.c)
TOOLS   = $(patsubst tests/tools/%.c,build/tests/%,$(TOOLSRC))
# Every harness also as a plain program that replays saved inputs (make
# check runs tests/fuzz/regress/ through them).
REPLAY  = $(patsubst tests/fuzz/fuzz_%.c,build/tests/replay_%,$(wildcard tests/fuzz/fuzz_*.c))

all: $(BIN)

# Objects are rebuilt whenever the compiler or flags change.
FLAGSTAMP = build/flags.stamp
$(FLAGSTAMP): FORCE
	@mkdir -p build
	@echo '$(CC) $(CWFLAGS) $(CFLAGS) $(LDFLAGS)' > $@.new
	@if cmp -s $@.new $@; then rm -f $@.new; else mv $@.new $@; fi

build/lib/%.o: lib/%.c $(LIBHDR) config.mk $(FLAGSTAMP)
	@mkdir -p build/lib
	$(CC) $(CWFLAGS) $(CFLAGS) -c -o $@ $<

build/libcw.a: $(LIBOBJ)
	rm -f $@
	ar rcs $@ $(LIBOBJ)

bin/%: cmd/%.c build/libcw.a $(LIBHDR) $(FLAGSTAMP)
	@mkdir -p bin
	$(CC) $(CWFLAGS) $(CFLAGS) $(LDFLAGS) -o $@ $< build/libcw.a $(LDLIBS)

build/tests/%: tests/unit/%.c build/libcw.a $(LIBHDR) $(FLAGSTAMP)
	@mkdir -p build/tests
	$(CC) $(CWFLAGS) $(CFLAGS) $(LDFLAGS) -o $@ $< build/libcw.a -lcmocka $(LDLIBS)

build/tests/%: tests/tools/%.c build/libcw.a $(LIBHDR) $(FLAGSTAMP)
	@mkdir -p build/tests
	$(CC) $(CWFLAGS) $(CFLAGS) $(LDFLAGS) -o $@ $< build/libcw.a $(LDLIBS)

build/tests/replay_%: tests/fuzz/fuzz_%.c tests/fuzz/replay.c \
	    tests/fuzz/fuzz.h tests/fuzz/fuzz_engine.h build/libcw.a \
	    $(LIBHDR) $(FLAGSTAMP)
	@mkdir -p build/tests
	$(CC) $(CWFLAGS) $(CFLAGS) $(LDFLAGS) -o $@ $< tests/fuzz/replay.c \
	    build/libcw.a $(LDLIBS)

# make fuzz: the libFuzzer harnesses of tests/fuzz/, FUZZ_SECONDS each.
# Built apart in build/fuzz/, so the flags of the other targets do not
# matter here.
FUZZ_SECONDS ?= 60
FUZZCC    = clang
FUZZFLAGS = -g -O1 -fno-omit-frame-pointer -fsanitize=address,undefined \
	    -fno-sanitize-recover=all
FUZZSRC   = $(wildcard tests/fuzz/fuzz_*.c)
FUZZBIN   = $(patsubst tests/fuzz/%.c,build/fuzz/%,$(FUZZSRC))
FUZZOBJ   = $(patsubst lib/%.c,build/fuzz/lib/%.o,$(LIBSRC))

build/fuzz/lib/%.o: lib/%.c $(LIBHDR) config.mk
	@mkdir -p build/fuzz/lib
	$(FUZZCC) $(CWFLAGS) $(FUZZFLAGS) -fsanitize=fuzzer-no-link -c -o $@ $<

build/fuzz/%: tests/fuzz/%.c tests/fuzz/fuzz.h tests/fuzz/fuzz_engine.h \
	    $(FUZZOBJ) $(LIBHDR)
	$(FUZZCC) $(CWFLAGS) $(FUZZFLAGS) -fsanitize=fuzzer -o $@ $< \
	    $(FUZZOBJ) $(LDLIBS)

fuzz: deps $(FUZZBIN)
	@FUZZ_SECONDS=$(FUZZ_SECONDS) tests/fuzz/run $(FUZZBIN)

deps:
	@scripts/deps

tests: $(BIN) $(UNIT) $(TOOLS) $(REPLAY)

check: deps
	@$(MAKE) -s tests
	@tests/run

# make mutate: the mutations of tests/mutate/list, each alone against
# the fast part of make check (scripts/mutate.sh); fails when one survives.
mutate: deps
	@scripts/mutate.sh

bench: all
	scripts/bench.sh

# make demo: an invented fleet through every tool, plots and a report.
demo: all
	@DEMO_NOBUILD=1 scripts/demo.sh

lint:
	mandoc -Tlint -Wwarning $(MAN)

install: $(BIN)
	mkdir -p $(DESTDIR)$(PREFIX)/bin $(DESTDIR)$(MANPREFIX)/man1
	cp -f $(BIN) $(DESTDIR)$(PREFIX)/bin/
	cp -f $(MAN) $(DESTDIR)$(MANPREFIX)/man1/
	mkdir -p $(DESTDIR)$(PREFIX)/share/cellwear
	cp -f scripts/slurm-day.sh scripts/slurm-merge.sh $(DESTDIR)$(PREFIX)/share/cellwear/

uninstall:
	for f in $(BIN); do rm -f $(DESTDIR)$(PREFIX)/$$f; done
	for f in $(MAN); do rm -f $(DESTDIR)$(MANPREFIX)/man1/$${f#man/}; done

clean:
	rm -rf bin build

FORCE:

.PHONY: all bench demo deps mutate tests check fuzz lint install uninstall clean FORCE
.SECONDARY: $(LIBOBJ) $(FUZZOBJ)
