/*
 * heatrel.h — combustion analysis of cylinder-pressure recordings: many
 * consecutive cycles of one cylinder, as a test cell stores them, reduced to
 * heat release, burn points and cycle statistics (pure C core: no JSON, no
 * HTTP).
 *
 * Steps of gc_heatrel_analyse, in order:
 *   1. axis        the recording's crank angles minus the angle of firing TDC
 *                  (tdc_angle_deg), wrapped into [-period/2, period/2) and
 *                  rotated to start at the lowest, so every cycle runs from
 *                  the start of the intake stroke (-360 deg four-stroke) to
 *                  the end of the exhaust stroke; slider-crank volume from
 *                  measured.h (gc_measured_volume).
 *   2. pegging     a relative (piezo) signal is made absolute per cycle by
 *                  adding an offset:
 *                  INTAKE      the offset that makes the mean of the samples
 *                              in peg_window_deg (default BDC of the intake
 *                              stroke +-5 deg) equal the intake-manifold
 *                              pressure peg_intake_pressure_Pa (common
 *                              practice);
 *                  TWO_POINT   the two-point fixed-exponent method: the
 *                              compression between the window's two ends is
 *                              taken as polytropic with exponent
 *                              peg_exponent, so (p1 + d) V1^n = (p2 + d) V2^n
 *                              gives d = (p2 V2^n - p1 V1^n) / (V1^n - V2^n)
 *                              (Randolph 1990, SAE 900170; compared with other
 *                              methods by Brunt & Pond 1997, SAE 970036; both
 *                              from memory);
 *                  POLYTROPIC  the same fixed-exponent assumption fitted by
 *                              least squares over every sample of the window:
 *                              p V^n = C - d V^n is a straight line in V^n with
 *                              slope -d (less sensitive to noise than two
 *                              points).
 *                  TWO_POINT and POLYTROPIC use compression_window_deg
 *                  (default -100..-65 deg) and exponent 1.32 (common
 *                  practice for a fresh charge).
 *   3. ensemble    the ensemble-average trace: the mean over all cycles of the
 *                  pegged pressure at each sample (misfires included).
 *   4. phasing     the TDC check on the ensemble average:
 *                  LOSS_ANGLE  for a motored recording: the motored peak
 *                              pressure lies before TDC by the thermodynamic
 *                              loss angle (heat loss and blow-by; 0.5 - 1 deg
 *                              is typical, default 0.7 deg: common practice,
 *                              from memory); the peak's angle comes from a
 *                              parabola through the highest sample within
 *                              +-30 deg and its neighbours; shift = angle of
 *                              peak + loss angle;
 *                  POLYTROPIC  for a motored or fired recording: a correct TDC
 *                              makes the compression line straight in
 *                              log P - log V (common practice). With k
 *                              changing along the compression, the line is
 *                              taken as ln p = C - c K, K = integral of k(T)
 *                              d ln V (k of gas_unburned at the mean gas
 *                              temperature; for a constant k this is
 *                              p V^n = const with n = c k, and c < 1 absorbs a
 *                              heat loss in proportion to k); the shift d is
 *                              the one that makes ln p = C - c K(theta - d)
 *                              fit best by least squares over
 *                              phasing_window_deg (default -60..-25 deg,
 *                              before combustion), with Brent's minimisation
 *                              over |d| <= 5 deg (solve.h). With a wall model
 *                              selected, the heat it predicts before
 *                              combustion is part of the expected line:
 *                              dK = k dln V + (k - 1) q dt / (p V). A heat loss
 *                              the test does not expect biases d: on the unit
 *                              tests' synthetic traces that lose heat by
 *                              Woschni (Hohenberg), d reads 0.34 (0.59) deg
 *                              early without a wall model and 0.27 (0.26) deg
 *                              off with the other one; treat it as a check,
 *                              not a calibration.
 *                  The shift is where true TDC lies on the recording's axis
 *                  (deg after the stated TDC). Above GC_HEATREL_PHASING_WARN_DEG
 *                  a warning "phasing_error" gives it; with phasing_correct = 1
 *                  the axis is moved by it, steps 1-3 are repeated, and the
 *                  warning "phasing_corrected" names both TDC angles.
 *   5. per cycle   loop work by the trapezoid rule in V over the whole cycle
 *                  (the closing segment included), split as measured.h does:
 *                  four-stroke gross = compression and expansion strokes
 *                  (|theta| < 180 deg), pumping = exhaust and intake strokes,
 *                  net = gross + pumping; IMEP = W / Vd, PMEP = -W_pump / Vd;
 *                  two-stroke: the whole loop is gross and net (no pumping).
 *                  Peak pressure (the highest sample) and its angle; the
 *                  highest pressure-rise rate dp/dtheta (central differences)
 *                  in the closed part; polytropic exponents (least squares of
 *                  ln p on ln V) over the compression and expansion windows.
 *   6. heat release over the closed part [ivc_deg, evo_deg] (default
 *                  -120..120 deg), single zone, first law (apparent, net):
 *                    dQn = k/(k-1) p dV + 1/(k-1) V dp
 *                  per sample interval with p, V and k at its midpoint (the
 *                  p dV + V dp part is then exact, d(pV); the p dV part is the
 *                  trapezoid rule). k = cp/cv from the gas models (gas.h) at
 *                  the mean gas temperature T = p V / (m R): unburned charge
 *                  gas_unburned; with has_burned_gas the charge turns into
 *                  gas_burned (e.g. complete-combustion products, combustion.h)
 *                  as it burns: cp = (1 - x) cp_u(T) + x cp_b(T), R likewise,
 *                  cv = cp - R, x the mass fraction burned of the previous pass
 *                  (passes repeat until the total heat release changes by less
 *                  than 1e-6 of itself, at most GC_HEATREL_MAX_PASSES). Trapped
 *                  mass m: trapped_mass_kg, or p V / (R_u T) at IVC from
 *                  T_ivc_K. A temperature outside the gas data's range is
 *                  clamped for k only (flag and warning "temperature_range").
 *                  Gross heat release adds the wall heat (wall_model):
 *                    dQg = dQn + h A (T - T_wall) dtheta / omega,
 *                    A = 2 pi B^2 / 4 + pi B V / (pi B^2 / 4) (flat head and
 *                    piston crown plus the liner above the piston: common
 *                    practice), omega = 2 pi N;
 *                  WOSCHNI   Woschni 1967 in the form of J. B. Heywood, Internal
 *                            Combustion Engine Fundamentals, 1988, eq. 12.19
 *                            (from memory): h = C0 B^-0.2 p^0.8 T^-0.55 w^0.8
 *                            (W/(m2 K), B m, p kPa, T K, w m/s), C0 = 3.26,
 *                            w = C1 Sp + C2 (Vd T_r / (p_r V_r)) (p - p_m),
 *                            C1 = 2.28, C2 = 0 before and 3.24e-3 m/(s K) from
 *                            the start of combustion (of the net pass), Sp the
 *                            mean piston speed 2 S N, reference state r at
 *                            IVC, p_m the motored pressure p_r (V_r / V)^n_m
 *                            with n_m = motored_exponent or, when 0, the
 *                            cycle's fitted compression exponent (1.32 when
 *                            the fit falls outside 1..1.7: flagged and
 *                            warned); the C2 term is 0 where p < p_m;
 *                  HOHENBERG Hohenberg 1979 (SAE 790825, from memory):
 *                            h = C1 V^-0.06 p^0.8 T^-0.4 (Sp + C2)^0.8
 *                            (W/(m2 K), V m3, p bar, T K, Sp m/s), C1 = 130,
 *                            C2 = 1.4 m/s.
 *                  With wall_model NONE gross = net, sample by sample.
 *   7. burn points from the cumulative heat release Q (gross with a wall
 *                  model, else net: result field mfb_basis_gross): end of
 *                  combustion (EOC) at the maximum of Q, start (SOC) at its
 *                  minimum before EOC (the last sample within 1e-6 of the
 *                  total above it, so a flat stretch counts to its end),
 *                  total = Q(EOC) - Q(SOC); x_b = (Q - Q(SOC)) / total; the
 *                  angle of x_b = f by linear interpolation at the first
 *                  crossing after SOC, for f = 10, 50, 90 % and any requested;
 *                  burn durations 0-10 % (SOC to 10 %) and 10-90 %;
 *                  combustion phasing CA50 = the 50 % angle.
 *                  Ringing intensity (Eng 2002, SAE 2002-01-2859, from
 *                  memory): RI = (beta (dp/dt)max)^2 / (2 k p_max) *
 *                  sqrt(k R T_max), beta = 0.05 ms, k and R at the highest
 *                  mean gas temperature T_max; W/m2 (needs the speed).
 *                  Combustion efficiency estimate: total / (fuel_per_cycle x
 *                  LHV) on that basis (an estimate: the single-zone model
 *                  ignores crevices, blow-by and dissociation).
 *   8. statistics  over cycles (gc_heatrel_stats): mean, sample standard
 *                  deviation (n - 1), COV = std / |mean|, lowest and highest,
 *                  LNV = lowest / mean (lowest normalised value). IMEP,
 *                  pumping, peak pressure and the work-side values over all
 *                  cycles, misfires included (common practice: COV of IMEP
 *                  shows them); burn values over the cycles that burned (not
 *                  misfired). Flags by a stated rule on each cycle's total
 *                  heat release against the median over all cycles:
 *                  misfire below GC_HEATREL_MISFIRE_FRACTION of it (or no
 *                  positive heat release at all), partial burn below
 *                  GC_HEATREL_PARTIAL_FRACTION (no flags when the median is
 *                  not positive: warning "no_combustion").
 *                  The ensemble-average trace goes through steps 5-7 too;
 *                  its curves are kept (angle, p, V, T, heat-release rate and
 *                  cumulative, net and gross, mass fraction burned).
 *
 * Validity: one cylinder; single zone; ideal gas; the closed part must
 * contain no valve event (the caller's IVC and EVO); residual gas is not
 * modelled apart from what gas_unburned holds; the pressure trace is used as
 * it is (no filtering: a noisy trace gives a noisy rate and rise rate).
 *
 * Units: SI inside (Pa, m, m3, K, J, kg, s, rev/s) except crank angles,
 * which are degrees of crank angle as their names say (_deg), measured from
 * firing TDC (after TDC positive) in results. Rates per degree say so
 * (_per_deg). Errors carry JSON pointers of the future route's input keys
 * ("/bore", "/pegging/window"); warnings carry a stable snake_case code.
 *
 * Ownership: gc_heatrel_traces and gc_heatrel_result own heap arrays; each
 * has one free function (NULL-safe, idempotent). Nothing else allocates
 * memory the caller must free. No global state: thread-safe.
 */
