# heatrel.mk — the combustion analysis of cylinder-pressure recordings
# (include/gascycle/heatrel.h).
#   make bench-heatrel     CSV parse and reduction of 300 cycles x 1,440
#                          samples, in process (in make bench; figures only)
#   make heatrel-reference-check
#                          re-runs tools/ref/gen_heatrel_cycles.py (numpy,
#                          scipy) into a temporary folder and compares every
#                          number with the committed tables in tests/reference/
#                          with a relative tolerance (another machine may differ
#                          in the last digits), so a library update or a hand
#                          edit is caught
# The unit tests (tests/unit/test_heatrel.c) are built and run by the
# Makefile's unit-test target like every other unit program.

.PHONY: bench-heatrel heatrel-reference-check
BENCH_TARGETS += bench-heatrel
TEST_TARGETS  += heatrel-reference-check

$(BUILD)/bench/bench_heatrel: bench/bench_heatrel.c $(LIBCORE)
	@mkdir -p $(dir $@)
	$(CC) $(CPPFLAGS) $(CFLAGS) -o $@ $(filter %.c %.a,$^) -lm

bench-heatrel: $(BUILD)/bench/bench_heatrel
	$(BUILD)/bench/bench_heatrel

heatrel-reference-check:
	/usr/bin/python3 tools/ref/gen_heatrel_cycles.py --check tests/reference
