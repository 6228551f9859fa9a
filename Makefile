# brakelight -- build, test, demo and benchmark.
#
#   make          library, Lua module and runner under build/
#   make demo     install missing Debian packages, build, run the demo recipe
#   make check    install missing Debian packages, build, lint, run every test
#   make bench    timing benchmark (never part of the tests)
#
# Sections: configuration; the core library; the Lua module; the runner;
# tests; reliability (sanitizers, valgrind, fuzzing, sweep); install;
# benchmarks and generators.  Every object file has its dependency file
# (-MMD), so a changed header rebuilds exactly what includes it.

# ---- configuration ---------------------------------------------------------
CC      ?= cc
CFLAGS  ?= -O2
CFLAGS  += -std=c11 -Wall -Wextra -Werror -fPIC -D_POSIX_C_SOURCE=200809L \
           -pthread -MMD -MP
LUAINC   = /usr/include/lua5.4
CPPFLAGS = -Iinclude -Isrc/core -I/usr/include/xraylib
LIBS     = -lgsl -lgslcblas -lxrl -lm -pthread
LUALIB   = -llua5.4
# Extra compiler and linker flags of the instrumented builds (test-asan,
# fuzz-build): each builds the whole tree again in its own directory B.
SAN_FLAGS ?=
CFLAGS   += $(SAN_FLAGS)
LIBS     += $(SAN_FLAGS)

B = build

