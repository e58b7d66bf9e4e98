# mk/perf.mk — performance work outside the feature areas' own benchmarks.
#   make bench-json   JSON encoding of response documents: jansson's
#                     json_dumps against the API layer's gc_json_dump
#                     (service/api/respond/jsonout.c), ns per number and us per
#                     cycle-shaped document (in make bench)
# The encoder's correctness test is tests/unit/test_jsonout.c (unit-test).

.PHONY: bench-json
BENCH_TARGETS += bench-json

$(BUILD)/bench/bench_json: bench/bench_json.c service/api/respond/jsonout.c service/api/respond/jsonout.h \
                        service/core/util/strbuf.c include/gascycle/strbuf.h
	@scripts/deps.sh build
	@mkdir -p $(dir $@)
	$(CC) $(CPPFLAGS) $(CFLAGS) $(LDFLAGS) -o $@ $(filter %.c,$^) -ljansson -lm

bench-json: $(BUILD)/bench/bench_json
	$(BUILD)/bench/bench_json
