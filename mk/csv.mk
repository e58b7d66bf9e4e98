# mk/csv.mk — format=csv parsed back with a real CSV parser (npm csv-parse)
# and compared value by value with the JSON response (tests/csv/roundtrip.mjs).
.PHONY: csv-test
csv-test: $(SERVER)
	scripts/deps.sh node
	node tests/csv/roundtrip.mjs $(SERVER)

TEST_TARGETS += csv-test
