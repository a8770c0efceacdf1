# plumb - drop-and-descent safety calculator.  One hand-written Makefile.
#
#   make          build build/plumb, build/libplumb.a and build/libplumb.so
#   make check    install missing dependencies, build, run every test
#                 (plain, then under AddressSanitizer + UBSan), in parallel
#   make demo     install missing dependencies, build, run `plumb fall` on
#                 the bundled demo profiles and write their sheets to out/
#   make sheet-image  docs/sheet-page1.png, page 1 of the drone release's
#                 sheet (pdftoppm), for the README
#   make bench    benchmark (not a test)
#   make asan     build and run the tests under ASan + UBSan only
#   make coverage build with gcov into build/cov, run the tests, count the
#                 error-raising sites they reach
#   make install  PREFIX=/usr/local DESTDIR=
#   make clean
#
# The build prints one line per step (`CC src/units.c`); `make V=1` prints
# the full commands.

# ---- settings -------------------------------------------------------------
PREFIX    ?= /usr/local
DESTDIR   ?=
BINDIR    ?= $(PREFIX)/bin
LIBDIR    ?= $(PREFIX)/lib
INCLUDEDIR ?= $(PREFIX)/include
DATADIR   ?= $(PREFIX)/share
PKGCONFIGDIR ?= $(LIBDIR)/pkgconfig
# plumb-sheet, the program `plumb sheet` runs (src/cli/cli_sheet_exec.c).
LIBEXECDIR ?= $(PREFIX)/libexec/plumb
BUILD     ?= build
CC        ?= cc
OPT       ?= -O2 -g
# Parallel jobs for `make check`, `make asan` and `make coverage`.
JOBS      ?= $(shell nproc 2>/dev/null || echo 2)
V         ?= 0
PKGS      := gsl yaml-0.1 udunits jansson
TEST_PKGS := cmocka
# The PDF sheet (src/report/sheet*.c) is a separate archive,
# libplumb-sheet.a, so libplumb itself does not need cairo or pango.
SHEET_PKGS := cairo pangocairo
# Debian's udunits.pc gives no include path although the header lives in
# /usr/include/udunits2/.
UDUNITS_INC ?= -I/usr/include/udunits2

# The version is written once, in include/plumb/version.h; the shared
# object is libplumb.so.VERSION with the SONAME libplumb.so.MAJOR, and
# while MAJOR is 0 (no stable ABI yet) libplumb.so.0.MINOR: a 0.x release
# that breaks the ABI raises the minor number.
VERSION   := $(shell sed -n 's/^\#define PLUMB_VERSION "\([0-9.]*\)"$$/\1/p' include/plumb/version.h)
SOMAJOR   := $(if $(filter 0,$(word 1,$(subst ., ,$(VERSION)))),0.$(word 2,$(subst ., ,$(VERSION))),$(word 1,$(subst ., ,$(VERSION))))
SONAME    := libplumb.so.$(SOMAJOR)

WARN := -Wall -Wextra -Werror -Wshadow -Wconversion -Wstrict-prototypes \
        -Wmissing-prototypes -Wpointer-arith -Wcast-qual -Wwrite-strings \
        -Wundef -Wformat=2 -Wvla
# $(call once,NAME,COMMAND): the output of the shell COMMAND, run at the
# first use of NAME only, which then keeps it. A plain `=` ran pkg-config
# again for every compile and link (some 330 runs in `make check`'s two
# builds, 1.6 ms each and 9 ms for cairo and pango); `:=` would run it
# while reading the Makefile, before `make check` has installed what is
# missing (scripts/deps.sh) and for targets that need none (clean).
once = $(eval $(1) := $$(shell $(2)))$($(1))
PKG_CFLAGS = $(call once,PKG_CFLAGS,pkg-config --cflags $(PKGS) 2>/dev/null)
PKG_LIBS   = $(call once,PKG_LIBS,pkg-config --libs $(PKGS) 2>/dev/null)
CFLAGS_ALL = -std=c11 -D_POSIX_C_SOURCE=200809L $(OPT) $(WARN) -MMD -MP \
             -Iinclude -Isrc $(UDUNITS_INC) \
             $(PKG_CFLAGS) $(EXTRA_CFLAGS) $(CFLAGS)
