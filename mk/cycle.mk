# cycle.mk — the cycle engine's benchmark (make bench-cycle; part of make bench).
# The engine's unit tests (tests/unit/test_cycle.c, test_piston.c) are built
# and run by the Makefile's unit-test target like every other unit program.

.PHONY: bench-cycle
BENCH_TARGETS += bench-cycle

$(BUILD)/bench/bench_cycle: bench/bench_cycle.c $(LIBCORE)
	@mkdir -p $(dir $@)
	$(CC) $(CPPFLAGS) $(CFLAGS) $(LDFLAGS) -o $@ $^ -lm

bench-cycle: $(BUILD)/bench/bench_cycle
	$(BUILD)/bench/bench_cycle
