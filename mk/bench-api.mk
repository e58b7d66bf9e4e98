# mk/bench-api.mk — the API layer's in-process benchmark (part of make bench).
#   make bench-api   heap allocations per Otto request; one Brayton
#                    evaluation E; a /v1/targets solve and a /v1/sweeps point
#                    as multiples of E; a 2,000-point 2-D sweep in ms

.PHONY: bench-api
BENCH_TARGETS += bench-api

$(BUILD)/bench/bench_api: bench/bench_api.c $(LIBAPI) $(LIBCORE)
	@mkdir -p $(dir $@)
	$(CC) $(CPPFLAGS) $(CFLAGS) -o $@ $(filter %.c %.a,$^) -ljansson -lpthread -lm

bench-api: $(BUILD)/bench/bench_api
	$(BUILD)/bench/bench_api
