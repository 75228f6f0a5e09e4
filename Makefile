# corax: build, test, demo, benchmark and install.
# Plain make with pkg-config; see DEVELOPERS.md.

CC      ?= cc
PREFIX  ?= /usr/local
BUILD   ?= build
PKGS    := gsl inih gdal proj
TESTPKG := cmocka

WARN    := -Wall -Wextra -Wpedantic -Wshadow -Wstrict-prototypes \
           -Wmissing-prototypes -Wdouble-promotion
CSTD    := -std=c11 -D_POSIX_C_SOURCE=200809L
OPT     ?= -O2 -g
# CI sets WERROR=-Werror; SANITIZE is set by `make sanitize`.
WERROR  ?=
SANITIZE ?=

# -isystem: the libraries' own headers are not ours to warn about (GDAL's
# enumerators beyond int trip -Wpedantic)
PKG_CFLAGS := $(patsubst -I%,-isystem %,$(shell pkg-config --cflags $(PKGS) 2>/dev/null))
PKG_LIBS   := $(shell pkg-config --libs $(PKGS) 2>/dev/null) -lcsv -lm
TEST_CFLAGS := $(shell pkg-config --cflags $(TESTPKG) 2>/dev/null)
TEST_LIBS   := $(shell pkg-config --libs $(TESTPKG) 2>/dev/null)

CFLAGS_ALL := $(CSTD) $(OPT) $(WARN) $(WERROR) $(SANITIZE) -fopenmp -MMD -MP \
              -Iinclude -Isrc $(PKG_CFLAGS) $(CFLAGS)
LDFLAGS_ALL := $(SANITIZE) -fopenmp $(LDFLAGS)