CORE_SRC = $(sort $(wildcard src/core/*/*.c))
CORE_OBJ = $(CORE_SRC:src/%.c=$(B)/%.o)
BIND_SRC = $(sort $(wildcard src/binding/*.c))
BIND_OBJ = $(BIND_SRC:src/%.c=$(B)/%.o)
RUN_SRC  = $(sort $(wildcard src/runner/*.c))
RUN_OBJ  = $(RUN_SRC:src/%.c=$(B)/%.o)
TEST_SRC = $(sort $(wildcard tests/test_*.c))
TEST_BIN = $(TEST_SRC:tests/%.c=$(B)/%)
REF_SRC  = $(sort $(wildcard tests/ref/*.c))
REF_OBJ  = $(REF_SRC:tests/ref/%.c=$(B)/ref/%.o)

LIB    = $(B)/libbrakelight.a
MODULE = $(B)/brakelight.so
RUNNER = $(B)/brakelight

.PHONY: all deps demo check test lint clean
# keep the reference objects between test builds
.SECONDARY:

all: $(LIB) $(MODULE) $(RUNNER) lua-hosts

deps:
	@bash scripts/install-deps.sh

demo: deps
	@$(MAKE) --no-print-directory all
	./$(RUNNER) lua/recipes/demo.lua

# The build first (make -j2), then lint and the test targets CHECK_JOBS at a
# time (default 2, the two cores), each one's output printed whole when
# it ends (--output-sync=target); the longest ones come first in test's
# list, so that the short ones fill the gaps.
CHECK_JOBS ?= 2
check: deps
	@$(MAKE) --no-print-directory -j$(CHECK_JOBS) all
	@$(MAKE) --no-print-directory -j$(CHECK_JOBS) --output-sync=target lint test

clean:
	rm -rf $(B)

-include $(wildcard $(B)/*.d $(B)/*/*.d $(B)/*/*/*.d)

# ---- the core library (no Lua inside) --------------------------------------
$(B)/core/%.o: src/core/%.c
	@mkdir -p $(@D)
	$(CC) $(CPPFLAGS) $(CFLAGS) -c $< -o $@

# The azimuthal closed form is the hot loop: at -O3 without errno from sqrt
# (never read) GCC vectorizes its per-pole part; 15-20 % faster per point.
# Without trapping math (no FP exception is ever enabled or read) it also
# vectorizes the loops over a panel's nodes that select (the inner maps,
# their exp and expm1); no value changes: no operation is reordered.
$(B)/core/born/kin.o: CFLAGS += -O3 -fno-math-errno -fno-trapping-math
# the electron-target amplitudes: complex products without the C99 Annex G
# inf/nan recovery (a library call per product, 5x the cost; no operand is
# ever infinite there)
# (gcc only: Debian 12's clang, of make fuzz-build, does not know the flag)
$(B)/core/ebrems/amp.o: CFLAGS += -O3 -fno-math-errno \
  $(if $(findstring clang,$(CC)),,-fcx-limited-range)
# the same for the distorted-wave bracket and its Gauss function (their
# complex operands are finite: a non-finite bracket is reported as such)
$(B)/core/distorted/amp.o $(B)/core/distorted/hyp.o: CFLAGS += -O3 \
  -fno-math-errno $(if $(findstring clang,$(CC)),,-fcx-limited-range)

$(LIB): $(CORE_OBJ)
	rm -f $@
	ar rcs $@ $^

# The version, defined once in include/brakelight/bl_version.h (sed on its
# lines "#define BL_VERSION_MAJOR 0" ... "#define BL_VERSION "0.1.0"").
VERSION_H := include/brakelight/bl_version.h
blversion  = $(shell sed -n 's/^.define BL_VERSION$(1)  *\(.*\)/\1/p' $(VERSION_H))
VERSION   := $(patsubst "%",%,$(call blversion,))
V_MAJOR   := $(call blversion,_MAJOR)
V_MINOR   := $(call blversion,_MINOR)
V_PATCH   := $(call blversion,_PATCH)
ifneq ($(VERSION),$(V_MAJOR).$(V_MINOR).$(V_PATCH))
$(error $(VERSION_H): BL_VERSION "$(VERSION)" is not BL_VERSION_MAJOR.MINOR.PATCH = $(V_MAJOR).$(V_MINOR).$(V_PATCH))
endif

# The shared library, from the same (-fPIC) objects: real name
# libbrakelight.so.MAJOR.MINOR.PATCH, soname libbrakelight.so.MAJOR (what a
# program records), and libbrakelight.so for -lbrakelight.  It links its own
# dependencies (--no-undefined checks that none is missing), so ldd shows them.
SONAME = libbrakelight.so.$(V_MAJOR)
SHLIB  = $(B)/libbrakelight.so.$(VERSION)

all: $(SHLIB) $(B)/$(SONAME) $(B)/libbrakelight.so

# (bl_version.h names it: a new version relinks it and remakes the symlinks)
$(SHLIB): $(CORE_OBJ) $(VERSION_H)
	$(CC) -shared -Wl,-soname,$(SONAME) -Wl,--no-undefined -o $@ $(CORE_OBJ) \
	  $(LIBS)

$(B)/$(SONAME): $(SHLIB)
	ln -sf $(<F) $@

$(B)/libbrakelight.so: $(B)/$(SONAME)
	ln -sf $(<F) $@

# ---- the Lua module --------------------------------------------------------
$(B)/binding/%.o: src/binding/%.c
	@mkdir -p $(@D)
	$(CC) $(CPPFLAGS) -I$(LUAINC) $(CFLAGS) -c $< -o $@

$(MODULE): $(BIND_OBJ) $(LIB)
	$(CC) -shared -o $@ $(BIND_OBJ) $(LIB) $(LIBS)

# ---- the runner --------------------------------------------------------------
$(B)/runner/%.o: src/runner/%.c
	@mkdir -p $(@D)
	$(CC) $(CPPFLAGS) -I$(LUAINC) $(CFLAGS) -c $< -o $@

$(RUNNER): $(RUN_OBJ) $(BIND_OBJ) $(LIB)
	$(CC) -o $@ $(RUN_OBJ) $(BIND_OBJ) $(LIB) $(LUALIB) $(LIBS) -Wl,-E

# ---- Lua hosts -------------------------------------------------------------
# The module for every Lua host: build/<host>/brakelight.so for Lua 5.1, 5.2,
# 5.3, 5.4 and LuaJIT 2.1 (build/brakelight.so stays the 5.4 one, and the
# runner stays a Lua 5.4 program).  The core (build/libbrakelight.a) includes
# no Lua header and is shared; only the binding objects (src/binding/) are
# compiled per host, with that host's headers and src/binding/lbl_compat.h bridging
# the API (Debian's compat-5.3 for 5.1, 5.2 and LuaJIT).  A Lua C module
# does not link liblua: the interpreter that loads it provides the API.
# The Lua headers come in with -isystem, so that compat-5.3's static
# functions, compiled into each binding object, are not held to -Werror.
LUA_HOSTS = lua5.1 lua5.2 lua5.3 lua5.4 luajit
LUA_INC_lua5.1 = -isystem /usr/include/lua5.1
LUA_INC_lua5.2 = -isystem /usr/include/lua5.2
LUA_INC_lua5.3 = -isystem /usr/include/lua5.3
LUA_INC_lua5.4 = -isystem /usr/include/lua5.4
# LuaJIT's include directory has no compat-5.3.h: the lua5.1 copy is found
# after LuaJIT's own lua.h (see src/binding/lbl_compat.h)
LUA_INC_luajit = -isystem /usr/include/luajit-2.1 -idirafter /usr/include/lua5.1
XRL_INCDIR    ?= /usr/include
HOST_CPPFLAGS  = -Iinclude -I$(XRL_INCDIR)/xraylib
HOST_MODULES   = $(LUA_HOSTS:%=$(B)/%/brakelight.so)
# luarocks (scripts/brakelight-0.1.0-1.rockspec) passes the include
# directory of the Lua it targets as LUA_INCDIR (to both of its make
# runs): that module is built in build/rock-<last part of LUA_INCDIR>/, so
# a build for another Lua never reuses these objects.  COMPAT53_INCDIR:
# where compat-5.3.h is when LUA_INCDIR has none (LuaJIT); unused for 5.3
# and 5.4
LUA_INCDIR      ?= /usr/include/lua5.4
COMPAT53_INCDIR ?= /usr/include/lua5.1
ROCK_HOST        = rock-$(notdir $(patsubst %/,%,$(LUA_INCDIR)))
LUA_INC_$(ROCK_HOST) = -isystem $(LUA_INCDIR) -idirafter $(COMPAT53_INCDIR)

# lua_host_rules HOST: the binding objects and the module of one host
define lua_host_rules
$(B)/$(1)/%.o: src/%.c
	@mkdir -p $$(@D)
	$$(CC) $$(HOST_CPPFLAGS) $$(LUA_INC_$(1)) $$(CFLAGS) -c $$< -o $$@
$(B)/$(1)/brakelight.so: $$(BIND_SRC:src/%.c=$(B)/$(1)/%.o) $$(LIB)
	$$(CC) -shared -o $$@ $$(BIND_SRC:src/%.c=$(B)/$(1)/%.o) $$(LIB) $$(LIBS)
endef
$(foreach h,$(LUA_HOSTS) $(ROCK_HOST),$(eval $(call lua_host_rules,$(h))))

.PHONY: lua-hosts test-lua-hosts test-rock
lua-hosts: $(HOST_MODULES)

# tests/lua/*.lua once per host, with the host's stock interpreter (named
# as the host: lua5.1 ... luajit) and its module (scripts/run-lua-tests.sh
# --lua INTERP --cpath DIR); tests about the runner itself still start
# build/brakelight.  Every file in LUA_HOST_FULL (lua5.1: compat-5.3 and
# no integer subtype, the host farthest from the runner's Lua 5.4); in
# the others all but LUA_HOST_LEAVE_OUT: the files that only start the
# runner (test_recipes, test_demo: the same in every host) and the
# physics-heavy ones (test_physics, test_integrated, test_c_api: their
# binding calls are those of the other files; the 5.1 API through
# compat-5.3, which LuaJIT shares, is checked with them in lua5.1, the 5.4
# API in the runner).  make test-lua-hosts-full: every file in every host.
# The runner's half of "recipes as through the runner" is computed once
# for all hosts (BL_RECIPES_RUNNER_DIR).
LUA_HOST_FULL      ?= lua5.1
LUA_HOST_LEAVE_OUT ?= test_recipes.lua test_demo.lua test_physics.lua \
                      test_integrated.lua test_c_api.lua test_partial.lua
.PHONY: test-lua-hosts-full
test-lua-hosts: $(HOST_MODULES) $(MODULE) $(RUNNER) $(B)/target_values
	@rm -rf $(B)/hosts-recipes; s=0; for h in $(LUA_HOSTS); do \
	  echo "== Lua host $$h"; \
	  skip="$(LUA_HOST_LEAVE_OUT)"; \
	  case " $(LUA_HOST_FULL) " in *" $$h "*) skip= ;; esac; \
	  BL_TEST_SKIP="$$skip $(BL_TEST_SKIP)" \
	  BL_RECIPES_RUNNER_DIR=$(CURDIR)/$(B)/hosts-recipes \
	    bash scripts/run-lua-tests.sh --lua $$h --cpath $(B)/$$h || s=1; \
	done; rm -rf $(B)/hosts-recipes; exit $$s