#ifndef GASCYCLE_HEATREL_H
#define GASCYCLE_HEATREL_H

#include <stddef.h>

#include "gascycle/error.h"
#include "gascycle/gas.h"
#include "gascycle/measured.h"

/* ---- limits (each stated once) -------------------------------------------- */
#define GC_HEATREL_MAX_CYCLES 1000       /* pressure columns in one recording */
#define GC_HEATREL_MIN_SAMPLES 180       /* samples per cycle (4 deg over 720 deg) */
#define GC_HEATREL_MAX_SAMPLES 7200      /* samples per cycle (0.1 deg over 720 deg) */
#define GC_HEATREL_MAX_VALUES 2000000    /* cycles x samples (16 MB of doubles) */
#define GC_HEATREL_CSV_MAX_BYTES (32L * 1024 * 1024) /* longest CSV text parsed */
#define GC_HEATREL_LABEL_LEN 32          /* column label kept per cycle (truncated) */
#define GC_HEATREL_GAP_DEG 5.0           /* cycle span may fall short by this or one step */
#define GC_HEATREL_MAX_EXTRA_POINTS 8    /* requested burn fractions beyond 10/50/90 % */
#define GC_HEATREL_MAX_POINTS (3 + GC_HEATREL_MAX_EXTRA_POINTS)
#define GC_HEATREL_MAX_WARNINGS 24
#define GC_HEATREL_WARNING_LEN 256
#define GC_HEATREL_MAX_PASSES 6          /* k(x_b) passes of the heat-release loop */

