# mk/if97.mk — the IAPWS-IF97 and steam bottoming-cycle benchmarks.
#   make bench-if97   ns per call of (P, T) -> h and (P, h) -> T per region and
#                     over the whole range, and the region-3 density at (P, T)
#                     started from SR5-05 v(p, T) against the bracket search it
#                     replaced, in alternating passes (in make bench)
# The unit tests (tests/unit/test_if97.c, test_if97_sr505.c, test_steam.c) are built and run by
# the Makefile's unit-test target like every other unit program.

.PHONY: bench-if97
BENCH_TARGETS += bench-if97

$(BUILD)/bench/bench_if97: bench/bench_if97.c $(LIBCORE)
	@mkdir -p $(dir $@)
	$(CC) $(CPPFLAGS) $(CFLAGS) $(LDFLAGS) -o $@ $(filter %.c %.a,$^) -lm

bench-if97: $(BUILD)/bench/bench_if97
	$(BUILD)/bench/bench_if97

# make bench-steam   us per two-pressure HRSG + steam-cycle evaluation (in make bench)
.PHONY: bench-steam
BENCH_TARGETS += bench-steam

$(BUILD)/bench/bench_steam: bench/bench_steam.c $(LIBCORE)
	@mkdir -p $(dir $@)
	$(CC) $(CPPFLAGS) $(CFLAGS) $(LDFLAGS) -o $@ $(filter %.c %.a,$^) -lm

bench-steam: $(BUILD)/bench/bench_steam
	$(BUILD)/bench/bench_steam
