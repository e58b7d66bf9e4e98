/*
 * metrics.h — private to the HTTP layer: the process-wide metrics registry,
 * rendered in the Prometheus text exposition format 0.0.4. All updates are
 * lock-free C11 atomics (relaxed ordering: counters need no ordering between
 * each other), so request threads never wait on each other here. Routes are
 * fixed at start-up (their index is the route's position in the router);
 * evaluation presets and error classes are static strings from the API layer,
 * registered on first use in a small lock-free table.
 */
#ifndef GC_HTTP_METRICS_H
#define GC_HTTP_METRICS_H

#include <stddef.h>
#include <stdint.h>

/* Method index used in the requests counter. */
enum gc_metrics_method { GC_MM_GET, GC_MM_HEAD, GC_MM_POST, GC_MM_OPTIONS, GC_MM_OTHER, GC_MM_N };

/* Registers the route labels (copied pointers: must stay valid, e.g. static or
 * owned by the router). Index n_routes - 1 should be the "unmatched" label.
 * Returns 0, or -1 when memory ran out. Call once, before serving. */
int gc_metrics_init(const char *const *route_labels, size_t n_routes,
                    const char *version, const char *revision);
void gc_metrics_free(void);

void gc_metrics_in_flight_add(int delta);
long gc_metrics_in_flight(void);

/* One finished request: route index, method, HTTP status, duration in µs. */
void gc_metrics_request(size_t route, enum gc_metrics_method method, int status,
                        uint64_t duration_us);
/* n successful evaluations of a preset (static string) made by a route (its
 * label, static): the preset's own route, or sweeps, targets, batch. */
void gc_metrics_evaluations(const char *preset, const char *route, unsigned long n);
/* One error of a class (static string). */
void gc_metrics_error(const char *error_class);

/* The exposition text, malloc'd (caller frees); NULL when memory ran out. */
char *gc_metrics_render(size_t *len);

#endif
