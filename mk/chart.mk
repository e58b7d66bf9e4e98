# mk/chart.mk — the generic SVG chart renderer (include/gascycle/chart.h).
#  - test_chart parses every chart with libxml2 (a real XML parser): a
#    target-specific rule overrides the generic unit-test link, as
#    mk/diagram.mk does for test_diagram (XML2_CFLAGS and XML2_LIBS come from
#    there; defined again here only when that fragment is absent).
#  - Running it writes an example of each chart kind to
#    $(BUILD)/chart-examples/ (not committed; GC_CHART_EXAMPLES=<folder>
#    writes them elsewhere). To look at one as PNG: rsvg-convert (Debian's
#    librsvg2-bin), e.g. rsvg-convert -o x.png $(BUILD)/chart-examples/x.svg
ifndef XML2_LIBS
XML2_CFLAGS := $(patsubst -I%,-isystem %,$(shell pkg-config --cflags libxml-2.0 2>/dev/null || echo -I/usr/include/libxml2))
XML2_LIBS := $(shell pkg-config --libs libxml-2.0 2>/dev/null || echo -lxml2)
endif

$(BUILD)/tests/unit/test_chart: tests/unit/test_chart.c $(UNIT_SUPPORT_OBJ) $(LIBAPI) $(LIBCORE)
	@mkdir -p $(dir $@)
	$(CC) $(CPPFLAGS) -Itests/unit $(XML2_CFLAGS) $(CFLAGS) $(LDFLAGS) -o $@ $(filter %.c %.o %.a,$^) $(XML2_LIBS) -lcunit -ljansson -lm
