# mk/openapi.mk — the preset schemas of openapi/openapi.json, generated from
# the presets' descriptors (tools/openapi/gen_openapi.c) and merged into the
# hand-written document.
#   make openapi         regenerate the document (then commit it)
#   make openapi-check   fail when the committed document differs from what
#                        the tables give (in make test)

GEN_OPENAPI := $(BUILD)/tools/gen_openapi

$(GEN_OPENAPI): tools/openapi/gen_openapi.c $(LIBAPI) $(LIBCORE)
	@mkdir -p $(dir $@)
	$(CC) $(CPPFLAGS) $(CFLAGS) -o $@ $(filter %.c %.a,$^) -ljansson -lpthread -lm

.PHONY: openapi openapi-check
openapi: $(GEN_OPENAPI)
	$(GEN_OPENAPI) $(OPENAPI_SRC)

openapi-check: $(GEN_OPENAPI)
	$(GEN_OPENAPI) --check $(OPENAPI_SRC)
TEST_TARGETS += openapi-check
