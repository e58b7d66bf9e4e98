# mk/brayton.mk — the Brayton-family and turbojet presets' benchmark.
#   make bench-brayton   us per evaluation of a fuel-fired, regenerative,
#                        intercooled and reheat Brayton cycle (in make bench)

.PHONY: bench-brayton
BENCH_TARGETS += bench-brayton

$(BUILD)/bench/bench_brayton: bench/bench_brayton.c $(LIBCORE)
	@mkdir -p $(dir $@)
	$(CC) $(CPPFLAGS) $(CFLAGS) -o $@ $(filter %.c %.a,$^) -lm

bench-brayton: $(BUILD)/bench/bench_brayton
	$(BUILD)/bench/bench_brayton