/* ---- stated defaults and rules -------------------------------------------- */
#define GC_HEATREL_IVC_DEFAULT_DEG (-120.0)   /* closed part start, deg aTDC */
#define GC_HEATREL_EVO_DEFAULT_DEG 120.0      /* closed part end, deg aTDC */
#define GC_HEATREL_PEG_EXPONENT_DEFAULT 1.32  /* fixed polytropic exponent of pegging */
#define GC_HEATREL_LOSS_ANGLE_DEFAULT_DEG 0.7 /* thermodynamic loss angle, motored */
#define GC_HEATREL_PHASING_WARN_DEG 0.2       /* |shift| above this is warned */
#define GC_HEATREL_PHASING_MAX_DEG 5.0        /* search range of the polytropic test */
#define GC_HEATREL_WALL_T_DEFAULT_K 450.0     /* wall temperature (common practice) */
#define GC_HEATREL_MISFIRE_FRACTION 0.10      /* total heat release / median below: misfire */
#define GC_HEATREL_PARTIAL_FRACTION 0.70      /* ... below: partial burn */
#define GC_HEATREL_SOC_EPS 1e-6               /* plateau tolerance of SOC, of the total */

/* ---- named constants of the published correlations ------------------------ */
#define GC_HEATREL_WOSCHNI_C0 3.26        /* W/(m2 K) with B m, p kPa, T K, w m/s */
#define GC_HEATREL_WOSCHNI_C1 2.28        /* -, compression, combustion, expansion */
#define GC_HEATREL_WOSCHNI_C2 3.24e-3     /* m/(s K), from the start of combustion */
#define GC_HEATREL_WOSCHNI_T_EXP (-0.55)  /* exponent of T */
#define GC_HEATREL_HOHENBERG_C1 130.0     /* W/(m2 K) with V m3, p bar, T K, Sp m/s */
#define GC_HEATREL_HOHENBERG_C2 1.4       /* m/s added to the mean piston speed */
#define GC_HEATREL_RINGING_BETA_S 5.0e-5  /* Eng 2002: beta = 0.05 ms */

