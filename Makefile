# plumb - drop-and-descent safety calculator.  One hand-written Makefile.
#
#   make          build build/plumb and build/libplumb.a
#   make check    install missing dependencies, build, run every test
#                 (plain, then under AddressSanitizer + UBSan)
#   make demo     install missing dependencies, build, run `plumb fall` on
#                 the bundled demo profiles
#   make bench    benchmark (not a test)
#   make asan     build and run the tests under ASan + UBSan only
#   make install  PREFIX=/usr/local DESTDIR=
#   make clean

# ---- settings -------------------------------------------------------------
PREFIX    ?= /usr/local
DESTDIR   ?=
BUILD     ?= build
CC        ?= cc
OPT       ?= -O2 -g
PKGS      := gsl yaml-0.1 udunits jansson
TEST_PKGS := cmocka
# Debian's udunits.pc gives no include path although the header lives in
# /usr/include/udunits2/.
UDUNITS_INC ?= -I/usr/include/udunits2

WARN := -Wall -Wextra -Werror -Wshadow -Wconversion -Wstrict-prototypes \
        -Wmissing-prototypes -Wpointer-arith -Wcast-qual -Wwrite-strings \
        -Wundef -Wformat=2 -Wvla
CFLAGS_ALL = -std=c11 -D_POSIX_C_SOURCE=200809L $(OPT) $(WARN) -MMD -MP \
             -Iinclude -Isrc $(UDUNITS_INC) \
             $(shell pkg-config --cflags $(PKGS) 2>/dev/null) $(EXTRA_CFLAGS) $(CFLAGS)
LIBS       = $(shell pkg-config --libs $(PKGS) 2>/dev/null) -lm -lpthread
TEST_LIBS  = $(shell pkg-config --libs $(TEST_PKGS) 2>/dev/null)
LDFLAGS_ALL = $(EXTRA_LDFLAGS) $(LDFLAGS)

# ---- sources --------------------------------------------------------------
LIB_SRC   := $(wildcard src/*.c)
CLI_SRC   := $(wildcard src/cli/*.c)
TEST_SRC  := $(wildcard tests/test_*.c)
SUPP_SRC  := $(wildcard tests/support/*.c)
BENCH_SRC := $(wildcard bench/*.c)

LIB_OBJ   := $(LIB_SRC:%.c=$(BUILD)/obj/%.o)
CLI_OBJ   := $(CLI_SRC:%.c=$(BUILD)/obj/%.o)
SUPP_OBJ  := $(SUPP_SRC:%.c=$(BUILD)/obj/%.o)
TEST_BIN  := $(TEST_SRC:tests/%.c=$(BUILD)/tests/%)
BENCH_BIN := $(BENCH_SRC:bench/%.c=$(BUILD)/bench/%)

LIB := $(BUILD)/libplumb.a
BIN := $(BUILD)/plumb

.PHONY: all check demo bench asan install clean deps deps-test tests test-run
.DELETE_ON_ERROR:

all: $(BIN) $(LIB)

$(BUILD)/obj/%.o: %.c Makefile
	@mkdir -p $(dir $@)
	$(CC) $(CFLAGS_ALL) -c $< -o $@

$(LIB): $(LIB_OBJ)
	@mkdir -p $(dir $@)
	rm -f $@
	ar rcs $@ $^

$(BIN): $(CLI_OBJ) $(LIB)
	$(CC) $(CFLAGS_ALL) $(LDFLAGS_ALL) -o $@ $(CLI_OBJ) $(LIB) $(LIBS)

$(BUILD)/tests/%: tests/%.c $(SUPP_OBJ) $(LIB) Makefile
	@mkdir -p $(dir $@)
	$(CC) $(CFLAGS_ALL) -Itests/support $(LDFLAGS_ALL) -o $@ $< $(SUPP_OBJ) $(LIB) $(LIBS) $(TEST_LIBS)

$(BUILD)/bench/%: bench/%.c $(LIB) Makefile
	@mkdir -p $(dir $@)
	$(CC) $(CFLAGS_ALL) $(LDFLAGS_ALL) -o $@ $< $(LIB) $(LIBS)

tests: $(BIN) $(TEST_BIN)

# Runs every test program and the CLI tests against $(BUILD); prints the summary line.
test-run: tests
	@sh tests/run.sh $(BUILD)

deps:
	@sh scripts/deps.sh

deps-test:
	@sh scripts/deps.sh --tests

check: deps-test
	@$(MAKE) --no-print-directory all tests
	@$(MAKE) --no-print-directory BUILD=build/asan OPT="-O1 -g" \
	  EXTRA_CFLAGS="-fsanitize=address,undefined -fno-sanitize-recover=all -fno-omit-frame-pointer" \
	  EXTRA_LDFLAGS="-fsanitize=address,undefined" tests
	@sh tests/run.sh build build/asan

asan: deps-test
	@$(MAKE) --no-print-directory BUILD=build/asan OPT="-O1 -g" \
	  EXTRA_CFLAGS="-fsanitize=address,undefined -fno-sanitize-recover=all -fno-omit-frame-pointer" \
	  EXTRA_LDFLAGS="-fsanitize=address,undefined" test-run

demo: deps
	@$(MAKE) --no-print-directory all
	@for p in profiles/demo/*.yaml; do \
	  echo "==> $(BIN) fall $$p"; $(BIN) fall "$$p" || exit $$?; echo; done

bench: deps
	@$(MAKE) --no-print-directory all $(BENCH_BIN)
	@for b in $(BENCH_BIN); do $$b || exit $$?; done

install: all
	install -d $(DESTDIR)$(PREFIX)/bin $(DESTDIR)$(PREFIX)/lib \
	  $(DESTDIR)$(PREFIX)/include/plumb $(DESTDIR)$(PREFIX)/share/plumb/criteria
	install -m 755 $(BIN) $(DESTDIR)$(PREFIX)/bin/plumb
	install -m 644 $(LIB) $(DESTDIR)$(PREFIX)/lib/libplumb.a
	install -m 644 include/plumb/*.h $(DESTDIR)$(PREFIX)/include/plumb/
	install -m 644 profiles/criteria/*.yaml $(DESTDIR)$(PREFIX)/share/plumb/criteria/

clean:
	rm -rf build

-include $(shell find $(BUILD)/obj -name '*.d' 2>/dev/null)
