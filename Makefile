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
# The simulator's engine (synth/), cw-synth's alone: not in libcw.a.
SYNTHSRC = $(wildcard synth/*.c)
SYNTHOBJ = $(patsubst synth/%.c,build/synth/%.o,$(SYNTHSRC))
SYNTHHDR = $(wildcard synth/*.h)
SYNTHUSE = bin/cw-synth build/tests/test_synth build/tests/synth_rng
MAN     = $(wildcard man/*.1)
MAN7    = $(wildcard man/*.7)
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

build/synth/%.o: synth/%.c $(SYNTHHDR) $(LIBHDR) config.mk $(FLAGSTAMP)
	@mkdir -p build/synth
	$(CC) $(CWFLAGS) -Isynth $(CFLAGS) -c -o $@ $<

# What uses the simulator finds its header and links its objects.
$(SYNTHUSE): $(SYNTHOBJ) $(SYNTHHDR)
$(SYNTHUSE): private CWFLAGS += -Isynth
$(SYNTHUSE): private EXTRAOBJ = $(SYNTHOBJ)

build/libcw.a: $(LIBOBJ) Makefile
	rm -f $@
	ar rcs $@ $(LIBOBJ)

bin/%: cmd/%.c build/libcw.a $(LIBHDR) $(FLAGSTAMP)
	@mkdir -p bin
	$(CC) $(CWFLAGS) $(CFLAGS) $(LDFLAGS) -o $@ $< $(EXTRAOBJ) build/libcw.a \
	    $(LDLIBS)

build/tests/%: tests/unit/%.c build/libcw.a $(LIBHDR) $(FLAGSTAMP)
	@mkdir -p build/tests
	$(CC) $(CWFLAGS) $(CFLAGS) $(LDFLAGS) -o $@ $< $(EXTRAOBJ) build/libcw.a \
	    -lcmocka $(LDLIBS)

build/tests/%: tests/tools/%.c build/libcw.a $(LIBHDR) $(FLAGSTAMP)
	@mkdir -p build/tests
	$(CC) $(CWFLAGS) $(CFLAGS) $(LDFLAGS) -o $@ $< $(EXTRAOBJ) build/libcw.a \
	    $(LDLIBS)

build/tests/replay_%: tests/fuzz/fuzz_%.c tests/fuzz/replay.c \
	    tests/fuzz/fuzz.h tests/fuzz/fuzz_engine.h build/libcw.a \
	    $(LIBHDR) $(FLAGSTAMP)
	@mkdir -p build/tests
	$(CC) $(CWFLAGS) $(CFLAGS) $(LDFLAGS) $(FZLINK) -o $@ $< \
	    tests/fuzz/replay.c build/libcw.a $(LDLIBS)

# make fuzz: the libFuzzer harnesses of tests/fuzz/, one at a time, each
# for FUZZ_SECONDS or FUZZ_RUNS inputs (0: no limit), whichever ends
# first; prints inputs per second per harness and a summary table
# (tests/fuzz/run, docs/FUZZING.md).
# Built apart in build/fuzz/, so the flags of the other targets do not
# matter here.
FUZZ_SECONDS ?= 60
FUZZ_RUNS ?= 0
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
	$(FUZZCC) $(CWFLAGS) $(FUZZFLAGS) $(FZLINK) -fsanitize=fuzzer -o $@ \
	    $< $(FUZZOBJ) $(LDLIBS)

# fuzz_fleet catches the reader's cw_die() (see the harness).
build/fuzz/fuzz_fleet build/tests/replay_fleet: FZLINK = -Wl,--wrap=cw_die \
	    -Wl,--wrap=cw_malloc,--wrap=cw_calloc,--wrap=cw_realloc \
	    -Wl,--wrap=posix_memalign \
	    -Wl,--wrap=free,--wrap=gzsrc_read,--wrap=gzsrc_close \
	    -Wl,--wrap=csvin_new,--wrap=csvin_free

fuzz: deps $(FUZZBIN)
	@FUZZ_SECONDS=$(FUZZ_SECONDS) FUZZ_RUNS=$(FUZZ_RUNS) tests/fuzz/run \
	    $(FUZZBIN)

# make tsan: the threaded gzip reader of lib/gzsrc.c under ThreadSanitizer
# (clang), built apart in build/tsan/; make check runs it (tests/tsan/run).
TSANCC    = clang
TSANFLAGS = -g -O1 -fno-omit-frame-pointer -fsanitize=thread
TSANSRC   = lib/gzsrc.c lib/cw.c lib/pipe.c

build/tsan/gzsrc_ring: tests/tsan/gzsrc_ring.c $(TSANSRC) $(LIBHDR) config.mk
	@mkdir -p build/tsan
	$(TSANCC) $(CWFLAGS) $(TSANFLAGS) -o $@ tests/tsan/gzsrc_ring.c \
	    $(TSANSRC) -lz -lpthread

tsan: build/tsan/gzsrc_ring

deps:
	@scripts/deps

tests: $(BIN) $(UNIT) $(TOOLS) $(REPLAY)

check: deps
	@$(MAKE) -s tests tsan
	@tests/run

# make mutate: the mutations of tests/mutate/list, each alone against
# the fast part of make check (scripts/mutate.sh); fails when one survives.
mutate: deps
	@scripts/mutate.sh

bench: all
	scripts/bench.sh

# make demo: an invented fleet through every tool, plots and a report.
demo: deps all
	@DEMO_NOBUILD=1 scripts/demo.sh

lint:
	mandoc -Tlint -Wwarning $(MAN) $(MAN7)

install: $(BIN)
	mkdir -p $(DESTDIR)$(PREFIX)/bin $(DESTDIR)$(MANPREFIX)/man1
	cp -f $(BIN) $(DESTDIR)$(PREFIX)/bin/
	cp -f $(MAN) $(DESTDIR)$(MANPREFIX)/man1/
	mkdir -p $(DESTDIR)$(MANPREFIX)/man7
	cp -f $(MAN7) $(DESTDIR)$(MANPREFIX)/man7/
	mkdir -p $(DESTDIR)$(PREFIX)/share/cellwear
	cp -f scripts/slurm-day.sh scripts/slurm-merge.sh $(DESTDIR)$(PREFIX)/share/cellwear/

uninstall:
	for f in $(BIN); do rm -f $(DESTDIR)$(PREFIX)/$$f; done
	for f in $(MAN); do rm -f $(DESTDIR)$(MANPREFIX)/man1/$${f#man/}; done
	for f in $(MAN7); do rm -f $(DESTDIR)$(MANPREFIX)/man7/$${f#man/}; done

clean:
	rm -rf bin build

FORCE:

.PHONY: all bench demo deps mutate tests tsan check fuzz lint install uninstall clean FORCE
.SECONDARY: $(LIBOBJ) $(FUZZOBJ)
