/*
 * diagram.h — property diagrams of an evaluated cycle as a self-contained
 * SVG 1.1 document (core: no JSON, no HTTP).
 *
 * Kinds: T-s (temperature over specific entropy), P-v (pressure over
 * specific volume, optionally logarithmic on either axis) and h-s (specific
 * enthalpy over specific entropy). The curves are the engine's own process
 * paths (path.h: gc_cycle_path with `points` per process), so the picture
 * shows exactly the curves the engine's area checks integrate.
 *
 * Overlays (optional):
 *   ideal   the internally reversible counterpart of the run (result->ideal),
 *           dashed; left out (and said so in the legend) when it equals the
 *           actual cycle.
 *   carnot  the Carnot cycle between the actual cycle's extreme temperatures
 *           T_min and T_max over the actual cycle's entropy range
 *           [s_min, s_max], dotted, computed with the cycle's start gas: two
 *           isotherms and two isentropes. On T-s and h-s it is a rectangle (an
 *           ideal gas's h depends on T only); on P-v its real curves
 *           P = P_std exp((s0(T) - s) / R) are drawn, clipped to the plot
 *           area, whose range the actual and ideal cycles alone set (the
 *           Carnot pressures are often orders of magnitude beyond the cycle's).
 *
 * Document structure (stable, for tests and for clients that style it):
 *   <rect class="gc-plot" .../>            the plot area (x, y, width, height)
 *   <path class="gc-actual" .../>          the actual cycle, solid
 *   <path class="gc-ideal" .../>           ideal overlay, dashed
 *   <path class="gc-carnot" .../>          Carnot overlay, dotted
 *   <g class="gc-state" id="state-N">      one per distinct state (N from 1;
 *                                          a closing state equal to state 1
 *                                          is not repeated), a circle + number
 *   <text class="gc-axis-title" id="axis-x"> / id="axis-y"  titles with units
 *   <g class="gc-legend">, <text class="gc-caption">  key figures
 * No scripts, no external resources, generic font families only; text is
 * XML-escaped (invalid UTF-8 bytes become '?'). Every coordinate is checked
 * finite: a non-finite value refuses the drawing with an error.
 *
 * Units: the result is SI (cycle.h); axes and caption are converted to the
 * chosen output system with units.h (si: K, kJ/(kg K), kPa, m3/kg, kJ/kg;
 * us: R, Btu/(lbm R), psia, ft3/lbm, Btu/lbm).
 */
#ifndef GASCYCLE_DIAGRAM_H
#define GASCYCLE_DIAGRAM_H

#include <stddef.h>

#include "gascycle/cycle.h"
#include "gascycle/error.h"
#include "gascycle/units.h"

typedef enum gc_diagram_kind {
    GC_DIAGRAM_TS = 0,          /* T over s */
    GC_DIAGRAM_PV = 1,          /* P over v */
    GC_DIAGRAM_HS = 2           /* h over s */
} gc_diagram_kind;

#define GC_DIAGRAM_OVERLAY_IDEAL 0x1u   /* draw result->ideal (when has_ideal) */
#define GC_DIAGRAM_OVERLAY_CARNOT 0x2u  /* draw the Carnot cycle */

#define GC_DIAGRAM_DEFAULT_WIDTH 760    /* px */
#define GC_DIAGRAM_DEFAULT_HEIGHT 520   /* px */
#define GC_DIAGRAM_MIN_SIZE 320         /* px, either dimension */
#define GC_DIAGRAM_MAX_SIZE 4000        /* px, either dimension */
#define GC_DIAGRAM_TITLE_LEN 120        /* bytes of a caller's title that are used */

typedef struct gc_diagram_options {
    gc_diagram_kind kind;       /* T-s, P-v or h-s */
    gc_unit_system units;       /* axis and caption units */
    int log_x;                  /* P-v only: logarithmic v axis (0/1) */
    int log_y;                  /* P-v only: logarithmic P axis (0/1) */
    int points;                 /* points per process, GC_PATH_MIN_POINTS..GC_PATH_MAX_POINTS
                                   (path.h); 0: GC_PATH_DEFAULT_POINTS */
    unsigned overlays;          /* GC_DIAGRAM_OVERLAY_* bits */
    int width_px, height_px;    /* picture size, px; 0: the defaults */
    const char *title;          /* heading (UTF-8, escaped here), NULL: "T-s diagram" etc. */
    int has_figures;            /* 1: the caption quotes the three figures below instead of
                                   the engine's (a route that states efficiency on another
                                   basis, e.g. the fuel's LHV, keeps picture and JSON alike) */
    double heat_in;             /* J/kg intake, caption's heat added */
    double thermal_efficiency;  /* -, caption's thermal efficiency */
    double ideal_thermal_efficiency; /* -, caption's ideal-counterpart efficiency */
} gc_diagram_options;

/* Fills the defaults: T-s, si, linear axes, default points, both overlays,
 * default size, no title. */
void gc_diagram_options_default(gc_diagram_options *opt);

/* "Ts", "Pv", "hs" (case-insensitive, also "T-s", "P-v", "h-s") -> kind;
 * GC_ERR_INVALID otherwise. */
int gc_diagram_kind_parse(const char *name, gc_diagram_kind *kind);
const char *gc_diagram_kind_name(gc_diagram_kind kind);   /* "Ts", "Pv", "hs" */

/* Number of state markers the diagram of run draws (its distinct states:
 * n_states, less a closing state equal to the start state). */
int gc_diagram_state_count(const gc_cycle_run *run);

/* Renders the diagram of r->actual with the options (NULL: defaults) into a
 * malloc'd, NUL-terminated SVG document *svg_out of *len bytes (the caller
 * frees it). Errors: GC_ERR_INVALID (bad option: err->field "/diagram",
 * "/points", "/scale", "/width", "/height"; or a result that cannot be drawn,
 * e.g. a non-finite or non-positive value on a log axis), GC_ERR_NOMEM.
 * On error *svg_out is NULL and *len 0. */
int gc_diagram_svg(const gc_cycle_result *r, const gc_diagram_options *opt,
                   char **svg_out, size_t *len, gc_error *err);

#endif
