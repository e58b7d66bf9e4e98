# mk/props.mk — the property core's benchmark and data generator.
#   make bench-props     ns per call of the air model's h(T), s°(T), T from h
#                        and isentropic end state (in make bench)
#   make species-data    regenerate service/core/properties/species_data.c from data/nasa9
#                        (the generated file is committed)

.PHONY: bench-props species-data
BENCH_TARGETS += bench-props

$(BUILD)/bench/bench_props: bench/bench_props.c $(LIBCORE)
	@mkdir -p $(dir $@)
	$(CC) $(CPPFLAGS) $(CFLAGS) -o $@ $^ -lm

bench-props: $(BUILD)/bench/bench_props
	$(BUILD)/bench/bench_props

species-data:
	/usr/bin/python3 tools/gen_species_data.py > service/core/properties/species_data.c.tmp
	mv service/core/properties/species_data.c.tmp service/core/properties/species_data.c

# The committed species_data.c must be exactly what the generator writes.
.PHONY: species-data-check
TEST_TARGETS += species-data-check
species-data-check:
	@/usr/bin/python3 tools/gen_species_data.py | cmp -s - service/core/properties/species_data.c \
	  && echo "species-data-check: service/core/properties/species_data.c matches data/nasa9" \
	  || { echo "species-data-check: species_data.c differs from tools/gen_species_data.py output" >&2; exit 1; }
