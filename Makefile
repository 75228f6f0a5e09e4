# corax: build, test, demo, benchmark and install.
# Plain make with pkg-config; see DEVELOPERS.md.

CC      ?= cc
PREFIX  ?= /usr/local
BUILD   ?= build
PKGS    := gsl inih gdal
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
CLI_OBJ   := $(CLI_SRC:%.c=$(BUILD)/obj/%.o)
TEST_AUX_OBJ := $(TEST_AUX:%.c=$(BUILD)/obj/%.o)
TESTS     := $(TEST_SRC:tests/%.c=$(BUILD)/tests/%)
BENCHES   := $(BENCH_SRC:bench/%.c=$(BUILD)/bench/%)
TOOLS     := $(TOOL_SRC:tools/%.c=$(BUILD)/tools/%)

LIB := $(BUILD)/libcorax.a
BIN := $(BUILD)/corax

# Fuzzing harnesses (tests/fuzz; DEVELOPERS.md): reader, names and project
# from their own files, one per command from command.c. `make check` links
# them with replay.c and runs their seed corpus once; `make fuzz` links them
# with libFuzzer (clang) and fuzzes each for FUZZ_SECONDS.
FUZZ_COMMANDS  := trace convert check stereonet section export plan
FUZZ_HARNESSES := reader names project $(FUZZ_COMMANDS)
FUZZ_BIN       := $(FUZZ_HARNESSES:%=$(BUILD)/fuzz/%)
FUZZ_AUX_OBJ   := $(BUILD)/obj/tests/fuzz/run.o $(BUILD)/obj/tests/fuzz/commands.o
FUZZ_DRIVER    ?= $(BUILD)/obj/tests/fuzz/replay.o
CLI_LIB        := $(BUILD)/libcorax-cli.a
FUZZ_SECONDS   ?= 50
FUZZ_CC        ?= clang
FUZZ_SANITIZE  := -fsanitize=fuzzer-no-link,address,undefined -fno-omit-frame-pointer \
                  -fno-sanitize-recover=all -DCORAX_FUZZ -Wno-double-promotion

.SECONDARY:
.PHONY: all deps check unit cli-tests fuzz-replay sanitize fuzz fuzz-run demo demo-run bench \
        install clean

all: $(LIB) $(BIN)

$(BUILD)/obj/%.o: %.c
	@mkdir -p $(dir $@)
	$(CC) $(CFLAGS_ALL) $(if $(filter tests/%,$<),$(TEST_CFLAGS)) -c $< -o $@

$(LIB): $(LIB_OBJ)
	@mkdir -p $(dir $@)
	rm -f $@
	ar rcs $@ $^

$(BIN): $(CLI_OBJ) $(LIB)
	$(CC) $(LDFLAGS_ALL) -o $@ $(CLI_OBJ) $(LIB) $(PKG_LIBS)

$(BUILD)/tests/%: $(BUILD)/obj/tests/%.o $(TEST_AUX_OBJ) $(LIB)
	@mkdir -p $(dir $@)
	$(CC) $(LDFLAGS_ALL) -o $@ $< $(TEST_AUX_OBJ) $(LIB) $(TEST_LIBS) $(PKG_LIBS)

# The commands without main, for harnesses that run them in-process.
$(CLI_LIB): $(filter-out %/main.o,$(CLI_OBJ))
	@mkdir -p $(dir $@)
	rm -f $@
	ar rcs $@ $^

$(FUZZ_COMMANDS:%=$(BUILD)/obj/tests/fuzz/fuzz_%.o): $(BUILD)/obj/tests/fuzz/fuzz_%.o: \
    tests/fuzz/command.c
	@mkdir -p $(dir $@)
	$(CC) $(CFLAGS_ALL) -DFUZZ_COMMAND='"$*"' -c $< -o $@

