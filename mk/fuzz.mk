# mk/fuzz.mk — libFuzzer targets (clang 14, -fsanitize=fuzzer,address,undefined)
# for every entry point of a request: the route handlers in process with
# arbitrary query and body (fuzz_routes), the query parser and decoder
# (fuzz_query), the JSON body decoder and writer (fuzz_json), the unit
# parser (fuzz_units) and the JSON body's series scanner against jansson
# (fuzz_series). Built in build-fuzz/ with clang; the seed corpus
# (tests/fuzz/corpus/<target>, made by tests/fuzz/make_corpus.py from the
# OpenAPI examples and the integration cases), the dictionary
# (tests/fuzz/gascycled.dict) and every crash found so far
# (tests/fuzz/regressions/<target>) are committed.
#
#   make fuzz-test   a short deterministic run: every seed and reproducer,
#                    then mutations up to FUZZ_RUNS executions (default
#                    15000) per target with a fixed seed, from an empty work
#                    folder (part of make test, about a minute)
#   make fuzz        long runs: FUZZ_SECONDS (default 600) per target, new
#                    corpus entries in build-fuzz/corpus/<target>, crashes in
#                    build-fuzz/crashes/<target>; copy a crash to
#                    tests/fuzz/regressions/<target>/ once fixed

FUZZ_TARGETS := fuzz_routes fuzz_query fuzz_json fuzz_units fuzz_series
FUZZ_BUILD   := build-fuzz
FUZZ_RUNS    ?= 15000
FUZZ_SECONDS ?= 600
FUZZ_SANITIZE := -fsanitize=address,undefined -fno-sanitize-recover=all -fno-omit-frame-pointer

# Inside the sub-make (SAN=fuzz): clang, coverage for libFuzzer, sanitizers.
ifeq ($(SAN),fuzz)
CFLAGS  += -fsanitize=fuzzer-no-link $(FUZZ_SANITIZE)
LDFLAGS += $(FUZZ_SANITIZE)
endif

FUZZ_BINS := $(FUZZ_TARGETS:%=$(BUILD)/tests/fuzz/%)
$(FUZZ_BINS): $(BUILD)/tests/fuzz/%: $(BUILD)/tests/fuzz/%.o $(BUILD)/service/http/query.o $(LIBAPI) $(LIBCORE)
	@mkdir -p $(dir $@)
	$(CC) -fsanitize=fuzzer $(LDFLAGS) -o $@ $^ -ljansson -lm

.PHONY: fuzz-build fuzz-bins fuzz-test fuzz fuzz-corpus
fuzz-bins: $(FUZZ_BINS)

# clang warns about a few things gcc does not; warnings stay on, not fatal.
fuzz-build:
	scripts/deps.sh fuzz
	$(MAKE) BUILD=$(FUZZ_BUILD) CC=clang SAN=fuzz OPT=-O1 WARN="-Wall -Wextra" fuzz-bins

fuzz-test: fuzz-build
	@set -e; for t in $(FUZZ_TARGETS); do \
	    rm -rf $(FUZZ_BUILD)/run/$$t; mkdir -p $(FUZZ_BUILD)/run/$$t; log=$(FUZZ_BUILD)/run/$$t.log; \
	    echo "== $$t: every seed and reproducer, then mutations up to $(FUZZ_RUNS) runs (seed 1)"; \
	    if ! $(FUZZ_BUILD)/tests/fuzz/$$t -seed=1 -runs=$(FUZZ_RUNS) -max_len=65536 \
	        -dict=tests/fuzz/gascycled.dict -artifact_prefix=$(FUZZ_BUILD)/run/$$t/ \
	        -print_final_stats=1 $(FUZZ_BUILD)/run/$$t tests/fuzz/corpus/$$t \
	        tests/fuzz/regressions/$$t >$$log 2>&1; then \
	        tail -n 60 $$log; echo "fuzz-test: $$t FAILED (input in $(FUZZ_BUILD)/run/$$t/)"; exit 1; \
	    fi; \
	    grep -E "^(INFO: seed corpus|#[0-9]+ +DONE|stat::number_of_executed_units|stat::peak_rss)" $$log; \
	done

fuzz: fuzz-build
	@set -e; for t in $(FUZZ_TARGETS); do \
	    mkdir -p $(FUZZ_BUILD)/corpus/$$t $(FUZZ_BUILD)/crashes/$$t; \
	    echo "== $$t for $(FUZZ_SECONDS) s"; \
	    $(FUZZ_BUILD)/tests/fuzz/$$t -max_total_time=$(FUZZ_SECONDS) -max_len=65536 \
	        -dict=tests/fuzz/gascycled.dict -artifact_prefix=$(FUZZ_BUILD)/crashes/$$t/ \
	        -print_final_stats=1 $(FUZZ_BUILD)/corpus/$$t tests/fuzz/corpus/$$t \
	        tests/fuzz/regressions/$$t || exit 1; \
	done

# Regenerates the committed seed corpus from openapi.json and the case files
# (route names from the route table itself: tools/routes/list_routes.c).
LIST_ROUTES := $(BUILD)/tools/list_routes

$(LIST_ROUTES): tools/routes/list_routes.c $(LIBAPI) $(LIBCORE)
	@mkdir -p $(dir $@)
	$(CC) $(CPPFLAGS) $(CFLAGS) -o $@ $(filter %.c %.a,$^) -ljansson -lpthread -lm

fuzz-corpus: $(LIST_ROUTES)
	python3 tests/fuzz/make_corpus.py $(LIST_ROUTES)

TEST_TARGETS += fuzz-test
