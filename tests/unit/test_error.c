/*
 * test_error.c — unit tests of the core's error-detail helpers (error.h).
 */
#include "check.h"
#include "gascycle/error.h"

#include <string.h>

static void test_set_and_clear(void)
{
    gc_error e;
    int rc = gc_error_set(&e, GC_ERR_RANGE, "/T", "must be between %d and %d K", 200, 6000);
    CU_ASSERT_EQUAL(rc, GC_ERR_RANGE);
    CU_ASSERT_STRING_EQUAL(e.field, "/T");
    CU_ASSERT_STRING_EQUAL(e.message, "must be between 200 and 6000 K");
    gc_error_clear(&e);
    CU_ASSERT_EQUAL(e.code, GC_OK);
    CU_ASSERT_EQUAL(e.field[0], '\0');
    /* NULL is allowed everywhere */
    CU_ASSERT_EQUAL(gc_error_set(NULL, GC_ERR_INVALID, NULL, "x"), GC_ERR_INVALID);
    gc_error_clear(NULL);
}

static void test_truncation_and_texts(void)
{
    gc_error e;
    char long_field[300];
    memset(long_field, 'a', sizeof long_field - 1);
    long_field[sizeof long_field - 1] = '\0';
    gc_error_set(&e, GC_ERR_INVALID, long_field, "%s", long_field);
    CU_ASSERT_EQUAL(strlen(e.field), GC_ERROR_FIELD_LEN - 1);
    CU_ASSERT_EQUAL(strlen(e.message), GC_ERROR_MESSAGE_LEN - 1);
    for (int c = 0; c <= GC_ERR_INFEASIBLE + 1; c++)
        CU_ASSERT_PTR_NOT_NULL(gc_strerror(c));
    CU_ASSERT_STRING_EQUAL(gc_strerror(GC_OK), "ok");
}

int main(void)
{
    static const gc_test_case cases[] = {
        {"set and clear", test_set_and_clear},
        {"truncation and texts", test_truncation_and_texts},
        {NULL, NULL},
    };
    return gc_run_suite("error", cases);
}
