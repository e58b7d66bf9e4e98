# mk/habits.mk — checks of how people call the service (issue 17) that are
# not case files:
#
#   make run-port-test   `make run PORT=N` serves on port N (a free port;
#                        tests/integration/run_port.py), then stops cleanly
.PHONY: run-port-test
run-port-test: $(SERVER)
	python3 tests/integration/run_port.py

TEST_TARGETS += run-port-test