LIB_SRC   := $(sort $(wildcard src/*/*.c))
LIB_SRC   := $(filter-out src/cli/%,$(LIB_SRC))
CLI_SRC   := $(sort $(wildcard src/cli/*.c))
TEST_SRC  := $(sort $(wildcard tests/test_*.c))
TEST_AUX  := $(sort $(wildcard tests/support/*.c))
BENCH_SRC := $(sort $(wildcard bench/bench_*.c))
TOOL_SRC  := $(sort $(wildcard tools/*.c))

LIB_OBJ   := $(LIB_SRC:%.c=$(BUILD)/obj/%.o)
# The built-in magnetic models: data/magnetic/*.COF compiled into the library.
COF_DATA  := $(sort $(wildcard data/magnetic/*.COF))
COF_SRC   := $(BUILD)/gen/magnetic_cof.c
LIB_OBJ   += $(BUILD)/obj/gen/magnetic_cof.o
CLI_OBJ   := $(CLI_SRC:%.c=$(BUILD)/obj/%.o)
TEST_AUX_OBJ := $(TEST_AUX:%.c=$(BUILD)/obj/%.o)
TESTS     := $(TEST_SRC:tests/%.c=$(BUILD)/tests/%)
BENCHES   := $(BENCH_SRC:bench/%.c=$(BUILD)/bench/%)
TOOLS     := $(TOOL_SRC:tools/%.c=$(BUILD)/tools/%)

LIB := $(BUILD)/libcorax.a
BIN := $(BUILD)/corax

.SECONDARY:
.PHONY: all deps check unit cli-tests cycles sanitize demo demo-run bench install clean

all: $(LIB) $(BIN)

$(BUILD)/obj/%.o: %.c
	@mkdir -p $(dir $@)
	$(CC) $(CFLAGS_ALL) $(if $(filter tests/%,$<),$(TEST_CFLAGS)) -c $< -o $@

$(COF_SRC): $(COF_DATA) tools/cof_to_c.sh
	@mkdir -p $(dir $@)
	sh tools/cof_to_c.sh $(COF_DATA) > $@.tmp && mv $@.tmp $@

$(BUILD)/obj/gen/magnetic_cof.o: $(COF_SRC)
	@mkdir -p $(dir $@)
	$(CC) $(CFLAGS_ALL) -c $< -o $@

$(LIB): $(LIB_OBJ)
	@mkdir -p $(dir $@)
	rm -f $@
	ar rcs $@ $^

$(BIN): $(CLI_OBJ) $(LIB)
	$(CC) $(LDFLAGS_ALL) -o $@ $(CLI_OBJ) $(LIB) $(PKG_LIBS)

$(BUILD)/tests/%: $(BUILD)/obj/tests/%.o $(TEST_AUX_OBJ) $(LIB)
	@mkdir -p $(dir $@)
	$(CC) $(LDFLAGS_ALL) -o $@ $< $(TEST_AUX_OBJ) $(LIB) $(TEST_LIBS) $(PKG_LIBS)

# The jobs' test uses the public API alone: no internal headers, no test
# helpers, only the library.
$(BUILD)/obj/tests/test_jobs.o: CFLAGS_ALL := $(filter-out -Isrc,$(CFLAGS_ALL))
$(BUILD)/tests/test_jobs: $(BUILD)/obj/tests/test_jobs.o $(LIB)
	@mkdir -p $(dir $@)
	$(CC) $(LDFLAGS_ALL) -o $@ $< $(LIB) $(TEST_LIBS) $(PKG_LIBS)

$(BUILD)/bench/%: $(BUILD)/obj/bench/%.o $(LIB)
	@mkdir -p $(dir $@)
	$(CC) $(LDFLAGS_ALL) -o $@ $< $(LIB) $(PKG_LIBS)

$(BUILD)/tools/%: $(BUILD)/obj/tools/%.o $(LIB)
	@mkdir -p $(dir $@)
	$(CC) $(LDFLAGS_ALL) -o $@ $< $(LIB) $(PKG_LIBS)

# Make sure the Debian build dependencies are there (installs them, or says how).
deps:
	@.ci/deps

# The whole suite: unit tests (cmocka), command-line cases, and no circles in
# the code's dependencies.
check: deps
	@$(MAKE) --no-print-directory unit cli-tests cycles

unit: $(TESTS)
	@set -e; for t in $(TESTS); do echo "== $$t"; $$t; done

cli-tests: $(BIN) $(TOOLS)
	@CORAX=$(abspath $(BIN)) BUILD=$(abspath $(BUILD)) tests/cli/run.sh

# Files, folders and headers that depend on each other in a circle.
cycles: $(LIB_OBJ) $(CLI_OBJ)
	@sh tools/check_cycles.sh $(LIB_OBJ) $(CLI_OBJ)

# The same suite built with AddressSanitizer and UndefinedBehaviorSanitizer.
sanitize: deps
	@$(MAKE) --no-print-directory BUILD=build-sanitize OPT="-O1 -g" \
	    SANITIZE="-fsanitize=address,undefined -fno-omit-frame-pointer -fno-sanitize-recover=all" \
	    unit cli-tests

# The main job on the shipped demo program.
demo: deps
	@$(MAKE) --no-print-directory demo-run

demo-run: all $(TOOLS)
	@CORAX=$(abspath $(BIN)) BUILD=$(abspath $(BUILD)) tools/demo.sh

bench: all $(BENCHES)
	@set -e; for b in $(BENCHES); do echo "== $$b"; CORAX=$(abspath $(BIN)) $$b; done

install: all
	install -d $(DESTDIR)$(PREFIX)/bin $(DESTDIR)$(PREFIX)/lib \
	    $(DESTDIR)$(PREFIX)/include/corax $(DESTDIR)$(PREFIX)/share/man/man1
	install -m 755 $(BIN) $(DESTDIR)$(PREFIX)/bin/corax
	install -m 644 $(LIB) $(DESTDIR)$(PREFIX)/lib/libcorax.a
	install -m 644 include/corax/*.h $(DESTDIR)$(PREFIX)/include/corax/
	install -m 644 man/corax.1 $(DESTDIR)$(PREFIX)/share/man/man1/corax.1
	install -d $(DESTDIR)$(PREFIX)/share/corax/magnetic
	install -m 644 $(COF_DATA) data/magnetic/README.md $(DESTDIR)$(PREFIX)/share/corax/magnetic/

clean:
	rm -rf build build-sanitize demo-output

-include $(shell find $(BUILD)/obj -name '*.d' 2>/dev/null)
