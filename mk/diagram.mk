# mk/diagram.mk — diagrams and the demo page.
#  - test_diagram links libxml2 (a real XML parser for the SVG checks): a
#    target-specific rule overrides the generic unit-test link.
XML2_CFLAGS := $(patsubst -I%,-isystem %,$(shell pkg-config --cflags libxml-2.0 2>/dev/null || echo -I/usr/include/libxml2))
XML2_LIBS := $(shell pkg-config --libs libxml-2.0 2>/dev/null || echo -lxml2)

$(BUILD)/tests/unit/test_diagram: tests/unit/test_diagram.c $(UNIT_SUPPORT_OBJ) $(LIBAPI) $(LIBCORE)
	@mkdir -p $(dir $@)
	$(CC) $(CPPFLAGS) -Itests/unit $(XML2_CFLAGS) $(CFLAGS) $(LDFLAGS) -o $@ $(filter %.c %.o %.a,$^) $(XML2_LIBS) -lcunit -ljansson -lm