LIBS       = $(PKG_LIBS) -lm -lpthread
TEST_LIBS  = $(call once,TEST_LIBS,pkg-config --libs $(TEST_PKGS) 2>/dev/null)
# cairo's and pango's headers as system headers: our warnings are for our code.
SHEET_CFLAGS = $(patsubst -I%,-isystem %,$(call once,SHEET_PKG_CFLAGS,pkg-config --cflags \
                 $(SHEET_PKGS) 2>/dev/null))
SHEET_LIBS   = $(call once,SHEET_LIBS,pkg-config --libs $(SHEET_PKGS) 2>/dev/null)
LDFLAGS_ALL = $(EXTRA_LDFLAGS) $(LDFLAGS)
# The library's objects serve both the archive and the shared object.
# -fno-semantic-interposition keeps calls inside the library direct.
PIC_FLAGS := -fPIC -fno-semantic-interposition

# The sanitizer build of `make check` and `make asan`. -Og: measured on
# report.c, 2.9 s to compile against 7.2 s at -O1, and no slower tests.
# -g1: line tables only, which is all a sanitizer's report needs (file and
# line of each frame); the full -g of variables and types made the build
# take 30 % longer (measured on seven of the largest sources).
ASAN_BUILD := $(BUILD)/asan
ASAN_VARS  = BUILD=$(ASAN_BUILD) OPT="-Og -g1" \
  EXTRA_CFLAGS="-fsanitize=address,undefined -fno-sanitize-recover=all -fno-omit-frame-pointer" \
  EXTRA_LDFLAGS="-fsanitize=address,undefined"
# The gcov build of `make coverage`.
COV_BUILD  := $(BUILD)/cov
# -fprofile-update=atomic: the zone runs threads, whose counts would
# otherwise race and undercount.
COV_VARS   = BUILD=$(COV_BUILD) OPT="-O0 -g" EXTRA_CFLAGS="--coverage -fprofile-update=atomic" \
  EXTRA_LDFLAGS="--coverage"

# One line per step unless V=1.
ifeq ($(V),1)
Q    :=
say   = @:
else
Q    := @
say   = @printf '  %-6s %s\n' '$(1)' '$(2)'
endif

# The demo sheets (`make demo`, under out/): the mast crew's kit and the
# drone release with a target, with a zone of DEMO_SAMPLES falls so the
# demo stays quick (the profiles' own zone.samples is for a real run).
DEMO_SHEETS  := profiles/demo/tower-kit.yaml profiles/demo/drone-release.yaml
DEMO_SAMPLES ?= 5000

