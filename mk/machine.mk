# mk/machine.mk — the machine model's benchmarks (machine.h and its presets).
#   make bench-machine         site evaluation and 50-point correction curve in
#                              process, as ratios to a design-point Brayton
#                              evaluation measured in the same run (in make bench)
#   make bench-machine-routes  the same through the presets, as a request does
#   make bench-machine-http    a 50-point correction curve over HTTP (wrk)

.PHONY: bench-machine
BENCH_TARGETS += bench-machine

$(BUILD)/bench/bench_machine: bench/bench_machine.c $(LIBCORE)
	@mkdir -p $(dir $@)
	$(CC) $(CPPFLAGS) $(CFLAGS) -o $@ $(filter %.c %.a,$^) -lm

bench-machine: $(BUILD)/bench/bench_machine
	$(BUILD)/bench/bench_machine

# The machine's presets as the routes evaluate them (each call defines the
# machine): site evaluation, readings and a 50-point correction curve as
# ratios to a design-point Brayton evaluation through its preset, same run.
.PHONY: bench-machine-routes bench-machine-http
BENCH_TARGETS += bench-machine-routes bench-machine-http

$(BUILD)/bench/bench_machine_routes: bench/bench_machine_routes.c $(LIBCORE)
	@mkdir -p $(dir $@)
	$(CC) $(CPPFLAGS) $(CFLAGS) -o $@ $(filter %.c %.a,$^) -lm

bench-machine-routes: $(BUILD)/bench/bench_machine_routes
	$(BUILD)/bench/bench_machine_routes

# A 50-point correction curve over HTTP (wrk, one connection: its latency),
# beside one site evaluation over HTTP, server running (bench/lib.sh).
bench-machine-http: $(SERVER)
	bench/machine/run.sh $(SERVER)
