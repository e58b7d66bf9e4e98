# reference.mk — re-runs the reference-value generators of tools/ref/ and
# compares their output with the committed tables in tests/reference/, so a
# change in a reference library (python3-fluids, python3-iapws, npm
# psychrolib) or a hand edit of a table is caught. The unit tests
# (tests/unit/test_atmosphere.c, test_humid.c, test_air_reference.c) read
# the committed tables; this target proves they are still what the libraries
# give. To accept a deliberate library update, regenerate with the command in
# each table's header line and commit the tables together with the new
# package version.
#
#   make reference-live      (also part of make test)

REF_LIVE_TABLES := atmosphere_ussa1976_fluids.csv psychro_ashrae_psychrolib.csv \
                   air_lemmon2000_iapws.csv
REF_LIVE_TABLES += if97_iapws97.csv steam_cycles_iapws97.csv

.PHONY: reference-live
TEST_TARGETS += reference-live

# Installs what the generators need only when something is missing (so the
# target also works alone, and on hosts where node comes with its own npm).
reference-live:
	@if ! /usr/bin/python3 -c 'import fluids, iapws, scipy' 2>/dev/null \
	    || ! command -v node > /dev/null \
	    || [ ! -f tests/node/node_modules/psychrolib/package.json ]; then \
	    scripts/deps.sh test node; \
	fi
	@set -e; tmp=$$(mktemp -d); trap 'rm -rf "$$tmp"' EXIT; \
	/usr/bin/python3 tools/ref/gen_atmosphere_fluids.py > "$$tmp/atmosphere_ussa1976_fluids.csv"; \
	node tools/ref/gen_psychro_psychrolib.js > "$$tmp/psychro_ashrae_psychrolib.csv"; \
	/usr/bin/python3 tools/ref/gen_air_iapws.py > "$$tmp/air_lemmon2000_iapws.csv"; \
	/usr/bin/python3 tools/ref/gen_if97_iapws.py > "$$tmp/if97_iapws97.csv"; \
	/usr/bin/python3 tools/ref/gen_steam_iapws.py > "$$tmp/steam_cycles_iapws97.csv"; \
	bad=0; for f in $(REF_LIVE_TABLES); do \
	    if diff -u "tests/reference/$$f" "$$tmp/$$f" > "$$tmp/$$f.diff"; then \
	        echo "reference-live: tests/reference/$$f matches its generator"; \
	    else \
	        echo "reference-live: tests/reference/$$f differs from a fresh run of its generator:"; \
	        head -40 "$$tmp/$$f.diff"; bad=1; \
	    fi; \
	done; \
	[ $$bad -eq 0 ] || { echo "reference-live: FAILED (library changed or table edited by hand)"; exit 1; }
