# mk/cycles.mk — the cycle routes' HTTP benchmark (part of make bench).
#   make bench-cycles-http   wrk against /healthz, GET /v1/cycles/otto and
#                            GET /v1/cycles/brayton with inputs varied on
#                            every request (bench/cycles/*.lua); prints
#                            requests/s and the ratios to /healthz (each
#                            route against the /healthz runs beside it;
#                            BENCH_ROUNDS=n repeats and prints the median).
.PHONY: bench-cycles-http
BENCH_TARGETS += bench-cycles-http

bench-cycles-http: $(SERVER)
	scripts/deps.sh bench
	bench/cycles/run.sh $(SERVER)
