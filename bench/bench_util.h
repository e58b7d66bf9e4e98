/*
 * bench_util.h — what the C benchmarks share: a monotonic clock in seconds
 * and a small xorshift64 generator (Marsaglia 2003, shifts 13, 7, 17) for
 * inputs that vary from call to call, so that no cache answers them (each
 * benchmark keeps its own generator state, its own seed), and the sort of
 * five timings for their median.
 */
#ifndef GC_BENCH_UTIL_H
#define GC_BENCH_UTIL_H

#include <stdint.h>
#include <time.h>

/* Monotonic time, s. */
static inline double bench_now_s(void)
{
    struct timespec ts;
    clock_gettime(CLOCK_MONOTONIC, &ts);
    return (double)ts.tv_sec + 1e-9 * (double)ts.tv_nsec;
}

/* Next uniform number in [0, 1) from the generator state *s (nonzero). */
static inline double bench_urand(uint64_t *s)
{
    *s ^= *s << 13;
    *s ^= *s >> 7;
    *s ^= *s << 17;
    return (double)(*s >> 11) * (1.0 / 9007199254740992.0);
}

/* Sorts the 5 timings of v ascending (insertion sort): v[2] is the median. */
static inline void bench_sort5(double *v)
{
    for (int i = 1; i < 5; i++)
        for (int j = i; j > 0 && v[j] < v[j - 1]; j--) {
            double t = v[j];
            v[j] = v[j - 1];
            v[j - 1] = t;
        }
}

#endif