test-lua-hosts-full:
	@$(MAKE) --no-print-directory test-lua-hosts LUA_HOST_FULL="$(LUA_HOSTS)"

# the rockspec's build and install targets (build type "make"): the module
# for luarocks' Lua, the helpers, and the runner (a Lua 5.4 program
# whatever Lua luarocks targets); luarocks passes its directories as INST_*
.PHONY: rock-build rock-install-host
rock-build: $(B)/$(ROCK_HOST)/brakelight.so $(RUNNER)
rock-install-host: rock-build
	install -d $(INST_LIBDIR) $(INST_LUADIR)/brakelight $(INST_BINDIR)
	install -m 755 $(B)/$(ROCK_HOST)/brakelight.so $(INST_LIBDIR)/brakelight.so
	install -m 644 lua/brakelight/*.lua $(INST_LUADIR)/brakelight/
	install -m 755 $(RUNNER) $(INST_BINDIR)/brakelight

# luarocks make with Debian's luarocks as it comes (it targets 5.1 on
# Debian 12), then for the other Luas it is set up for, each into a scratch
# tree, offline; then require the installed module and a helper with that
# Lua (scripts/check-rock.sh)
ROCK_LUAS = 5.2 5.3 5.4
test-rock: $(RUNNER)
	@bash scripts/check-rock.sh
	@set -e; for v in $(ROCK_LUAS); do \
	  LUAROCKS="luarocks --lua-version $$v" bash scripts/check-rock.sh; done

# ---- tests -------------------------------------------------------------------
# Every part of the suite; make check runs them all with lint, two at a
# time, the longest first (measured on two cores: DEVELOPERS.md, "Test").
.PHONY: test-c test-lua test-embed test-install
test: test-asan valgrind test-lua-hosts test-lua-asan test-c fuzz-smoke \
      test-lua sweep-smoke test-install test-slurm test-rock test-tsan \
      test-hepmc3 test-embed

# The core must not know Lua: no file of src/core/ or include/brakelight/bl_*
# includes a Lua header.  Then static analysis: cppcheck, gcc -fanalyzer and
# clang's analyzer over the core, cppcheck and -fanalyzer over the binding;
# every finding is fatal: fix it or suppress it inline with its reason.
# cppcheck reads the binding with __GNUC__ defined, so that it sees that the
# raising helpers (LBL_RAISES) never return.  About 25 s on two cores.
.PHONY: lint-markers lint-lua-free lint-cppcheck lint-analyzer lint-clang
lint: lint-markers lint-lua-free lint-cppcheck lint-analyzer lint-clang

# no merge-conflict marker left in a tracked file
lint-markers:
	@! git grep -n -E '^(<<<<<<< |>>>>>>> |=======$$)' -- . 2>/dev/null \
	  || { echo "lint: merge-conflict markers in the files above"; exit 1; }
	@echo "lint: no merge-conflict markers"

lint-lua-free:
	@! grep -rl 'lua\.h\|lauxlib\.h' src/core include/brakelight/bl_*.h \
	  include/brakelight.h \
	  || { echo "lint: a core file (src/core/, include/brakelight/bl_*.h) includes Lua"; exit 1; }
	@echo "lint: core files are free of Lua"

CPPCHECK = cppcheck -j2 --enable=warning,performance,portability \
           --inline-suppr -q --std=c11 --error-exitcode=1 -Iinclude \
           -Isrc/core -D_POSIX_C_SOURCE=200809L \
           --template='{file}:{line}: {severity}: {message} [{id}]'
ANALYZE  = gcc -fanalyzer -O2 -std=c11 -Wall -Wextra -Werror \
           -D_POSIX_C_SOURCE=200809L -pthread $(CPPFLAGS)

lint-cppcheck:
	@$(CPPCHECK) src/core && echo "lint: cppcheck: core clean"
	@$(CPPCHECK) -D__GNUC__ src/binding \
	  && echo "lint: cppcheck: binding clean"

lint-analyzer:
	@for f in $(CORE_SRC); do $(ANALYZE) -c $$f -o /dev/null || exit 1; done
	@echo "lint: gcc -fanalyzer: core clean"
	@for f in $(BIND_SRC); do $(ANALYZE) -I$(LUAINC) -c $$f -o /dev/null \
	  || exit 1; done; echo "lint: gcc -fanalyzer: binding clean"

# clang's static analyzer (what scan-build runs) over the core: it found
# the unset result in src/core/methods/nucsize.c (nucpoint)
lint-clang:
	@for f in $(CORE_SRC); do \
	  out=$$(clang --analyze -Xclang -analyzer-output=text $(CPPFLAGS) \
	    -std=c11 -D_POSIX_C_SOURCE=200809L $$f -o /dev/null 2>&1); \
	  if [ -n "$$out" ]; then echo "$$out"; exit 1; fi; done
	@echo "lint: clang analyzer: core clean"

# Criterion suites, one per room, core only
$(B)/ref/%.o: tests/ref/%.c
	@mkdir -p $(@D)
	$(CC) $(CPPFLAGS) $(CFLAGS) -Itests/ref -c $< -o $@

$(B)/test_%: tests/test_%.c $(REF_OBJ) $(LIB)
	$(CC) $(CPPFLAGS) $(CFLAGS) -Itests/ref -o $@ $< $(REF_OBJ) $(LIB) \
	  -lcriterion $(LIBS)

TEST_JOBS ?= 2
test-c: $(TEST_BIN)
	@set -e; for t in $(TEST_BIN); do echo "== $$t"; ./$$t --jobs $(TEST_JOBS); done

# a program of the C API alone (tests/capi/), compared with the module by
# tests/lua/test_c_api.lua
$(B)/target_values: tests/capi/target_values.c $(LIB)
	$(CC) $(CPPFLAGS) $(CFLAGS) -o $@ $< $(LIB) $(LIBS)

# tests/lua/*.lua through the runner, and the stock interpreter
test-lua: $(MODULE) $(RUNNER) $(B)/target_values
	@bash scripts/run-lua-tests.sh

# HepMC3 files of brakelight.events read back by the HepMC3 library itself
# (Debian libhepmc3-dev; a small C++ reader, tests/hepmc3/read_hepmc3.cc)
.PHONY: test-hepmc3
CXX ?= c++
$(B)/read_hepmc3: tests/hepmc3/read_hepmc3.cc
	@mkdir -p $(@D)
	$(CXX) -O2 -std=c++11 -Wall -Wextra -Werror -o $@ $< -lHepMC3

test-hepmc3: $(B)/read_hepmc3 $(RUNNER)
	@mkdir -p $(B)/hepmc3
	./$(RUNNER) tests/hepmc3/roundtrip.lua ./$(B)/read_hepmc3 $(B)/hepmc3

# a C program that embeds Lua and loads the module (tests/embed/embed.c)
$(B)/embed: tests/embed/embed.c
	@mkdir -p $(@D)
	$(CC) $(CPPFLAGS) -I$(LUAINC) $(CFLAGS) -o $@ $< $(LUALIB) -lm -ldl -Wl,-E

test-embed: $(B)/embed $(MODULE)
	@./$(B)/embed "$(CURDIR)/"

# make install into a scratch prefix, then use the installed runner and the
# installed module from the stock interpreter
test-install: all
	@bash scripts/check-install.sh

# The README's Slurm job array on a real single-node cluster started by the
# test (munged, slurmctld, slurmd as its own processes; Debian's packages
# installed first by install-deps.sh --slurm): merged shards against an
# unsharded run, and one task cancelled and resubmitted alone.  Says why
# and exits 0 ("skipped") where the daemons cannot run.  About 20 s.
.PHONY: test-slurm
test-slurm: $(RUNNER)
	@bash scripts/check-slurm.sh

# ---- reliability -------------------------------------------------------------
ASAN_DIR   = build/asan
ASAN_FLAGS = -O1 -g -fno-omit-frame-pointer -fsanitize=address,undefined \
             -fno-sanitize-recover=all
FUZZ_DIR   = build/fuzz
# the call budget of one integral is lowered so that a slow but legitimate
# point costs well under the per-input timeout (tests/fuzz/fuzz_lua.c); the
# exact bound electron term's (src/core/ebrems/dcs.c) more, since each of
# its calls costs about 100 Born integrand calls and an energy_loss of a
# projectile above the table's 10 GeV takes one per point of the integral
# (a fuzz input timed out at 60 s there)
FUZZ_FLAGS = -g -fno-omit-frame-pointer -fsanitize=fuzzer-no-link \
             -fsanitize=address,undefined -fno-sanitize-recover=all \
             -DCALL_BUDGET=200000UL -DEB_CALL_BUDGET=2000UL
# the per-input timeout: 60 s (the slowest legitimate input found, a
# distorted-wave fully differential value at zZ alpha/beta = 3e4, took 19 s
# under sanitizers on a loaded machine, 1.6 s in the normal build)
FUZZ_LUA_OPTS     = -timeout=60 -max_len=512 -rss_limit_mb=2048
FUZZ_FORMULA_OPTS = -timeout=10 -max_len=800
FUZZ_SMOKE_SECS  ?= 30

.PHONY: test-asan fuzz-build fuzz-smoke fuzz valgrind sweep sweep-run \
        sweep-smoke test-lua-asan asan-lua-build

# the Criterion suites under AddressSanitizer and UBSan (gcc); asan-c-build
# builds them (and so the core) in build/asan, which test-lua-asan's build
# then reuses: under make -j2 the two never build the same files at once
.PHONY: asan-c-build
asan-c-build:
	@$(MAKE) --no-print-directory B=$(ASAN_DIR) SAN_FLAGS="$(ASAN_FLAGS)" \
	  $(TEST_SRC:tests/%.c=$(ASAN_DIR)/%)
# One test at a time: Criterion 2.4's own runner leaks 48 bytes (a calloc
# inside libcriterion.so.3, no frame of ours) under --jobs 2, which
# LeakSanitizer reports; a suppression by library would hide every leak of
# ours too, as each test runs below Criterion's frames.
test-asan: asan-c-build
	@$(MAKE) --no-print-directory B=$(ASAN_DIR) SAN_FLAGS="$(ASAN_FLAGS)" \
	  TEST_JOBS=1 test-c

# The Lua tests under AddressSanitizer and UBSan (gcc): the core, the
# module, the runner and target_values built in build/asan (the same
# recursive make), then scripts/run-lua-tests.sh --build build/asan: every
# tests/lua/*.lua through the sanitized runner (and the runners, -j workers
# and target_values that the tests start), the stock lua5.4 loading the
# sanitized module with libasan preloaded, and the runner's own checks.
# Any ASan or UBSan report or leak ends the process with a non-zero status,
# which fails that test.  None is needed with Debian 12's Lua, GSL and
# xraylib; a leak of theirs that cannot be avoided goes into
# scripts/lsan.supp (a comment per entry), used when the file exists.
# -O1 with the sanitizers makes gcc see a possible truncation in an
# snprintf of the binding that -O2 does not (src/binding/lmaterial.c,
# mixname: truncation to BL_MATERIAL_NAMELEN is intended): a warning here.
# About 40 s from a clean build/asan on two cores.
ASAN_LUA_FLAGS = $(ASAN_FLAGS) -Wno-error=format-truncation
ASAN_RUN_ENV   = ASAN_OPTIONS="detect_leaks=1:halt_on_error=1:detect_stack_use_after_return=1:strict_string_checks=1:check_initialization_order=1 $(ASAN_OPTIONS)" \
                 LSAN_OPTIONS="$(if $(wildcard scripts/lsan.supp),suppressions=$(CURDIR)/scripts/lsan.supp:print_suppressions=0) $(LSAN_OPTIONS)" \
                 UBSAN_OPTIONS="print_stacktrace=1:halt_on_error=1 $(UBSAN_OPTIONS)"

asan-lua-build: asan-c-build
	@$(MAKE) --no-print-directory B=$(ASAN_DIR) SAN_FLAGS="$(ASAN_LUA_FLAGS)" \
	  $(ASAN_DIR)/brakelight.so $(ASAN_DIR)/brakelight $(ASAN_DIR)/target_values

test-lua-asan: asan-lua-build
	@$(ASAN_RUN_ENV) bash scripts/run-lua-tests.sh --build $(ASAN_DIR)

# libFuzzer harnesses (clang): tests/fuzz/fuzz_<name>.c
$(B)/fuzz_%: tests/fuzz/fuzz_%.c $(BIND_OBJ) $(LIB)
	$(CC) $(CPPFLAGS) -I$(LUAINC) $(CFLAGS) -fsanitize=fuzzer -o $@ $< \
	  $(BIND_OBJ) $(LIB) $(LUALIB) $(LIBS)

fuzz-build:
	@$(MAKE) --no-print-directory B=$(FUZZ_DIR) CC=clang \
	  SAN_FLAGS="$(FUZZ_FLAGS)" $(FUZZ_DIR)/fuzz_lua $(FUZZ_DIR)/fuzz_formula

# 2 x FUZZ_SMOKE_SECS seconds from the seed corpora in tests/fuzz/ (new
# inputs go to build/fuzz/corpus_*, never into the source tree)
fuzz-smoke: fuzz-build
	@mkdir -p $(FUZZ_DIR)/corpus_lua $(FUZZ_DIR)/corpus_formula
	./$(FUZZ_DIR)/fuzz_formula $(FUZZ_FORMULA_OPTS) \
	  -max_total_time=$(FUZZ_SMOKE_SECS) -print_final_stats=1 \
	  -artifact_prefix=$(FUZZ_DIR)/ \
	  $(FUZZ_DIR)/corpus_formula tests/fuzz/formula
	./$(FUZZ_DIR)/fuzz_lua $(FUZZ_LUA_OPTS) \
	  -max_total_time=$(FUZZ_SMOKE_SECS) -print_final_stats=1 \
	  -artifact_prefix=$(FUZZ_DIR)/ \
	  $(FUZZ_DIR)/corpus_lua tests/fuzz/lua

# long run of one harness: make fuzz FUZZ=lua FUZZ_SECS=600; FUZZ_ARGS adds
# libFuzzer options, e.g. "-fork=1 -ignore_crashes=1" to go on after a
# crash (each one saved as build/fuzz/crash-*)
FUZZ      ?= lua
FUZZ_SECS ?= 600
FUZZ_ARGS ?=
fuzz: fuzz-build
	@mkdir -p $(FUZZ_DIR)/corpus_$(FUZZ)
	./$(FUZZ_DIR)/fuzz_$(FUZZ) $(if $(filter lua,$(FUZZ)),$(FUZZ_LUA_OPTS),$(FUZZ_FORMULA_OPTS)) \
	  -max_total_time=$(FUZZ_SECS) -print_final_stats=1 $(FUZZ_ARGS) \
	  -artifact_prefix=$(FUZZ_DIR)/ $(FUZZ_DIR)/corpus_$(FUZZ) tests/fuzz/$(FUZZ)

# the Lua-level tests under valgrind memcheck (scripts/valgrind-lua.sh)
valgrind: all
	@bash scripts/valgrind-lua.sh

# numerical health over the parameter space (scripts/sweep.lua): two
# processes share the points, then their worst cases are merged into
# $(SWEEP_DIR)/worst-<points>.txt.  sweep-smoke (2000 points) is in check.
SWEEP_DIR  = build/sweep
SWEEP_SEED ?= 6
sweep-run: all
	@mkdir -p $(SWEEP_DIR)
	@./$(RUNNER) scripts/sweep.lua --points $(SWEEP_POINTS) --seed $(SWEEP_SEED) \
	    --part 1/2 --out $(SWEEP_DIR)/part1-$(SWEEP_POINTS).txt & p1=$$!; \
	  ./$(RUNNER) scripts/sweep.lua --points $(SWEEP_POINTS) --seed $(SWEEP_SEED) \
	    --part 2/2 --out $(SWEEP_DIR)/part2-$(SWEEP_POINTS).txt; s=$$?; \
	  wait $$p1 || s=1; \
	  ./$(RUNNER) scripts/sweep.lua --seed $(SWEEP_SEED) \
	    --out $(SWEEP_DIR)/worst-$(SWEEP_POINTS).txt --merge \
	    $(SWEEP_DIR)/part1-$(SWEEP_POINTS).txt $(SWEEP_DIR)/part2-$(SWEEP_POINTS).txt \
	    || s=1; exit $$s

sweep:
	@$(MAKE) --no-print-directory sweep-run SWEEP_POINTS=100000
sweep-smoke:
	@$(MAKE) --no-print-directory sweep-run SWEEP_POINTS=2000

# ThreadSanitizer: tests/tsan/tsan_spectra.c, spectra of every method on several application
# threads at once, each spectrum itself threaded, against serial results bit
# for bit.  The core is built again with gcc's -fsanitize=thread in
# build/tsan (a recursive make, as test-asan does); a TSan report stops the
# program (halt_on_error) with a non-zero status.  Part of make test.
TSAN_DIR   = build/tsan
TSAN_FLAGS = -O1 -g -fno-omit-frame-pointer -fsanitize=thread

.PHONY: test-tsan tsan-build

$(B)/tsan_%: tests/tsan/tsan_%.c $(LIB)
	$(CC) $(CPPFLAGS) $(CFLAGS) -o $@ $< $(LIB) $(LIBS)

tsan-build:
	@$(MAKE) --no-print-directory B=$(TSAN_DIR) CC=gcc \
	  SAN_FLAGS="$(TSAN_FLAGS)" $(TSAN_DIR)/tsan_spectra $(TSAN_DIR)/tsan_sampler

# (tsan_sampler.c: one event sampler on three application threads at once)
test-tsan: tsan-build
	TSAN_OPTIONS="halt_on_error=1 $(TSAN_OPTIONS)" ./$(TSAN_DIR)/tsan_spectra
	TSAN_OPTIONS="halt_on_error=1 $(TSAN_OPTIONS)" ./$(TSAN_DIR)/tsan_sampler

# ---- install -----------------------------------------------------------------
# make install PREFIX=... [DESTDIR=...]: static and shared library,
# pkg-config file (written with the real PREFIX, never DESTDIR), headers, Lua
# module, Lua helpers and recipes, runner, man pages (brakelight(1) of the
# runner, brakelight(3) of the C library).  make uninstall (same
# PREFIX and DESTDIR) removes exactly these, then the directories that are
# left empty (never PREFIX itself).  Without DESTDIR, install ends with
# $(LDCONFIG) (refreshes the loader's cache; fails quietly when not root).
.PHONY: install uninstall
PREFIX  ?= /usr/local
LUAVER   = 5.4
LDCONFIG ?= ldconfig
BINDIR   = $(DESTDIR)$(PREFIX)/bin
LIBDIR   = $(DESTDIR)$(PREFIX)/lib
PCDIR    = $(LIBDIR)/pkgconfig
INCDIR   = $(DESTDIR)$(PREFIX)/include
CMODDIR  = $(DESTDIR)$(PREFIX)/lib/lua/$(LUAVER)
LMODDIR  = $(DESTDIR)$(PREFIX)/share/lua/$(LUAVER)
SHAREDIR = $(DESTDIR)$(PREFIX)/share/brakelight
MANDIR   = $(DESTDIR)$(PREFIX)/share/man/man1
MAN3DIR  = $(DESTDIR)$(PREFIX)/share/man/man3
# every directory install may create, deepest first (uninstall removes the
# empty ones)
INSTDIRS = $(MANDIR) $(MAN3DIR) $(DESTDIR)$(PREFIX)/share/man \
           $(SHAREDIR)/lua/recipes \
           $(SHAREDIR)/lua $(SHAREDIR) $(LMODDIR)/brakelight $(LMODDIR) \
           $(DESTDIR)$(PREFIX)/share/lua $(DESTDIR)$(PREFIX)/share $(CMODDIR) \
           $(DESTDIR)$(PREFIX)/lib/lua $(PCDIR) $(LIBDIR) \
           $(INCDIR)/brakelight $(INCDIR) $(BINDIR)

install: all $(B)/brakelight.1 $(B)/brakelight.3
	install -d $(BINDIR) $(LIBDIR) $(PCDIR) $(INCDIR)/brakelight $(CMODDIR) \
	  $(LMODDIR)/brakelight $(SHAREDIR)/lua/recipes $(MANDIR) $(MAN3DIR)
	install -m 755 $(RUNNER) $(BINDIR)/brakelight
	install -m 644 $(LIB) $(LIBDIR)/libbrakelight.a
	install -m 755 $(SHLIB) $(LIBDIR)/$(notdir $(SHLIB))
	ln -sf $(notdir $(SHLIB)) $(LIBDIR)/$(SONAME)
	ln -sf $(SONAME) $(LIBDIR)/libbrakelight.so
	sed -e 's|@PREFIX@|$(PREFIX)|g' -e 's|@VERSION@|$(VERSION)|g' \
	  scripts/brakelight.pc.in > $(B)/brakelight.pc
	install -m 644 $(B)/brakelight.pc $(PCDIR)/brakelight.pc
	install -m 644 include/brakelight.h $(INCDIR)/
	install -m 644 include/brakelight/*.h $(INCDIR)/brakelight/
	install -m 755 $(MODULE) $(CMODDIR)/brakelight.so
	install -m 644 lua/brakelight/*.lua $(LMODDIR)/brakelight/
	install -m 644 lua/recipes/*.lua $(SHAREDIR)/lua/recipes/
	install -m 644 $(B)/brakelight.1 $(MANDIR)/brakelight.1
	install -m 644 $(B)/brakelight.3 $(MAN3DIR)/brakelight.3
	@if [ -z "$(DESTDIR)" ]; then $(LDCONFIG) >/dev/null 2>&1 || true; fi

uninstall:
	rm -f $(BINDIR)/brakelight $(LIBDIR)/libbrakelight.a \
	  $(LIBDIR)/libbrakelight.so $(LIBDIR)/$(SONAME) $(LIBDIR)/$(notdir $(SHLIB)) \
	  $(PCDIR)/brakelight.pc $(CMODDIR)/brakelight.so $(MANDIR)/brakelight.1 \
	  $(MAN3DIR)/brakelight.3 $(INCDIR)/brakelight.h
	rm -rf $(INCDIR)/brakelight $(LMODDIR)/brakelight $(SHAREDIR)
	@for d in $(INSTDIRS); do \
	  if [ -d "$$d" ]; then rmdir --ignore-fail-on-non-empty "$$d"; fi; done

# ---- versioned files ---------------------------------------------------------
# The man pages (brakelight.1: the runner; brakelight.3: the C API) and the
# rockspec carry the version of bl_version.h: made from their templates
# scripts/*.in (@VERSION@), by `make`.
ROCKSPEC = $(B)/brakelight-$(VERSION)-1.rockspec

all: $(B)/brakelight.1 $(B)/brakelight.3 $(ROCKSPEC)

$(B)/brakelight.1: scripts/brakelight.1.in $(VERSION_H)
	@mkdir -p $(@D)
	sed 's|@VERSION@|$(VERSION)|g' $< > $@

$(B)/brakelight.3: scripts/brakelight.3.in $(VERSION_H)
	@mkdir -p $(@D)
	sed 's|@VERSION@|$(VERSION)|g' $< > $@

$(ROCKSPEC): scripts/brakelight.rockspec.in $(VERSION_H)
	@mkdir -p $(@D)
	sed 's|@VERSION@|$(VERSION)|g' $< > $@

# ---- benchmarks and generators ---------------------------------------------
.PHONY: bench bench-erow hf-table nuc-table eb-table eb-table-mu eb-table-h error-sweep error-compare error-ref dw-positron pw-compare continuity \
        continuity-full
# The fixed earlier commit that make bench and make error-ref build in a git
# worktree build/base/<commit> (the main before issue 14's integrator).
BENCH_BASE ?= a2be9749fe3fb2195e4251fa39d1db24ff8cf650
bench: all
	@BENCH_BASE=$(BENCH_BASE) bash scripts/bench.sh

# The exact-Born error sweep (scripts/error_sweep.c) against the reference
# set tests/data/born-ref.txt: share of points within rtol and median
# estimate/true error at rtol 1e-2, 1e-3, 1e-4, 1e-6 (about 1 min on two
# cores).  Not part of check.
ERROR_REF    = tests/data/born-ref.txt
ERROR_POINTS ?= 10000
ERROR_SEED   ?= 14
$(B)/error_sweep: scripts/error_sweep.c $(LIB)
	$(CC) -std=c11 -O2 -Wall -Wextra -D_POSIX_C_SOURCE=200809L -Iinclude \
	  -I/usr/include/xraylib -o $@ $< $(LIB) $(LIBS)
error-sweep: $(B)/error_sweep
	./$(B)/error_sweep run -i $(ERROR_REF) -o $(B)/error-sweep.out

# Integrals over k of projectiles whose bound electron term is exact per
# point (target/erow.c): this tree's runner against 43edcdf's, case by case
# alternating (scripts/bench_erow.sh; about 10 min).  Not part of bench.
bench-erow: all
	sh scripts/bench_erow.sh

# CPU time of the radial Dirac functions per kappa (partial/radial.c): Au,
# 2e4 points up to rc, E = 1.02, 3, 40 and a muon at E = 3 (about 10 s).
# Not part of bench.
.PHONY: bench-pwfast
$(B)/bench_pwfast: scripts/bench_pwfast.c $(LIB)
	$(CC) $(CPPFLAGS) $(CFLAGS) -o $@ $< $(LIB) $(LIBS)
bench-pwfast: $(B)/bench_pwfast
	./$(B)/bench_pwfast $(PWFAST_ARGS)

.PHONY: bench-pwradial
$(B)/bench_pwradial: scripts/bench_pwradial.c $(LIB)
	$(CC) $(CPPFLAGS) $(CFLAGS) -o $@ $< $(LIB) $(LIBS)
bench-pwradial: $(B)/bench_pwradial
	./$(B)/bench_pwradial

# Calls at equal true error against BENCH_BASE (issue 14, item 2): both
# trees over the reference set on one ladder of rtols, then error_sweep
# compare (BASE built in its worktree as make bench does; about 3 min on
# two cores, most of it BASE's sweep).  Not part of check.
ERROR_BASE_BUILD = wt=$$(BENCH_BASE=$(BENCH_BASE) bash scripts/bench.sh --base-only); \
	$(CC) -std=c11 -O2 -Wall -Wextra -D_POSIX_C_SOURCE=200809L -Iinclude \
	  -I/usr/include/xraylib -o $(B)/error_sweep_base scripts/error_sweep.c \
	  $$wt/build/libbrakelight.a $(LIBS)
ERROR_LADDER ?= 1e-2,3e-3,1e-3,3e-4,1e-4,3e-5,1e-5,3e-6,1e-6
error-compare: $(B)/error_sweep
	@set -e; $(ERROR_BASE_BUILD); \
	./$(B)/error_sweep run -r $(ERROR_LADDER) -i $(ERROR_REF) \
	  -o $(B)/error-ladder.out; \
	./$(B)/error_sweep_base run -r $(ERROR_LADDER) -i $(ERROR_REF) \
	  -o $(B)/error-ladder-base.out > $(B)/error-ladder-base.log; \
	./$(B)/error_sweep compare $(B)/error-ladder-base.out $(B)/error-ladder.out

# The positron/electron radiative-loss ratio of method "distorted" against
# Kim et al. 1986 (scripts/dw-positron-ratio.c; about 20 s).  Not in check.
# DW_POSITRON_ARGS="-p 0.1" adds the exact partial waves up to 100 keV
# (about 10 minutes on one core); "-p 1 -Z 79" Au up to 1 MeV.
$(B)/dw-positron-ratio: scripts/dw-positron-ratio.c $(LIB) $(B)/ref/kim1986.o
	$(CC) -std=c11 -O2 -Wall -Wextra -D_POSIX_C_SOURCE=200809L -Iinclude \
	  -Isrc/core -Itests/ref -I/usr/include/xraylib -o $@ $< \
	  $(B)/ref/kim1986.o $(LIB) $(LIBS)
DW_POSITRON_ARGS ?=
dw-positron: $(B)/dw-positron-ratio
	./$(B)/dw-positron-ratio $(DW_POSITRON_ARGS)

# dsigma/dk of e- and e+ by the distorted waves and Born against the exact
# partial waves (scripts/pw-dw-compare.c): Z = 6, 13, 29, 50, 79, 92 at
# 10 and 100 keV by default (about 1 minute); PW_COMPARE_ARGS="-T 1
# -Z 29,79" for 1 MeV (minutes per point at small y).  Not in check.
$(B)/pw-dw-compare: scripts/pw-dw-compare.c $(LIB)
	$(CC) -std=c11 -O2 -Wall -Wextra -D_POSIX_C_SOURCE=200809L -Iinclude \
	  -Isrc/core -I/usr/include/xraylib -o $@ $< $(LIB) $(LIBS)
PW_COMPARE_ARGS ?=
pw-compare: $(B)/pw-dw-compare
	./$(B)/pw-dw-compare $(PW_COMPARE_ARGS)

# Steps of dsigma/dk along T, method auto against distorted, and the
# e-/e+ radiative energy loss in C, Cu, W, Pb, U rising with T (scripts/continuity.c;
# CONT_PER_DECADE points per decade up to CONT_TMAX MeV, the energy loss at
# 4 per decade up to CONT_ETMAX MeV; several minutes at the defaults).  Not
# in check (test_target's energy_loss_rises is its coarse form).
CONT_PER_DECADE ?= 10
CONT_TMAX ?= 1e4
CONT_ETMAX ?= 1e9
$(B)/continuity: scripts/continuity.c $(LIB)
	$(CC) -std=c11 -O2 -Wall -Wextra -D_POSIX_C_SOURCE=200809L -Iinclude \
	  -I/usr/include/xraylib -o $@ $< $(LIB) $(LIBS)
continuity: $(B)/continuity
	./$(B)/continuity -n $(CONT_PER_DECADE) -t $(CONT_TMAX)
	./$(B)/continuity -e -t $(CONT_ETMAX)

# The grid of issue 12 for the default method: 100 points per decade in T
# from 1 keV to 1 PeV at y = 0.3, 0.7, 0.95, 0.99, and 400 points in y at
# one T per decade, e-/e+ on C, Cu, W, Pb, U and mu- on Fe, Pb, in
# CONT_JOBS processes (default: the number of cores); each shard's table
# in build/continuity-full/.  About 1-2 core-hours.  Exit status 1 when a
# row has a step (anomaly above 0.05).
CONT_JOBS ?= $(shell nproc 2>/dev/null || echo 2)
continuity-full: $(B)/continuity
	@mkdir -p $(B)/continuity-full
	@st=0; for mode in "-n 100" "-y 400"; do \
	  tag=$$(echo $$mode | tr -d ' -'); pids=; \
	  for i in $$(seq 1 $(CONT_JOBS)); do \
	    ./$(B)/continuity -a -t 1e9 $$mode -s $$i/$(CONT_JOBS) \
	      > $(B)/continuity-full/$$tag.$$i.txt & pids="$$pids $$!"; \
	  done; \
	  for p in $$pids; do wait $$p || st=1; done; \
	  cat $(B)/continuity-full/$$tag.*.txt; \
	done; exit $$st

# Regenerate the reference set: ERROR_POINTS random points at rtol 1e-10,
# computed with the integrator of BENCH_BASE (GSL's qag, whose estimates
# are pessimistic: independent of the scheme under test), built in its
# worktree as make bench does (about 2 min on two cores).  BASE computes
# the static electron term: the points with atomic electrons on whose
# projectile gets a bound electron table (electrons, muons, and with
# error_sweep gen -k heavy-e every mass from 100 MeV) were recomputed with
# this tree since (see the file's header), and a regeneration with BASE
# makes them stale again.
error-ref:
	@set -e; $(ERROR_BASE_BUILD); \
	./$(B)/error_sweep_base gen -n $(ERROR_POINTS) -s $(ERROR_SEED) \
	  -o $(ERROR_REF)

# Regenerate src/core/models/hf_table.c: Yukawa fits of xraylib's F and S
# for the "hartree-fock" model (about 2 min). Never part of all or check.
hf-table:
	@mkdir -p $(B)
	$(CC) $(CPPFLAGS) $(CFLAGS) -o $(B)/fit-hf scripts/fit-hf.c $(LIBS)
	./$(B)/fit-hf -o src/core/models/hf_table.c

# Regenerate src/core/methods/nuc_table.c: the nuclear-size correction of
# the high-energy method, calibrated on Born integrals (scripts/fit-nucsize.c,
# about 2 min on two cores).  Never part of all or check.
nuc-table: $(LIB)
	@mkdir -p $(B)
	$(CC) $(CPPFLAGS) -Isrc/core $(CFLAGS) -o $(B)/fit-nucsize \
	  scripts/fit-nucsize.c $(LIB) $(LIBS)
	./$(B)/fit-nucsize -j 2 -o src/core/methods/nuc_table.c

# Regenerate src/core/ebrems/eb_table.c: the bound electron term of e-/e+
# as a ratio to the static-charge term (scripts/fit-ebrems.c; about 25 min
# on two cores).  Never part of all or check.
eb-table: $(LIB)
	@mkdir -p $(B)
	$(CC) $(CPPFLAGS) $(CFLAGS) -o $(B)/fit-ebrems scripts/fit-ebrems.c \
	  $(LIB) $(LIBS)
	./$(B)/fit-ebrems -j 2 -o src/core/ebrems/eb_table.c

# Regenerate src/core/ebrems/eb_table_mu.c: the same for mu- and mu+
# (fit-ebrems -u; about 15 min on two cores).  Never part of all or check.
eb-table-mu: $(LIB)
	@mkdir -p $(B)
	$(CC) $(CPPFLAGS) $(CFLAGS) -o $(B)/fit-ebrems scripts/fit-ebrems.c \
	  $(LIB) $(LIBS)
	./$(B)/fit-ebrems -u -j 2 -o src/core/ebrems/eb_table_mu.c

# Regenerate src/core/ebrems/eb_table_h.c: the three charge parts of the
# bound electron term of every other projectile (fit-ebrems -H; about 60 min
# of one core's time: run it with -j 1 or 2).  Never part of all or check.
eb-table-h: $(LIB)
	@mkdir -p $(B)
	$(CC) $(CPPFLAGS) $(CFLAGS) -o $(B)/fit-ebrems scripts/fit-ebrems.c \
	  $(LIB) $(LIBS)
	./$(B)/fit-ebrems -H -j 2 -o src/core/ebrems/eb_table_h.c

# before/after comparison
# make compare-points [BASE=<git rev>] [COMPARE_POINTS=N] [COMPARE_SEED=S]
# Builds BASE in a git worktree build/base/<commit> (its own `make all`, run
# there), runs scripts/compare-points.lua of THIS tree with BASE's runner and
# with ours (in parallel), and compares the two records: exit 1 with the
# first differing points, field by field, if any result, warning, setting or
# error message differs.  Not part of check (it builds a second tree).
# The records stay in build/compare/ (base.txt, here.txt) for a plain diff.
BASE           ?= 80a380536e90fdf664400a6191627b57c7038bf7
COMPARE_POINTS ?= 1000
COMPARE_SEED   ?= 1
COMPARE_DIR     = build/compare
COMPARE_ARGS    = scripts/compare-points.lua --points $(COMPARE_POINTS) \
                  --seed $(COMPARE_SEED)

.PHONY: compare-points
compare-points: $(RUNNER)
	@set -e; \
	rev=$$(git rev-parse --verify -q '$(BASE)^{commit}') \
	  || { echo "compare-points: BASE=$(BASE) is not a commit"; exit 2; }; \
	wt=build/base/$$rev; mkdir -p build/base $(COMPARE_DIR); \
	if [ ! -e $$wt/.git ]; then \
	  git worktree prune; \
	  git worktree add -q --detach -f $$wt $$rev; \
	fi; \
	git -C $$wt checkout -q --detach $$rev; \
	echo "compare-points: building BASE $(BASE) ($$rev) in $$wt"; \
	$(MAKE) --no-print-directory -C $$wt B=build SAN_FLAGS= all \
	  >$(COMPARE_DIR)/base-build.log 2>&1 \
	  || { tail -n 20 $(COMPARE_DIR)/base-build.log; \
	       echo "compare-points: the build of BASE failed"; exit 2; }; \
	echo "compare-points: $(COMPARE_POINTS) points (seed $(COMPARE_SEED)), BASE and here"; \
	s=0; ./$$wt/build/brakelight $(COMPARE_ARGS) --out $(COMPARE_DIR)/base.txt & p=$$!; \
	./$(RUNNER) $(COMPARE_ARGS) --out $(COMPARE_DIR)/here.txt || s=1; \
	wait $$p || s=1; \
	[ $$s = 0 ] || { echo "compare-points: a run failed"; exit 2; }; \
	./$(RUNNER) scripts/compare-points.lua --diff $(COMPARE_DIR)/base.txt \
	  $(COMPARE_DIR)/here.txt --label "BASE $(BASE)"
