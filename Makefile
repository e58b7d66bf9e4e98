# Makefile — build, run, test and benchmark gascycled.
#
# Named intents:
#   make            build the server (build/gascycled) and the core library
#   make run        install what is missing, build, serve on 127.0.0.1:8080
#                   (make run PORT=9090 LISTEN=0.0.0.0 for another port/address)
#   make test       install what is missing, then every test suite (unit,
#                   integration + contract, reference checks, sanitizer build)
#   make sanitize   unit and integration tests under ASan + UBSan
#   make bench      benchmarks (figures printed, never pass/fail on time)
#   make clean
# Sources are found recursively: a new .c file anywhere under service/core joins
# the core library (service/api the API library, service/http the HTTP one),
# a new tests/unit/test_*.c becomes its own CUnit program. Feature areas add
# their own targets in mk/*.mk and hook them into TEST_TARGETS / BENCH_TARGETS.

CC       ?= cc
BUILD    ?= build
OPT      ?= -O2
SAN      ?=
WARN     := -Wall -Wextra -Werror -Wpedantic -Wshadow -Wstrict-prototypes \
            -Wmissing-prototypes -Wformat=2 -Wvla -Wpointer-arith -Wcast-qual \
            -Wundef -Wnull-dereference
CFLAGS   ?= $(OPT) -g
CFLAGS   += -std=c11 $(WARN) -fno-strict-aliasing
CPPFLAGS += -Iinclude -Iservice -D_GNU_SOURCE -MMD -MP
ifeq ($(SAN),1)
CFLAGS   += -fsanitize=address,undefined -fno-sanitize-recover=all -fno-omit-frame-pointer
LDFLAGS  += -fsanitize=address,undefined
endif
VERSION  := $(shell cat VERSION 2>/dev/null || echo 0.0.0)
GIT_REV  := $(shell git rev-parse --short HEAD 2>/dev/null || echo unknown)
CPPFLAGS += -DGC_VERSION='"$(VERSION)"' -DGC_GIT_REV='"$(GIT_REV)"'

CORE_SRC := $(sort $(shell find service/core -name '*.c'))
API_SRC  := $(sort $(shell find service/api -name '*.c'))
HTTP_SRC := $(sort $(shell find service/http -name '*.c'))
CORE_OBJ := $(CORE_SRC:%.c=$(BUILD)/%.o)
API_OBJ  := $(API_SRC:%.c=$(BUILD)/%.o)
HTTP_OBJ := $(HTTP_SRC:%.c=$(BUILD)/%.o)
LIBCORE  := $(BUILD)/libgascycle.a
LIBAPI   := $(BUILD)/libgcapi.a
LIBHTTP  := $(BUILD)/libgchttp.a
SERVER   := $(BUILD)/gascycled
LDLIBS_CORE := -lm
LDLIBS_SRV  := -lmicrohttpd -ljansson -lpthread -lm

UNIT_SRC := $(sort $(wildcard tests/unit/test_*.c))
UNIT_BIN := $(UNIT_SRC:tests/unit/%.c=$(BUILD)/tests/unit/%)
UNIT_SUPPORT_SRC := $(filter-out $(UNIT_SRC),$(wildcard tests/unit/*.c))
UNIT_SUPPORT_OBJ := $(UNIT_SUPPORT_SRC:%.c=$(BUILD)/%.o)

TEST_TARGETS  :=
BENCH_TARGETS :=

.PHONY: all run test deps deps-test unit-test sanitize bench clean
all: $(SERVER) $(LIBCORE)

-include $(sort $(wildcard mk/*.mk))

$(BUILD)/%.o: %.c
	@mkdir -p $(dir $@)
	$(CC) $(CPPFLAGS) $(CFLAGS) -c $< -o $@

$(LIBCORE): $(CORE_OBJ)
	@mkdir -p $(dir $@)
	rm -f $@ && ar rcs $@ $^
$(LIBAPI): $(API_OBJ)
	@mkdir -p $(dir $@)
	rm -f $@ && ar rcs $@ $^
$(LIBHTTP): $(HTTP_OBJ)
	@mkdir -p $(dir $@)
	rm -f $@ && ar rcs $@ $^

$(SERVER): $(BUILD)/service/main.o $(LIBHTTP) $(LIBAPI) $(LIBCORE)
	$(CC) $(LDFLAGS) -o $@ $(filter %.o %.a,$^) $(LDLIBS_SRV)

# Each unit test file is its own CUnit program, linked against the core and
# api libraries (the api layer's pure functions are unit-tested too).
$(BUILD)/tests/unit/%: tests/unit/%.c $(UNIT_SUPPORT_OBJ) $(LIBAPI) $(LIBCORE)
	@mkdir -p $(dir $@)
	$(CC) $(CPPFLAGS) -Itests/unit $(CFLAGS) $(LDFLAGS) -o $@ $(filter %.c %.o %.a,$^) -lcunit -ljansson -lm

deps:
	scripts/deps.sh build
deps-test:
	scripts/deps.sh build test node

# make run PORT=9090 LISTEN=0.0.0.0 serves elsewhere (defaults: loopback, 8080).
PORT   ?= 8080
LISTEN ?= 127.0.0.1
run: deps
	$(MAKE) $(SERVER)
	$(SERVER) --listen $(LISTEN) --port $(PORT)

unit-test: $(UNIT_BIN)
	@set -e; for t in $(UNIT_BIN); do echo "== $$t"; $$t; done

# The full suite. Sub-makes keep the order deterministic. Every stage runs
# even when an earlier one fails (a failure early in the list must not hide
# the state of the sanitizer build or any later suite); the summary names
# the failed stages and the exit status is non-zero if any failed.
TEST_STAGES = unit-test $(TEST_TARGETS) sanitize
test: deps-test
	$(MAKE) all
	@failed=""; for t in $(TEST_STAGES); do \
	    echo "== make test: stage $$t"; \
	    $(MAKE) $$t || failed="$$failed $$t"; \
	done; \
	if [ -n "$$failed" ]; then echo "make test: FAILED stages:$$failed"; exit 1; fi; \
	echo "make test: all suites passed ($(words $(TEST_STAGES)) stages)"

sanitize:
	$(MAKE) BUILD=build-san SAN=1 OPT=-O1 all unit-test $(SANITIZE_TARGETS)

bench:
	scripts/deps.sh build test bench
	@set -e; for t in $(BENCH_TARGETS); do $(MAKE) $$t; done

clean:
	rm -rf build build-san

-include $(shell find $(BUILD)/service $(BUILD)/tests $(BUILD)/bench -name '*.d' -type f 2>/dev/null)
