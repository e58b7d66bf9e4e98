# reference.mk — re-runs the reference-value generators of tools/ref/ and
# compares their output with the committed tables in tests/reference/, so a
# change in a reference library (python3-fluids, python3-iapws, npm
# psychrolib) or a hand edit of a table is caught. The comparison is
# numeric (tools/ref/check_live.sh, compare_tables.py): column names and row
# count exact, each value within a relative tolerance of 1e-12, never byte
# for byte, because a library's last digits differ between CPUs of the same
# kind. Each table names its generator in its "# command:" header line, so
# a new table only needs its name in REF_LIVE_TABLES. The unit tests
# (tests/unit/test_atmosphere.c, test_humid.c, test_air_reference.c ...)
# read the committed tables; this target proves they are still what the
# libraries give. To accept a deliberate library update, regenerate with the
# command in each table's header line and commit the tables together with
# the new package version.
#
#   make reference-live      (also part of make test)

REF_LIVE_TABLES := atmosphere_ussa1976_fluids.csv psychro_ashrae_psychrolib.csv \
                   air_lemmon2000_iapws.csv air_real_lemmon2000_iapws.csv
REF_LIVE_TABLES += uncert_uncertainties.csv uncert_quantiles_scipy.csv
REF_LIVE_TABLES += machine_evap_psychrolib.csv machine_chiller_psychrolib.csv
REF_LIVE_TABLES += if97_iapws97.csv steam_cycles_iapws97.csv
REF_LIVE_TABLES += if97_sr505_iapws97.csv

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
	/usr/bin/python3 tools/ref/compare_tables.py --self-test
	tools/ref/check_live.sh $(REF_LIVE_TABLES)
