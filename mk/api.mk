# mk/api.mk — the API layer's build rules and tests.
#  - openapi/openapi.json is compiled into the binary as gc_api_openapi_json
#    (a byte array, so no compiler string-length limit applies).
#  - contract-test: validates openapi/openapi.json as OpenAPI 3.1 and every
#    response body the integration runner dumped against it.

OPENAPI_SRC := openapi/openapi.json
OPENAPI_GEN := $(BUILD)/gen/openapi_json.c
API_OBJ += $(BUILD)/gen/openapi_json.o

$(OPENAPI_GEN): $(OPENAPI_SRC) mk/api.mk
	@mkdir -p $(dir $@)
	@{ echo '/* Generated from $(OPENAPI_SRC) by mk/api.mk: do not edit. */'; \
	   echo '#include "api/api.h"'; \
	   echo 'const char gc_api_openapi_json[] = {'; \
	   od -An -v -tx1 $(OPENAPI_SRC) | sed -e 's/ *\([0-9a-f][0-9a-f]\)/0x\1,/g'; \
	   echo '0x00 };'; } > $@.tmp && mv $@.tmp $@

$(BUILD)/gen/openapi_json.o: $(OPENAPI_GEN)
	$(CC) $(CPPFLAGS) $(CFLAGS) -c $< -o $@

# Contract test: validates the responses the integration runner dumped into
# $(IT_DUMP) (mk/http.mk), so it depends on integration-test and is the one
# of the two listed in TEST_TARGETS (mk/api.mk is read before mk/http.mk, so
# listing both would run the contract check before the integration run, or
# the integration suite twice). contract-check validates an existing dump.
CONTRACT_DUMP = $(or $(IT_DUMP),$(BUILD)/contract/responses)
.PHONY: contract-test contract-check
contract-test: integration-test
	$(MAKE) contract-check
contract-check:
	scripts/deps.sh node
	node tests/contract/validate.mjs --doc $(OPENAPI_SRC) $(CONTRACT_DUMP)
TEST_TARGETS += contract-test
