/*
 * example_preset.h — the worked example preset of DEVELOPERS.md (not in
 * the registry): test_registry.c runs it through the core and the API's
 * writer as a new preset would be.
 */
#ifndef GC_TEST_EXAMPLE_PRESET_H
#define GC_TEST_EXAMPLE_PRESET_H

#include "gascycle/preset.h"

/* The preset's own input and result structs (SI units). */
typedef struct ex_input {
    double T_start, P_start, ratio, T_hot, eff;    /* K, Pa, -, K, - */
} ex_input;

typedef struct ex_result {
    gc_cycle_result cycle;                          /* the engine's result */
    double work_ratio;                              /* net over expansion work, - */
} ex_result;

extern const gc_preset gc_preset_example;

#endif
