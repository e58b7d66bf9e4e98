/*
 * check.h — CUnit helpers shared by the unit tests: relative/absolute
 * tolerance checks that print the expression, computed and expected values,
 * the error and the source of the expected value; and a tiny runner macro.
 */
#ifndef GC_TEST_CHECK_H
#define GC_TEST_CHECK_H

#include <CUnit/Basic.h>
#include <math.h>
#include <stdio.h>

/* Checks |got - want| <= rel * |want| (want != 0) and prints on failure.
 * src names where `want` comes from. */
#define CHECK_REL(got, want, rel, src)                                           \
    do {                                                                         \
        double g_ = (got), w_ = (want);                                          \
        double e_ = (w_ != 0.0) ? fabs(g_ - w_) / fabs(w_) : fabs(g_);           \
        if (!(e_ <= (rel))) {                                                    \
            fprintf(stderr, "%s:%d: %s = %.12g, expected %.12g (%s), rel err %.3g > %.3g\n", \
                    __FILE__, __LINE__, #got, g_, w_, (src), e_, (double)(rel)); \
        }                                                                        \
        CU_ASSERT(e_ <= (rel));                                                  \
    } while (0)

#define CHECK_ABS(got, want, tol, src)                                           \
    do {                                                                         \
        double g_ = (got), w_ = (want);                                          \
        double e_ = fabs(g_ - w_);                                               \
        if (!(e_ <= (tol))) {                                                    \
            fprintf(stderr, "%s:%d: %s = %.12g, expected %.12g (%s), abs err %.3g > %.3g\n", \
                    __FILE__, __LINE__, #got, g_, w_, (src), e_, (double)(tol)); \
        }                                                                        \
        CU_ASSERT(e_ <= (tol));                                                  \
    } while (0)

/* Runs the tests of one file as one suite; returns the process exit code. */
typedef struct gc_test_case { const char *name; void (*fn)(void); } gc_test_case;

static inline int gc_run_suite(const char *suite_name, const gc_test_case *cases)
{
    if (CU_initialize_registry() != CUE_SUCCESS)
        return 2;
    CU_pSuite s = CU_add_suite(suite_name, NULL, NULL);
    for (const gc_test_case *c = cases; c->name; c++)
        CU_add_test(s, c->name, c->fn);
    CU_basic_set_mode(CU_BRM_NORMAL);
    CU_basic_run_tests();
    unsigned failed = CU_get_number_of_failures() + CU_get_number_of_tests_failed();
    unsigned run = CU_get_number_of_tests_run();
    CU_cleanup_registry();
    return (failed == 0 && run > 0) ? 0 : 1;
}

#endif