$(BUILD)/fuzz/%: $(BUILD)/obj/tests/fuzz/fuzz_%.o $(FUZZ_AUX_OBJ) $(filter %.o,$(FUZZ_DRIVER)) \
    $(CLI_LIB) $(LIB)
	@mkdir -p $(dir $@)
	$(CC) $(LDFLAGS_ALL) -o $@ $< $(FUZZ_AUX_OBJ) $(FUZZ_DRIVER) $(CLI_LIB) $(LIB) $(PKG_LIBS)

$(BUILD)/bench/%: $(BUILD)/obj/bench/%.o $(LIB)
	@mkdir -p $(dir $@)
	$(CC) $(LDFLAGS_ALL) -o $@ $< $(LIB) $(PKG_LIBS)

$(BUILD)/tools/%: $(BUILD)/obj/tools/%.o $(LIB)
	@mkdir -p $(dir $@)
	$(CC) $(LDFLAGS_ALL) -o $@ $< $(LIB) $(PKG_LIBS)

# Make sure the Debian build dependencies are there (installs them, or says how).
deps:
	@.ci/deps

# The whole suite: unit tests (cmocka), command-line cases, and the fuzzing
# harnesses over their seed corpus.
check: deps
	@$(MAKE) --no-print-directory unit cli-tests fuzz-replay

unit: $(TESTS)
	@set -e; for t in $(TESTS); do echo "== $$t"; $$t; done

cli-tests: $(BIN) $(TOOLS)
	@CORAX=$(abspath $(BIN)) BUILD=$(abspath $(BUILD)) tests/cli/run.sh

fuzz-replay: $(FUZZ_BIN)
	@set -e; for h in $(FUZZ_HARNESSES); do \
	    echo "== $(BUILD)/fuzz/$$h tests/fuzz/corpus/$$h"; \
	    $(BUILD)/fuzz/$$h tests/fuzz/corpus/$$h 2> $(BUILD)/fuzz/$$h.log || \
	        { tail -n 40 $(BUILD)/fuzz/$$h.log; exit 1; }; \
	    tail -n 1 $(BUILD)/fuzz/$$h.log; \
	done

# The same suite built with AddressSanitizer and UndefinedBehaviorSanitizer.
sanitize: deps
	@$(MAKE) --no-print-directory BUILD=build-sanitize OPT="-O1 -g" \
	    SANITIZE="-fsanitize=address,undefined -fno-omit-frame-pointer -fno-sanitize-recover=all" \
	    unit cli-tests fuzz-replay

# Fuzz every harness with libFuzzer for FUZZ_SECONDS each, one at a time
# (about 10 minutes with the default 50), in build-fuzz/: needs clang and
# libFuzzer (Debian: apt-get install clang libclang-rt-14-dev libomp-dev).
# Findings go to build-fuzz/findings/, the corpus grows in build-fuzz/corpus/.
fuzz: deps
	@printf 'int LLVMFuzzerTestOneInput(const char *d, long n) { return !d + !n; }\n' | \
	    $(FUZZ_CC) -x c -fsanitize=fuzzer,address -fopenmp -o /dev/null - >/dev/null 2>&1 || \
	    { echo "make fuzz needs clang, libFuzzer and OpenMP for clang:" \
	      "apt-get install clang libclang-rt-14-dev libomp-dev" >&2; exit 1; }
	@$(MAKE) --no-print-directory BUILD=build-fuzz CC=$(FUZZ_CC) OPT="-O1 -g" \
	    SANITIZE="$(FUZZ_SANITIZE)" FUZZ_DRIVER=-fsanitize=fuzzer fuzz-run

fuzz-run: $(FUZZ_BIN)
	@BUILD=$(abspath $(BUILD)) FUZZ_SECONDS=$(FUZZ_SECONDS) tests/fuzz/fuzz.sh $(FUZZ_HARNESSES)

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

clean:
	rm -rf build build-sanitize build-fuzz demo-output

-include $(shell find $(BUILD)/obj -name '*.d' 2>/dev/null)