/* ---- a recording ------------------------------------------------------------ */

typedef struct gc_heatrel_traces {
    int n_cycles;                 /* pressure columns */
    int n_samples;                /* samples per cycle (rows) */
    double *angle_deg;            /* n_samples crank angles, deg, strictly increasing */
    double *P_Pa;                 /* n_cycles x n_samples, cycle-major:
                                     P_Pa[c * n_samples + i]; Pa, relative or absolute */
    char (*label)[GC_HEATREL_LABEL_LEN]; /* n_cycles column names (without the unit) */
} gc_heatrel_traces;

/* Allocates a zeroed recording of n_cycles x n_samples (within the limits
 * above; GC_ERR_INVALID outside them, GC_ERR_NOMEM). *t is overwritten. */
int gc_heatrel_traces_alloc(gc_heatrel_traces *t, int n_cycles, int n_samples, gc_error *err);
/* Frees the arrays and zeroes *t (NULL-safe, may be called twice). */
void gc_heatrel_traces_free(gc_heatrel_traces *t);

/* ---- CSV text ------------------------------------------------------------------
 * Format: UTF-8 text (a byte-order mark is skipped), lines ending in LF or
 * CRLF; lines that are empty or start with '#' are skipped anywhere. The
 * first other line is the header: "angle [deg]" (or [rad]) then one column
 * per cycle "name [unit]" with any pressure unit of units.h (bar, kPa, Pa,
 * MPa, psi, ...; each column its own; gauge units are refused), a header cell
 * may be in double quotes. The separator is the first of ',', ';' or TAB in
 * the header line. Each following line: the angle, then one pressure per
 * cycle, plain decimal numbers with a '.' point (strtod in the "C" locale
 * whatever the process locale; no NaN, Inf or hex). Angles must increase
 * strictly. Limits: GC_HEATREL_MIN_SAMPLES..GC_HEATREL_MAX_SAMPLES rows,
 * 1..GC_HEATREL_MAX_CYCLES pressure columns, GC_HEATREL_MAX_VALUES values,
 * GC_HEATREL_CSV_MAX_BYTES bytes. Line and column numbers are 1-based
 * (every line of the text counts, comments too). */

