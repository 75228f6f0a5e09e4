# corax: build, test, demo, benchmark and install.
# Plain make with pkg-config; see DEVELOPERS.md.

CC      ?= cc
PREFIX  ?= /usr/local
LIBDIR  ?= $(PREFIX)/lib
MANDIR  ?= $(PREFIX)/share/man
# where `make install` puts the Python module (Debian's python3 looks in
# /usr/lib/python3/dist-packages; for another PREFIX, set PYTHONPATH)
PYTHONDIR ?= $(PREFIX)/lib/python3/dist-packages
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
# GDAL is not linked: src/gis/ogr.c loads it (dlopen) when a GIS file is first
# asked for, by the soname of the GDAL it is built against, so that commands
# that write no GIS file do not pay for loading its libraries. Tests that read
# GIS files back link it themselves.
PKG_LIBS   := $(shell pkg-config --libs $(filter-out gdal,$(PKGS)) 2>/dev/null) -lcsv -lm -ldl
GDAL_LIBS  := $(shell pkg-config --libs gdal 2>/dev/null)
GDAL_SONAME := $(shell objdump -p $(shell $(CC) -print-file-name=libgdal.so) 2>/dev/null | \
                 sed -n 's/^ *SONAME *//p')
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
STAGE := $(BUILD)/stage
# The shared library: libcorax.so -> libcorax.so.0 (the soname) ->
# libcorax.so.0.1.0, exporting only the functions of include/corax/*.h
# (tools/export_map.sh writes the version script).
VERSION   := $(shell sed -n 's/^\#define CORAX_VERSION "\(.*\)"/\1/p' include/corax/corax.h)
SOVERSION := 0
SONAME    := libcorax.so.$(SOVERSION)
SO        := $(BUILD)/libcorax.so.$(VERSION)
SO_LINKS  := $(BUILD)/$(SONAME) $(BUILD)/libcorax.so
SO_MAP    := $(BUILD)/libcorax.map
# The library's objects serve the shared library too.
$(LIB_OBJ): PIC := -fPIC -fno-semantic-interposition

# Fuzzing harnesses (tests/fuzz; DEVELOPERS.md): reader, names and project
# from their own files, one per command from command.c. `make check` links
# them with replay.c and runs their seed corpus once; `make fuzz` links them
# with libFuzzer (clang) and fuzzes each for FUZZ_SECONDS.
FUZZ_COMMANDS  := trace convert check stereonet section export plan solve merge
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
.PHONY: all deps check unit cli-tests cycles fuzz-replay sanitize fuzz fuzz-run demo demo-run \
        bench install stage clean

all: $(LIB) $(BIN) $(SO_LINKS)

$(BUILD)/obj/%.o: %.c
	@mkdir -p $(dir $@)
	$(CC) $(CFLAGS_ALL) $(PIC) $(if $(filter tests/%,$<),$(TEST_CFLAGS)) -c $< -o $@

$(COF_SRC): $(COF_DATA) tools/cof_to_c.sh
	@mkdir -p $(dir $@)
	sh tools/cof_to_c.sh $(COF_DATA) > $@.tmp && mv $@.tmp $@

$(BUILD)/obj/gen/magnetic_cof.o: $(COF_SRC)
	@mkdir -p $(dir $@)
	$(CC) $(CFLAGS_ALL) $(PIC) -c $< -o $@

$(LIB): $(LIB_OBJ)
	@mkdir -p $(dir $@)
	rm -f $@
	ar rcs $@ $^