# ---- sources --------------------------------------------------------------
LIB_SRC   := $(sort $(shell find src -name '*.c' ! -path 'src/cli/*' ! -name 'sheet*.c'))
SHEET_SRC := $(sort $(wildcard src/report/sheet*.c))
CLI_SRC   := $(wildcard src/cli/*.c)
# The two programs' main()s; the rest of the command line is an archive
# both link, each taking what it calls: plumb does not take cmd_sheet.c,
# so it does not need cairo and pango (src/cli/cli_sheet_exec.c).
MAIN_SRC  := src/cli/main.c src/cli/sheet_main.c
TEST_SRC  := $(wildcard tests/test_*.c)
SUPP_SRC  := $(wildcard tests/support/*.c)
BENCH_SRC := $(wildcard bench/*.c)

# The allocation-failure tests (tests/nomem): linked with --wrap for every
# allocating call libplumb makes, so that tests/nomem/failalloc.c can fail
# the Nth one (failalloc.h).
NOMEM_WRAP := malloc calloc realloc strdup strndup open_memstream \
  pthread_mutex_init pthread_cond_init \
  gsl_root_fsolver_alloc gsl_min_fminimizer_alloc gsl_interp_alloc gsl_odeiv2_step_alloc \
  gsl_odeiv2_evolve_alloc gsl_odeiv2_control_y_new gsl_odeiv2_driver_alloc_y_new gsl_rng_alloc \
  yaml_parser_initialize yaml_parser_parse ut_read_xml ut_parse ut_multiply ut_divide \
  ut_get_converter
NOMEM_LDFLAGS := $(foreach f,$(NOMEM_WRAP),-Wl,--wrap=$(f))
NOMEM_SRC := $(wildcard tests/nomem/test_*.c)

LIB_OBJ   := $(LIB_SRC:%.c=$(BUILD)/obj/%.o)
SHEET_OBJ := $(SHEET_SRC:%.c=$(BUILD)/obj/%.o)
CLI_OBJ   := $(CLI_SRC:%.c=$(BUILD)/obj/%.o)
CLI_LIB_OBJ := $(filter-out $(MAIN_SRC:%.c=$(BUILD)/obj/%.o),$(CLI_OBJ))
MAIN_OBJ  := $(BUILD)/obj/src/cli/main.o
SHEET_MAIN_OBJ := $(BUILD)/obj/src/cli/sheet_main.o
TEST_OBJ  := $(TEST_SRC:%.c=$(BUILD)/obj/%.o)
SUPP_OBJ  := $(SUPP_SRC:%.c=$(BUILD)/obj/%.o)
TEST_BIN  := $(TEST_SRC:tests/%.c=$(BUILD)/tests/%)
BENCH_BIN := $(BENCH_SRC:bench/%.c=$(BUILD)/bench/%)
NOMEM_OBJ := $(BUILD)/obj/tests/nomem/failalloc.o
NOMEM_TEST_OBJ := $(NOMEM_SRC:%.c=$(BUILD)/obj/%.o)
NOMEM_BIN := $(NOMEM_SRC:tests/nomem/%.c=$(BUILD)/tests/%)
# The command line with the hook: PLUMB_FAILALLOC=N fails its Nth allocation.
NOMEM_CLI := $(BUILD)/tests/plumb-nomem

LIB     := $(BUILD)/libplumb.a
SHEET_LIB := $(BUILD)/libplumb-sheet.a
CLI_LIB   := $(BUILD)/libplumb-cli.a
SO_REAL := $(BUILD)/libplumb.so.$(VERSION)
SO_LINKS := $(BUILD)/$(SONAME) $(BUILD)/libplumb.so
SO_MAP  := src/libplumb.map
PC      := $(BUILD)/plumb.pc
BIN     := $(BUILD)/plumb
SHEET_BIN := $(BUILD)/plumb-sheet

.PHONY: FORCE all check demo sheet-image bench asan coverage install clean deps deps-test tests test-run \
        check-build-plain check-build-asan
.DELETE_ON_ERROR:
# Objects are intermediate files of the test programs; keep them.
.SECONDARY:

all: $(BIN) $(SHEET_BIN) $(LIB) $(SHEET_LIB) $(SO_REAL) $(SO_LINKS)

$(LIB_OBJ): EXTRA_OBJ_FLAGS = $(PIC_FLAGS)
$(SHEET_OBJ): EXTRA_OBJ_FLAGS = $(PIC_FLAGS) $(SHEET_CFLAGS)
$(TEST_OBJ) $(SUPP_OBJ): EXTRA_OBJ_FLAGS = -Itests/support
# Where the command looks for the criteria when neither --criteria-dir nor
# $PLUMB_CRITERIA_DIR says and none sits beside the executable: the
# installed data directory, then this source tree (an out-of-tree build).
$(CLI_OBJ): EXTRA_OBJ_FLAGS = -DPLUMB_CRITERIA_INSTALLED='"$(DATADIR)/plumb/criteria"' \
  -DPLUMB_CRITERIA_SOURCE='"$(CURDIR)/profiles/criteria"' \
  -DPLUMB_LIBEXEC_DIR='"$(LIBEXECDIR)"'
$(NOMEM_OBJ) $(NOMEM_TEST_OBJ): EXTRA_OBJ_FLAGS = -Itests/support -Itests/nomem

$(BUILD)/obj/%.o: %.c Makefile
	@mkdir -p $(dir $@)
	$(call say,CC,$<)
	$(Q)$(CC) $(CFLAGS_ALL) $(EXTRA_OBJ_FLAGS) -c $< -o $@

$(LIB): $(LIB_OBJ)
	@mkdir -p $(dir $@)
	$(call say,AR,$@)
	$(Q)rm -f $@
	$(Q)ar rcs $@ $^

$(SHEET_LIB): $(SHEET_OBJ)
	@mkdir -p $(dir $@)
	$(call say,AR,$@)
	$(Q)rm -f $@
	$(Q)ar rcs $@ $^

$(CLI_LIB): $(CLI_LIB_OBJ)
	@mkdir -p $(dir $@)
	$(call say,AR,$@)
	$(Q)rm -f $@
	$(Q)ar rcs $@ $^

# Only the plumb_* functions of the public headers are exported (the
# version script); tests/cli/library.sh checks the list with nm -D.
$(SO_REAL): $(LIB_OBJ) $(SO_MAP)
	@mkdir -p $(dir $@)
	$(call say,LD,$@)
	$(Q)$(CC) -shared -Wl,-soname,$(SONAME) -Wl,--version-script=$(SO_MAP) -Wl,-z,defs \
	  $(CFLAGS_ALL) $(LDFLAGS_ALL) -o $@ $(LIB_OBJ) $(LIBS)

$(BUILD)/$(SONAME): $(SO_REAL)
	$(Q)ln -sf $(notdir $<) $@
$(BUILD)/libplumb.so: $(BUILD)/$(SONAME)
	$(Q)ln -sf $(notdir $<) $@

$(BIN): $(MAIN_OBJ) $(CLI_LIB) $(LIB)
	$(call say,LD,$@)
	$(Q)$(CC) $(CFLAGS_ALL) $(LDFLAGS_ALL) -o $@ $^ $(LIBS)

$(SHEET_BIN): $(SHEET_MAIN_OBJ) $(CLI_LIB) $(SHEET_LIB) $(LIB)
	$(call say,LD,$@)
	$(Q)$(CC) $(CFLAGS_ALL) $(LDFLAGS_ALL) -o $@ $^ $(LIBS) $(SHEET_LIBS)

$(BUILD)/tests/%: $(BUILD)/obj/tests/%.o $(SUPP_OBJ) $(LIB)
	@mkdir -p $(dir $@)
	$(call say,LD,$@)
	$(Q)$(CC) $(CFLAGS_ALL) $(LDFLAGS_ALL) -o $@ $< $(SUPP_OBJ) $(LIB) $(LIBS) $(TEST_LIBS)

# The limit's test of falls that fail inside a crossing's bracket: every
# fall the solver computes goes through the test's wrapper (--wrap), which
# fails those in a window of heights no profile can make fail alone.
$(BUILD)/tests/test_inverse_gap: LDFLAGS_ALL += -Wl,--wrap=plumb_trajectory_run

# The sheet's own test links its archive, with cairo and pango.
$(BUILD)/tests/test_sheet: $(BUILD)/obj/tests/test_sheet.o $(SUPP_OBJ) $(SHEET_LIB) $(LIB)
	@mkdir -p $(dir $@)
	$(call say,LD,$@)
	$(Q)$(CC) $(CFLAGS_ALL) $(LDFLAGS_ALL) -o $@ $< $(SUPP_OBJ) $(SHEET_LIB) $(LIB) $(LIBS) \
	  $(TEST_LIBS) $(SHEET_LIBS)

# (with the sheet's archive: its own allocations are failed too)
$(NOMEM_BIN): $(BUILD)/tests/%: $(BUILD)/obj/tests/nomem/%.o $(NOMEM_OBJ) $(SUPP_OBJ) $(SHEET_LIB) \
              $(LIB)
	@mkdir -p $(dir $@)
	$(call say,LD,$@)
	$(Q)$(CC) $(CFLAGS_ALL) $(LDFLAGS_ALL) $(NOMEM_LDFLAGS) -o $@ $^ $(LIBS) $(TEST_LIBS) \
	  $(SHEET_LIBS)

$(NOMEM_CLI): $(MAIN_OBJ) $(NOMEM_OBJ) $(CLI_LIB) $(LIB)
	@mkdir -p $(dir $@)
	$(call say,LD,$@)
	$(Q)$(CC) $(CFLAGS_ALL) $(LDFLAGS_ALL) $(NOMEM_LDFLAGS) -o $@ $^ $(LIBS)

$(BUILD)/bench/%: bench/%.c $(LIB) Makefile
	@mkdir -p $(dir $@)
	$(call say,CC,$<)
	$(Q)$(CC) $(CFLAGS_ALL) $(LDFLAGS_ALL) -o $@ $< $(LIB) $(LIBS)

# pkg-config file for the installed library (PREFIX, LIBDIR, INCLUDEDIR);
# made again at every install, as those may differ from the last one.
$(PC): plumb.pc.in Makefile include/plumb/version.h FORCE
	@mkdir -p $(dir $@)
	$(call say,GEN,$@)
	$(Q)sed -e 's|@PREFIX@|$(PREFIX)|g' -e 's|@LIBDIR@|$(LIBDIR)|g' \
	  -e 's|@INCLUDEDIR@|$(INCLUDEDIR)|g' -e 's|@VERSION@|$(VERSION)|g' \
	  -e 's|@PKGS@|$(PKGS)|g' plumb.pc.in >$@

# Everything tests/run.sh runs against $(BUILD).
tests: all $(TEST_BIN) $(NOMEM_BIN) $(NOMEM_CLI)

# Runs every test program and the CLI tests against $(BUILD); prints the summary line.
test-run: tests
	@sh tests/run.sh -j $(JOBS) $(BUILD)

deps:
	@sh scripts/deps.sh

deps-test:
	@sh scripts/deps.sh --tests

# Both builds at once (JOBS jobs between them), then every test of both.
check: deps-test
	@$(MAKE) --no-print-directory -j$(JOBS) check-build-plain check-build-asan
	@sh tests/run.sh -j $(JOBS) $(BUILD) $(ASAN_BUILD)

check-build-plain:
	@$(MAKE) --no-print-directory tests
check-build-asan:
	@$(MAKE) --no-print-directory $(ASAN_VARS) tests

asan: deps-test
	@$(MAKE) --no-print-directory -j$(JOBS) $(ASAN_VARS) test-run

# Builds with gcov into $(COV_BUILD), runs the tests there (a failing test
# does not stop the count), then counts the PLUMB_RAISE* sites reached.
coverage: deps-test
	@find $(COV_BUILD) -name '*.gcda' -delete 2>/dev/null || true
	@$(MAKE) --no-print-directory -j$(JOBS) $(COV_VARS) tests
	@sh tests/run.sh -j $(JOBS) $(COV_BUILD) >$(COV_BUILD)/tests.log 2>&1 || \
	  echo "coverage: some tests failed (see $(COV_BUILD)/tests.log); counting anyway"
	@sh scripts/coverage.sh $(COV_BUILD)

# -s keeps an up-to-date build quiet ("Nothing to be done"); V=1 shows all.
demo: deps
	@$(MAKE) --no-print-directory $(if $(filter 1,$(V)),,-s) -j$(JOBS) all
	@for p in profiles/demo/*.yaml; do \
	  echo; echo "==> plumb fall $$p"; $(BIN) fall "$$p" || exit $$?; done
	@mkdir -p out
	@for p in $(DEMO_SHEETS); do \
	  o=out/$$(basename "$$p" .yaml).pdf; \
	  $(BIN) sheet "$$p" -o "$$o" --samples $(DEMO_SAMPLES) --quiet || exit $$?; \
	  echo "==> plumb sheet $$p: wrote $$o"; done
	@$(BIN) zone profiles/demo/drone-release.yaml --samples $(DEMO_SAMPLES) --quiet \
	  --format geojson -o out/drone-release.geojson || exit $$?; \
	  echo "==> plumb zone profiles/demo/drone-release.yaml: wrote out/drone-release.geojson (a map program opens it)"
	@printf '\n==> next: %s\n    %s\n' \
	  "$(BIN) --help, and README.md for what each figure means" \
	  "a clearance zone: $(BIN) zone profiles/demo/drone-release.yaml"

# page 1 of a demo sheet as a picture for the README, made from the real
# PDF; the time on it is that of the last commit, so it changes only with
# the code or the profile.
sheet-image: deps-test
	@$(MAKE) --no-print-directory $(if $(filter 1,$(V)),,-s) -j$(JOBS) all
	@mkdir -p docs
	$(Q)SOURCE_DATE_EPOCH=$$(git log -1 --format=%ct 2>/dev/null || echo 0) \
	  $(BIN) sheet profiles/demo/drone-release.yaml -o $(BUILD)/sheet-image.pdf \
	  --samples $(DEMO_SAMPLES) --quiet
	$(Q)pdftoppm -png -r 70 -f 1 -l 1 -singlefile $(BUILD)/sheet-image.pdf docs/sheet-page1
	@echo "==> wrote docs/sheet-page1.png"

bench: deps
	@$(MAKE) --no-print-directory -j$(JOBS) all $(BENCH_BIN)
	@for b in $(BENCH_BIN); do $$b || exit $$?; done

install: all $(PC)
	$(call say,INSTALL,$(DESTDIR)$(PREFIX))
	$(Q)install -d $(DESTDIR)$(BINDIR) $(DESTDIR)$(LIBEXECDIR) $(DESTDIR)$(LIBDIR) $(DESTDIR)$(PKGCONFIGDIR) \
	  $(DESTDIR)$(INCLUDEDIR)/plumb $(DESTDIR)$(DATADIR)/plumb/criteria
	$(Q)install -m 755 $(BIN) $(DESTDIR)$(BINDIR)/plumb
	$(Q)install -m 755 $(SHEET_BIN) $(DESTDIR)$(LIBEXECDIR)/plumb-sheet
	$(Q)install -m 644 $(LIB) $(DESTDIR)$(LIBDIR)/libplumb.a
	$(Q)install -m 644 $(SHEET_LIB) $(DESTDIR)$(LIBDIR)/libplumb-sheet.a
	$(Q)install -m 755 $(SO_REAL) $(DESTDIR)$(LIBDIR)/
	$(Q)ln -sf $(notdir $(SO_REAL)) $(DESTDIR)$(LIBDIR)/$(SONAME)
	$(Q)ln -sf $(SONAME) $(DESTDIR)$(LIBDIR)/libplumb.so
	$(Q)install -m 644 $(PC) $(DESTDIR)$(PKGCONFIGDIR)/plumb.pc
	$(Q)install -m 644 include/plumb/*.h $(DESTDIR)$(INCLUDEDIR)/plumb/
	$(Q)install -m 644 profiles/criteria/*.yaml $(DESTDIR)$(DATADIR)/plumb/criteria/

clean:
	rm -rf build

FORCE:

-include $(shell find $(BUILD)/obj -name '*.d' 2>/dev/null)
