# mk/lint.mk — cheap source checks in make test.
#   make function-length-check   every function under service/ has at most 80
#                                lines (tools/check_function_length.py)

.PHONY: function-length-check
function-length-check:
	python3 tools/check_function_length.py service

TEST_TARGETS += function-length-check
