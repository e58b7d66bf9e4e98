/*
 * cases.h — the integration-test case files: parser and checker. The format
 * is described in tests/integration/README.md; one file holds one request
 * and the expectations on its response.
 */
#ifndef GC_IT_CASES_H
#define GC_IT_CASES_H

#include <stddef.h>

typedef struct it_stats {
    int passed;
    int failed;
} it_stats;

/* Runs every *.case file under dir (recursively, in sorted path order) whose
 * relative path contains filter (NULL = all) against the server at base.
 * Prints one line per case; updates st. */
void it_cases_run_dir(const char *dir, const char *base, const char *filter, it_stats *st);

/* Checks that apply to every response a test receives (status below 500,
 * X-Request-Id, a charset in Content-Type, JSON that parses). Returns 0 or
 * -1 with the reason in why. allow_5xx skips the status check. */
struct it_response;
int it_common_checks(const struct it_response *r, int head, int allow_5xx, char *why, size_t len);

#endif