typedef enum gc_heatrel_csv_code {   /* append-only */
    GC_HEATREL_CSV_OK = 0,
    GC_HEATREL_CSV_EMPTY = 1,        /* no header line, or a header but no data row */
    GC_HEATREL_CSV_TOO_LARGE = 2,    /* text longer than GC_HEATREL_CSV_MAX_BYTES */
    GC_HEATREL_CSV_HEADER = 3,       /* a header cell without "[unit]" or with a wrong unit */
    GC_HEATREL_CSV_COLUMNS = 4,      /* fewer than 2 or more than 1 + MAX_CYCLES columns */
    GC_HEATREL_CSV_RAGGED = 5,       /* another number of fields than the header; column =
                                        the first missing or the first extra field */
    GC_HEATREL_CSV_NOT_NUMBER = 6,   /* a cell that is not a finite decimal number */
    GC_HEATREL_CSV_NOT_INCREASING = 7,/* an angle not above the one before it */
    GC_HEATREL_CSV_TOO_SHORT = 8,    /* fewer than GC_HEATREL_MIN_SAMPLES rows */
    GC_HEATREL_CSV_TOO_LONG = 9,     /* more than MAX_SAMPLES rows or MAX_VALUES values */
    GC_HEATREL_CSV_NOMEM = 10        /* allocation failed */
} gc_heatrel_csv_code;

typedef struct gc_heatrel_csv_error {
    int code;                        /* gc_heatrel_csv_code */
    int line;                        /* 1-based line of the text, 0 = none */
    int column;                      /* 1-based field, 0 = none (whole line or text) */
    char message[GC_ERROR_MESSAGE_LEN]; /* one sentence naming line and column */
} gc_heatrel_csv_error;

/* Stable snake_case name of a code ("csv_ragged_row"); never NULL. */
const char *gc_heatrel_csv_code_name(int code);

/* Parses len bytes of text (need not be NUL-terminated) into *out (allocated
 * here; free with gc_heatrel_traces_free; left zeroed on error). Returns
 * GC_OK, GC_ERR_INVALID (bad text: details in *err) or GC_ERR_NOMEM. err may
 * be NULL. */
int gc_heatrel_csv_parse(const char *text, size_t len, gc_heatrel_traces *out,
                         gc_heatrel_csv_error *err);

/* ---- analysis input --------------------------------------------------------- */

typedef enum gc_heatrel_peg_method {
    GC_HEATREL_PEG_NONE = 0,        /* the signal is absolute already */
    GC_HEATREL_PEG_INTAKE = 1,      /* intake-manifold pressure near BDC */
    GC_HEATREL_PEG_TWO_POINT = 2,   /* Randolph 1990 two-point, fixed exponent */
    GC_HEATREL_PEG_POLYTROPIC = 3   /* fixed exponent, least squares over the window */
} gc_heatrel_peg_method;

typedef enum gc_heatrel_phasing_method {
    GC_HEATREL_PHASING_NONE = 0,
    GC_HEATREL_PHASING_LOSS_ANGLE = 1, /* motored recording: peak vs loss angle */
    GC_HEATREL_PHASING_POLYTROPIC = 2  /* straight compression line in log p - log V */
} gc_heatrel_phasing_method;

typedef enum gc_heatrel_wall_model {
    GC_HEATREL_WALL_NONE = 0,       /* gross = net */
    GC_HEATREL_WALL_WOSCHNI = 1,    /* Woschni 1967 */
    GC_HEATREL_WALL_HOHENBERG = 2   /* Hohenberg 1979 */
} gc_heatrel_wall_model;

