# mk/if97.mk — the IAPWS-IF97 benchmark.
#   make bench-if97   ns per call of (P, T) -> h and (P, h) -> T per region and
#                     over the whole range (in make bench)
# The unit tests (tests/unit/test_if97.c) are built and run by the
# Makefile's unit-test target like every other unit program.

.PHONY: bench-if97
BENCH_TARGETS += bench-if97

$(BUILD)/bench/bench_if97: bench/bench_if97.c $(LIBCORE)
	@mkdir -p $(dir $@)
	$(CC) $(CPPFLAGS) $(CFLAGS) $(LDFLAGS) -o $@ $(filter %.c %.a,$^) -lm

bench-if97: $(BUILD)/bench/bench_if97
	$(BUILD)/bench/bench_if97
