# mk/combined.mk — the combined-cycle preset's benchmark (issue 16).
#   make bench-combined   us per two-pressure combined-cycle evaluation through
#                         the preset in process, and the Brayton topping alone in
#                         the same run (in make bench)
# The unit test (tests/unit/test_combined.c) is built and run by the Makefile's
# unit-test target like every other unit program.

.PHONY: bench-combined
BENCH_TARGETS += bench-combined

$(BUILD)/bench/bench_combined: bench/bench_combined.c $(LIBCORE)
	@mkdir -p $(dir $@)
	$(CC) $(CPPFLAGS) $(CFLAGS) $(LDFLAGS) -o $@ $(filter %.c %.a,$^) -lm

bench-combined: $(BUILD)/bench/bench_combined
	$(BUILD)/bench/bench_combined