typedef struct gc_heatrel_input {
    gc_measured_geometry geometry;  /* bore, stroke, rod length (m), compression ratio */
    int strokes;                    /* 4 or 2 */
    double tdc_angle_deg;           /* firing TDC on the recording's angle axis, deg */
    double speed_rev_s;             /* rev/s; 0 = not given (wall heat and ringing need it) */
    /* pegging */
    int peg_method;                 /* gc_heatrel_peg_method */
    double peg_intake_pressure_Pa;  /* INTAKE: manifold pressure, Pa */
    double peg_window_deg[2];       /* INTAKE: averaging window, deg aTDC (TWO_POINT and
                                       POLYTROPIC use compression_window_deg: its ends
                                       are the two points, or it is the fit window) */
    double peg_exponent;            /* TWO_POINT, POLYTROPIC: fixed exponent n > 1 */
    /* phasing */
    int phasing_method;             /* gc_heatrel_phasing_method */
    double loss_angle_deg;          /* LOSS_ANGLE: expected, deg (>= 0) */
    double phasing_window_deg[2];   /* POLYTROPIC: fit window, deg aTDC */
    int phasing_correct;            /* 1: move TDC by the shift found (warned) */
    /* gas and trapped mass */
    gc_gas gas_unburned;            /* fresh charge (air, humid air, a mixture, cold) */
    int has_burned_gas;             /* 1: gas_burned is used as x_b grows */
    gc_gas gas_burned;              /* burned charge (e.g. combustion products) */
    double T_ivc_K;                 /* mean gas temperature at IVC, K (with trapped_mass 0) */
    double trapped_mass_kg;         /* kg; 0 = p V / (R T_ivc) at IVC */
    double ivc_deg, evo_deg;        /* closed part, deg aTDC */
    double compression_window_deg[2]; /* exponent fits (and motored n), deg aTDC */
    double expansion_window_deg[2];
    /* wall heat transfer (gross heat release) */
    int wall_model;                 /* gc_heatrel_wall_model */
    double T_wall_K;                /* K */
    double motored_exponent;        /* Woschni p_m exponent; 0 = fitted per cycle */
    /* burn points */
    int n_extra_points;             /* 0..GC_HEATREL_MAX_EXTRA_POINTS */
    double extra_points[GC_HEATREL_MAX_EXTRA_POINTS]; /* fractions, 0 < f < 1 */
    /* fuel (combustion efficiency estimate) */
    double fuel_per_cycle_kg;       /* kg per cylinder per cycle, 0 = not given */
    double fuel_heating_value_J_per_kg; /* LHV, J/kg, 0 = not given */
} gc_heatrel_input;

/* Zeroes *in and sets the stated defaults: four-stroke, TDC at 0, no
 * pegging (absolute signal), intake peg window -185..-175 deg, peg exponent
 * 1.32, no phasing test, loss angle 0.7 deg, phasing window -60..-25 deg,
 * air as the unburned gas, T_ivc 0 (must be given unless trapped_mass is),
 * closed part -120..120 deg, compression window -100..-65 deg, expansion
 * window 60..100 deg, no wall model, wall at 450 K, fitted motored exponent. */
void gc_heatrel_input_init(gc_heatrel_input *in);

/* ---- results ----------------------------------------------------------------- */

enum {                              /* gc_heatrel_cycle.flags bits */
    GC_HEATREL_FLAG_MISFIRE = 1,    /* total heat release < MISFIRE_FRACTION x median */
    GC_HEATREL_FLAG_PARTIAL = 2,    /* total heat release < PARTIAL_FRACTION x median */
    GC_HEATREL_FLAG_NO_BURN = 4,    /* no positive heat release: no burn points */
    GC_HEATREL_FLAG_T_RANGE = 8,    /* mean gas temperature left the gas data's range */
    GC_HEATREL_FLAG_MOTORED_N = 16  /* fitted exponent outside 1..1.7: Woschni's motored
                                       pressure used GC_HEATREL_PEG_EXPONENT_DEFAULT */
};

