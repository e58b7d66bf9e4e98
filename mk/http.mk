# mk/http.mk — targets of the HTTP layer: the integration tests (a libcurl
# client against a real server on a free port) and the HTTP benchmark (wrk).
#
#   make integration-test   build the server and the runner, run every case
#                           under tests/integration/cases plus the C tests of
#                           runner.c; JSON responses go to
#                           $(BUILD)/contract/responses for the contract test
#   make bench-http         wrk against /healthz and /v1/properties (figures
#                           printed, never pass/fail on speed)
# Under `make sanitize` (BUILD=build-san SAN=1) the runner starts the
# sanitizer build of the server, build-san/gascycled.

IT_SRC    := $(sort $(wildcard tests/integration/*.c))
IT_OBJ    := $(IT_SRC:%.c=$(BUILD)/%.o)
IT_RUNNER := $(BUILD)/tests/integration/runner
IT_DUMP   := $(BUILD)/contract/responses

$(IT_RUNNER): $(IT_OBJ)
	@mkdir -p $(dir $@)
	$(CC) $(LDFLAGS) -o $@ $^ -lcurl -ljansson -lpthread -lm

.PHONY: integration-test bench-http
integration-test: $(SERVER) $(IT_RUNNER)
	$(IT_RUNNER) --server $(SERVER) --cases tests/integration/cases \
	    --dump $(IT_DUMP) --logs $(BUILD)/integration

bench-http: $(SERVER)
	bench/http/run.sh $(SERVER)

# contract-test (mk/api.mk, read first) runs integration-test before it
# validates the dump; list integration-test only when it is not there, so
# `make test` runs the suite once.
ifeq ($(filter contract-test,$(TEST_TARGETS)),)
TEST_TARGETS     += integration-test
endif
SANITIZE_TARGETS += integration-test
BENCH_TARGETS    += bench-http
