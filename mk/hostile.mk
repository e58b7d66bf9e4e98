# mk/hostile.mk — issue 12's proof that gascycled holds under hostile clients.
#
#   make hostile-test   the hostile-input catalog (tests/integration/cases/hostile,
#                       made by tests/hostile/make_cases.py) plus raw-socket framing,
#                       size, deadline, cap, budget and signal cases
#                       (tests/hostile/catalog.c); also under make sanitize
#   make attack-test    bounded soak and attacks with tests/hostile/stress.c:
#                       mixed-route soak, /healthz under 8 heavy clients,
#                       slow headers, many connections, large bodies (about 70 s)
#   make soak           the same soak for 60 s (outside make test)
#   make valgrind       a short mixed load on the server under valgrind memcheck,
#                       zero errors and no definite leaks (outside make test: slow)
# All traffic goes to 127.0.0.1 only; every run stops by itself.

HOSTILE_CATALOG := $(BUILD)/tests/hostile/catalog
HOSTILE_STRESS  := $(BUILD)/tests/hostile/stress
HOSTILE_CASES   := tests/integration/cases/hostile

$(BUILD)/tests/hostile/catalog.o: CPPFLAGS += -Itests/integration
$(HOSTILE_CATALOG): $(BUILD)/tests/hostile/catalog.o $(BUILD)/tests/integration/cases.o \
                    $(BUILD)/tests/integration/harness.o
	@mkdir -p $(dir $@)
	$(CC) $(LDFLAGS) -o $@ $^ -lcurl -ljansson -lpthread -lm
$(HOSTILE_STRESS): $(BUILD)/tests/hostile/stress.o
	@mkdir -p $(dir $@)
	$(CC) $(LDFLAGS) -o $@ $^ -lpthread

.PHONY: hostile-test attack-test soak valgrind
hostile-test: $(SERVER) $(HOSTILE_CATALOG)
	$(HOSTILE_CATALOG) --server $(SERVER) --cases $(HOSTILE_CASES) \
	    --logs $(BUILD)/hostile --dump $(BUILD)/hostile/responses

attack-test: $(SERVER) $(HOSTILE_STRESS)
	BUILD=$(BUILD) SOAK_S=$(or $(SOAK_S),15) tests/hostile/attacks.sh $(SERVER) $(HOSTILE_STRESS)

soak: $(SERVER) $(HOSTILE_STRESS)
	BUILD=$(BUILD) SOAK_S=60 ATTACKS=soak tests/hostile/attacks.sh $(SERVER) $(HOSTILE_STRESS)

valgrind: $(SERVER) $(HOSTILE_STRESS)
	scripts/deps.sh fuzz
	BUILD=$(BUILD) tests/hostile/valgrind.sh $(SERVER) $(HOSTILE_STRESS)

TEST_TARGETS     += hostile-test attack-test
SANITIZE_TARGETS += hostile-test

# The HTTP layer's pure request-target parser has its own unit test; it links
# the one object it needs from the HTTP layer besides the API and core
# libraries (the generic rule of the Makefile links those two only).
$(BUILD)/tests/unit/test_http_query: tests/unit/test_http_query.c $(BUILD)/service/http/query.o \
                                     $(UNIT_SUPPORT_OBJ) $(LIBAPI) $(LIBCORE)
	@mkdir -p $(dir $@)
	$(CC) $(CPPFLAGS) -Itests/unit $(CFLAGS) $(LDFLAGS) -o $@ $(filter %.c %.o %.a,$^) -lcunit -ljansson -lm