typedef struct gc_heatrel_cycle {
    double peg_offset_Pa;           /* added to the signal, Pa */
    double imep_gross_Pa, imep_net_Pa, pmep_Pa;
    double work_gross_J, work_net_J, work_pumping_J;
    double P_max_Pa, angle_P_max_deg;       /* highest sample */
    double dP_max_Pa_per_deg, angle_dP_max_deg; /* highest rise rate, closed part */
    double n_compression, n_expansion;      /* fitted polytropic exponents, - */
    double trapped_mass_kg;                 /* kg, given or p V / (R T_ivc) at IVC */
    double T_max_K, angle_T_max_deg;        /* highest mean gas temperature */
    double Q_net_J, Q_gross_J;              /* cumulative at EVO minus at IVC, J */
    double Q_wall_J;                        /* wall heat over the closed part, J */
    double Q_total_J;                       /* burned total Q(EOC) - Q(SOC), mfb basis, J */
    double soc_deg, eoc_deg;                /* start and end of combustion */
    int n_points;                           /* burn points below (3 + extra) */
    double point_deg[GC_HEATREL_MAX_POINTS];/* 10, 50, 90 %, then the extra ones */
    double ca50_deg;                        /* = point_deg[1] */
    double burn_0_10_deg, burn_10_90_deg;
    int has_ringing;
    double ringing_W_per_m2;                /* Eng 2002 */
    int has_efficiency;
    double combustion_efficiency;           /* -, total / (fuel x LHV) */
    int passes;                             /* k(x_b) passes used */
    unsigned flags;                         /* GC_HEATREL_FLAG_* */
} gc_heatrel_cycle;

typedef struct gc_heatrel_stat {
    int n;                          /* values (cycles) counted */
    double mean, std;               /* std: sample standard deviation (n - 1) */
    double cov;                     /* std / |mean| (0 when mean = 0 or n < 2) */
    double min, max;
    double lnv;                     /* min / mean (0 when mean = 0) */
    int i_min, i_max;               /* cycle index of min and max (-1 when n = 0) */
} gc_heatrel_stat;

typedef struct gc_heatrel_warning {
    char field[GC_ERROR_FIELD_LEN];         /* JSON pointer of the input concerned, or "" */
    char code[32];                          /* stable snake_case code */
    char message[GC_HEATREL_WARNING_LEN];   /* one sentence */
} gc_heatrel_warning;

/* The ensemble-average trace and its heat-release curves. Arrays of n
 * (whole cycle, from -period/2) and of n_closed (the closed part, starting at
 * index i_ivc of the whole-cycle arrays). */
typedef struct gc_heatrel_curves {
    int n, i_ivc, n_closed;
    double *angle_deg;              /* n, deg aTDC */
    double *P_Pa;                   /* n, ensemble-average pegged pressure */
    double *V_m3;                   /* n */
    double *T_K;                    /* n_closed, mean gas temperature */
    double *dQn_J_per_deg, *Qn_J;   /* n_closed, net rate and cumulative (0 at IVC) */
    double *dQg_J_per_deg, *Qg_J;   /* n_closed, gross */
    double *mfb;                    /* n_closed, mass fraction burned (0..1, mfb basis) */
} gc_heatrel_curves;

