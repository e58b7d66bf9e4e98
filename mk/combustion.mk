# mk/combustion.mk — the combustion-analysis route's HTTP benchmark (part of
# make bench; issue 15's target: 300 cycles x 1,440 samples reduced in at
# most 0.5 s over HTTP, body parsing included).
#   make bench-combustion-http   wrk POSTs four invented test-cell recordings
#                                in turn (text/csv, then JSON) to a real
#                                server on 127.0.0.1; prints latency figures
#                                and the JSON/CSV ratio (figures only)
.PHONY: bench-combustion-http
BENCH_TARGETS += bench-combustion-http

bench-combustion-http: $(SERVER)
	bench/combustion/run.sh $(SERVER)

# make bench-recording   a JSON recording of 300 cycles x 1,440 samples read
#                        into the route's input in process, through jansson
#                        alone and through the series scanner
#                        (service/api/request/series_scan.c), in the same
#                        run: ms per body and the ratio (figures only)
.PHONY: bench-recording
BENCH_TARGETS += bench-recording

$(BUILD)/bench/bench_recording: bench/bench_recording.c $(LIBAPI) $(LIBCORE)
	@mkdir -p $(dir $@)
	$(CC) $(CPPFLAGS) -Ibench $(CFLAGS) $(LDFLAGS) -o $@ $(filter %.c %.a,$^) -ljansson -lm

bench-recording: $(BUILD)/bench/bench_recording
	$(BUILD)/bench/bench_recording
