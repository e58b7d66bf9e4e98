/*
 * validity_out.c — the validity warnings of validity_out.h: a scan of
 * gascycle/validity.h turned into response warnings.
 */
#include "api/respond/validity_out.h"

void gc_api_validity_warn(gc_out *o, const gc_validity_scan *s, const char *field)
{
    gc_validity_note notes[3];
    int n = gc_validity_scan_notes(s, notes, 3);
    for (int i = 0; i < n; i++)
        gc_out_warn(o, notes[i].code, field, "%s", notes[i].message);
}

void gc_api_validity_warn_cycle(gc_out *o, const gc_cycle_result *r)
{
    gc_validity_scan s;
    gc_validity_scan_init(&s);
    gc_validity_scan_run(&s, &r->actual, NULL);
    if (r->has_ideal && !r->ideal_is_actual)
        gc_validity_scan_run(&s, &r->ideal, "ideal ");
    gc_api_validity_warn(o, &s, NULL);
}