typedef struct gc_heatrel_result {
    int n_cycles, n_samples;
    double period_deg;              /* 720 or 360 */
    double tdc_angle_deg;           /* firing TDC used on the recording's axis */
    double displacement_m3, clearance_m3;
    double trapped_mass_kg;         /* of the ensemble average (per cycle: same rule) */
    int mfb_basis_gross;            /* 1: burn points from the gross curve */
    int n_points;
    double point_fraction[GC_HEATREL_MAX_POINTS]; /* 0.1, 0.5, 0.9, then the extra ones */
    /* pegging */
    int peg_method;
    gc_heatrel_stat peg_offset;     /* Pa, over cycles */
    /* phasing */
    int phasing_method;
    int has_phasing;
    double phasing_shift_deg;       /* true TDC on the recording's axis minus the stated */
    double phasing_exponent;        /* POLYTROPIC: effective n (c x mean k); LOSS_ANGLE: 0 */
    double phasing_rms;             /* POLYTROPIC: rms residual of ln p; LOSS_ANGLE: 0 */
    double angle_P_max_motored_deg; /* LOSS_ANGLE: interpolated peak angle */
    int phasing_corrected;          /* 1: tdc_angle_deg includes the shift */
    /* per cycle (heap, n_cycles) */
    gc_heatrel_cycle *cycles;
    int n_misfire, n_partial;
    double Q_total_median_J;        /* the flags' reference */
    /* statistics: work side over all cycles, burn side over burning cycles */
    gc_heatrel_stat imep_gross, imep_net, pmep, P_max, angle_P_max, dP_max;
    gc_heatrel_stat n_compression, n_expansion, T_max, Q_total;
    gc_heatrel_stat point[GC_HEATREL_MAX_POINTS];
    gc_heatrel_stat burn_0_10, burn_10_90;
    gc_heatrel_stat ringing, combustion_efficiency;
    /* ensemble-average trace: its reduction and curves */
    gc_heatrel_cycle ensemble;
    gc_heatrel_curves curves;
    int n_warnings;
    gc_heatrel_warning warnings[GC_HEATREL_MAX_WARNINGS];
} gc_heatrel_result;

/* Checks the input against the recording; collects up to max_errors errors
 * (errs may be NULL); returns GC_OK or the first code, *n_errors the count
 * (may be NULL). */
int gc_heatrel_validate(const gc_heatrel_input *in, const gc_heatrel_traces *tr,
                        gc_error *errs, int max_errors, int *n_errors);

/* Validates (the first error into err) and analyses the recording into *r,
 * which it allocates (free with gc_heatrel_result_free, also after an error;
 * r is zeroed first). A pegged pressure that is not positive is
 * GC_ERR_INVALID naming the cycle and angle. */
int gc_heatrel_analyse(const gc_heatrel_input *in, const gc_heatrel_traces *tr,
                       gc_heatrel_result *r, gc_error *err);

/* Frees the per-cycle table and the curves (NULL-safe, may be called twice). */
void gc_heatrel_result_free(gc_heatrel_result *r);

/* ---- building blocks (public for tests and for other modules) ---------------- */

/* Statistics of n values (see step 8); n = 0 gives a zeroed stat with
 * i_min = i_max = -1. Two-pass mean and deviation. */
void gc_heatrel_stats(const double *x, int n, gc_heatrel_stat *s);

/* Wiebe (1962) mass fraction burned x_b = 1 - exp(-a y^(m+1)),
 * y = (theta - theta0) / dtheta (0 before theta0), and its derivative dx/dtheta
 * (per deg) through dxdth (may be NULL). a = 6.908 puts 99.9 % at the end of
 * dtheta. */
double gc_heatrel_wiebe(double theta_deg, double theta0_deg, double dtheta_deg, double a,
                        double m, double *dxdth_per_deg);

/* Convective heat-transfer coefficient, W/(m2 K), of Woschni 1967 for a bore
 * (m), pressure (Pa), temperature (K) and characteristic gas velocity w (m/s);
 * of Hohenberg 1979 for a volume (m3), pressure, temperature and mean piston
 * speed (m/s). */
double gc_heatrel_woschni_h(double bore_m, double P_Pa, double T_K, double w_m_s);
double gc_heatrel_hohenberg_h(double V_m3, double P_Pa, double T_K, double Sp_m_s);

/* Ringing intensity (Eng 2002), W/m2, from the highest pressure-rise rate
 * (Pa/s), the peak pressure (Pa), k, R (J/(kg K)) and T_max (K). */
double gc_heatrel_ringing(double dPdt_max_Pa_per_s, double P_max_Pa, double k, double R,
                          double T_max_K);

#endif