$(SO_MAP): $(LIB_OBJ) $(wildcard include/corax/*.h) tools/export_map.sh
	sh tools/export_map.sh $(LIB_OBJ) > $@.tmp && mv $@.tmp $@

$(SO): $(LIB_OBJ) $(SO_MAP)
	$(CC) $(LDFLAGS_ALL) -shared -Wl,-soname,$(SONAME) -Wl,--version-script=$(SO_MAP) \
	    -Wl,--no-undefined -o $@ $(LIB_OBJ) $(PKG_LIBS)

$(SO_LINKS): $(SO)
	ln -sf $(notdir $(SO)) $(BUILD)/$(SONAME)
	ln -sf $(SONAME) $(BUILD)/libcorax.so

$(BIN): $(CLI_OBJ) $(LIB)
	$(CC) $(LDFLAGS_ALL) -o $@ $(CLI_OBJ) $(LIB) $(PKG_LIBS)

$(BUILD)/tests/%: $(BUILD)/obj/tests/%.o $(TEST_AUX_OBJ) $(LIB)
	@mkdir -p $(dir $@)
	$(CC) $(LDFLAGS_ALL) -o $@ $< $(TEST_AUX_OBJ) $(LIB) $(TEST_LIBS) $(PKG_LIBS) $(GDAL_LIBS)

$(BUILD)/obj/src/gis/ogr.o: CFLAGS_ALL += $(if $(GDAL_SONAME),-DCORAX_GDAL_LIBRARY='"$(GDAL_SONAME)"')

# The jobs' test uses the public API alone: no internal headers, no test
# helpers, only the library.
$(BUILD)/obj/tests/test_jobs.o: CFLAGS_ALL := $(filter-out -Isrc,$(CFLAGS_ALL))
$(BUILD)/tests/test_jobs: $(BUILD)/obj/tests/test_jobs.o $(LIB)
	@mkdir -p $(dir $@)
	$(CC) $(LDFLAGS_ALL) -o $@ $< $(LIB) $(TEST_LIBS) $(PKG_LIBS)

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

# The whole suite: unit tests (cmocka), command-line cases, no circles in
# the code's dependencies, and the fuzzing harnesses over their seed corpus.
check: deps
	@$(MAKE) --no-print-directory unit cli-tests cycles fuzz-replay

unit: $(TESTS)
	@set -e; for t in $(TESTS); do echo "== $$t"; $$t; done

# The shell tests also get the staged install (STAGE, under /usr/local) and
# the compiler and sanitizer flags to build the example with.
cli-tests: $(BIN) $(TOOLS) stage
	@CORAX=$(abspath $(BIN)) BUILD=$(abspath $(BUILD)) STAGE=$(abspath $(STAGE)) \
	    CC="$(CC)" TEST_SANITIZE="$(SANITIZE)" tests/cli/run.sh

# Files, folders and headers that depend on each other in a circle.
cycles: $(LIB_OBJ) $(CLI_OBJ)
	@sh tools/check_cycles.sh $(LIB_OBJ) $(CLI_OBJ)

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
	install -d $(DESTDIR)$(PREFIX)/bin $(DESTDIR)$(LIBDIR)/pkgconfig \
	    $(DESTDIR)$(PREFIX)/include/corax $(DESTDIR)$(MANDIR)/man1 $(DESTDIR)$(MANDIR)/man3 \
	    $(DESTDIR)$(PYTHONDIR)/corax
	install -m 755 $(BIN) $(DESTDIR)$(PREFIX)/bin/corax
	install -m 644 $(LIB) $(DESTDIR)$(LIBDIR)/libcorax.a
	install -m 755 $(SO) $(DESTDIR)$(LIBDIR)/
	ln -sf $(notdir $(SO)) $(DESTDIR)$(LIBDIR)/$(SONAME)
	ln -sf $(SONAME) $(DESTDIR)$(LIBDIR)/libcorax.so
	sed -e 's|@PREFIX@|$(PREFIX)|' -e 's|@LIBDIR@|$(LIBDIR)|' -e 's|@VERSION@|$(VERSION)|' \
	    corax.pc.in > $(DESTDIR)$(LIBDIR)/pkgconfig/corax.pc
	install -m 644 include/corax/*.h $(DESTDIR)$(PREFIX)/include/corax/
	install -m 644 man/corax.1 $(DESTDIR)$(MANDIR)/man1/corax.1
	install -m 644 man/corax.3 $(DESTDIR)$(MANDIR)/man3/corax.3
	install -m 644 python/corax/*.py $(DESTDIR)$(PYTHONDIR)/corax/
	install -d $(DESTDIR)$(PREFIX)/share/corax/magnetic
	install -m 644 $(COF_DATA) data/magnetic/README.md $(DESTDIR)$(PREFIX)/share/corax/magnetic/

# An install into a scratch folder, for the tests of what is installed (the
# example built through pkg-config).
stage: all
	@rm -rf $(STAGE)
	@$(MAKE) --no-print-directory install DESTDIR=$(abspath $(STAGE)) PREFIX=/usr/local \
	    LIBDIR=/usr/local/lib MANDIR=/usr/local/share/man \
	    PYTHONDIR=/usr/local/lib/python3/dist-packages > /dev/null

clean:
	rm -rf build build-sanitize build-fuzz demo-output

-include $(shell find $(BUILD)/obj -name '*.d' 2>/dev/null)
