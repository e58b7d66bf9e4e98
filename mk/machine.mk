# mk/machine.mk — the machine model's benchmark (machine.h).
#   make bench-machine   site evaluation and 50-point correction curve in
#                        process, as ratios to a design-point Brayton
#                        evaluation measured in the same run (in make bench)

.PHONY: bench-machine
BENCH_TARGETS += bench-machine

$(BUILD)/bench/bench_machine: bench/bench_machine.c $(LIBCORE)
	@mkdir -p $(dir $@)
	$(CC) $(CPPFLAGS) $(CFLAGS) -o $@ $(filter %.c %.a,$^) -lm

bench-machine: $(BUILD)/bench/bench_machine
	$(BUILD)/bench/bench_machine
