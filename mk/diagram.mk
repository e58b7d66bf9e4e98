# mk/diagram.mk — diagrams and the demo page.
#  - test_diagram links libxml2 (a real XML parser for the SVG checks): a
#    target-specific rule overrides the generic unit-test link.
XML2_CFLAGS := $(patsubst -I%,-isystem %,$(shell pkg-config --cflags libxml-2.0 2>/dev/null || echo -I/usr/include/libxml2))
XML2_LIBS := $(shell pkg-config --libs libxml-2.0 2>/dev/null || echo -lxml2)

$(BUILD)/tests/unit/test_diagram: tests/unit/test_diagram.c $(UNIT_SUPPORT_OBJ) $(LIBAPI) $(LIBCORE)
	@mkdir -p $(dir $@)
	$(CC) $(CPPFLAGS) -Itests/unit $(XML2_CFLAGS) $(CFLAGS) $(LDFLAGS) -o $@ $(filter %.c %.o %.a,$^) $(XML2_LIBS) -lcunit -ljansson -lm

#  - web/index.html (the demo page served at GET /) is compiled into the
#    binary as gc_api_demo_html (a byte array, like the OpenAPI document).
DEMO_SRC := web/index.html
DEMO_GEN := $(BUILD)/gen/demo_html.c
API_OBJ += $(BUILD)/gen/demo_html.o

$(DEMO_GEN): $(DEMO_SRC) mk/diagram.mk
	@mkdir -p $(dir $@)
	@{ echo '/* Generated from $(DEMO_SRC) by mk/diagram.mk: do not edit. */'; \
	   echo 'extern const unsigned char gc_api_demo_html[];'; \
	   echo 'const unsigned char gc_api_demo_html[] = {'; \
	   od -An -v -tx1 $(DEMO_SRC) | sed -e 's/ *\([0-9a-f][0-9a-f]\)/0x\1,/g'; \
	   echo '0x00 };'; } > $@.tmp && mv $@.tmp $@

$(BUILD)/gen/demo_html.o: $(DEMO_GEN)
	$(CC) $(CPPFLAGS) $(CFLAGS) -c $< -o $@

#  - browser-test: the demo page in Debian's headless Chromium (playwright-core
#    from tests/node), one evaluation driven through the form; screenshot in
#    tests/artifacts/demo.png.
#  - calc-test: LibreOffice Calc (headless, UNO) fetches a select= value with
#    a WEBSERVICE cell formula and computes with it (tests/calc/webservice.py).
.PHONY: browser-test calc-test
browser-test:
	scripts/deps.sh browser node
	$(MAKE) $(SERVER)
	node tests/browser/demo.mjs $(SERVER)

calc-test:
	scripts/deps.sh office
	$(MAKE) $(SERVER)
	/usr/bin/python3 tests/calc/webservice.py $(SERVER)

TEST_TARGETS += browser-test

# calc-test takes about 2 s once LibreOffice is installed (the install: about
# 35 s, 700 MB, once per machine), so it runs in make test.
TEST_TARGETS += calc-test
