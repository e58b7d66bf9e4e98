/*
 * if97_region3.c — IAPWS-IF97 region 3 (near the critical point): the basic
 * equation phi(delta, tau) (IAPWS R7-97(2012) Eq. 28, Table 30) with its
 * derivatives; the density at a given (p, T) on the liquid or vapour branch
 * by safeguarded Newton iteration on that equation, started from the
 * SR5-05(2016) v(p, T) of if97_region3_vpt.c (bracket searches as the
 * fallback); and the backward
 * equations of IAPWS SR3-03(2014) ("Revised Supplementary Release on
 * Backward Equations for the Functions T(p,h), v(p,h) and T(p,s), v(p,s) for
 * Region 3"): the 3a/3b boundary h_3ab(p) (Eq. 1, Table 2), T(p, h)
 * (Eqs. 2 and 3, Tables 3 and 4), v(p, h) (Eqs. 4 and 5, Tables 6 and 7),
 * T(p, s) (Eqs. 6 and 7, Tables 10 and 11) and v(p, s) (Eqs. 8 and 9,
 * Tables 13 and 14).
 *
 * Reduced variables: delta = rho / 322 kg/m3, tau = 647.096 K / T (Eq. 28).
 * Validity: 623.15 K <= T <= T_B23(p), p_B23(T) <= p <= 100 MPa. The
 * backward equations (consistent with Eq. 28 to the tolerances of SR3-03
 * Table 1, e.g. 25 mK in T and 0.01 % in v) only start the iterations in
 * if97.c.
 */
#include "if97_private.h"

#include <math.h>

/* R7-97(2012) Table 30: I_i, J_i, n_i of Eq. 28, i = 2..40 (n_1 apart). */
#define R3_N1 0.10658070028513e1
static const gc__if97_bterm R3[] = {
    GC__IF97_BT(0, 0, -0.15732845290239e2),  GC__IF97_BT(0, 1, 0.20944396974307e2),
    GC__IF97_BT(0, 2, -0.76867707878716e1),  GC__IF97_BT(0, 7, 0.26185947787954e1),
    GC__IF97_BT(0, 10, -0.28080781148620e1), GC__IF97_BT(0, 12, 0.12053369696517e1),
    GC__IF97_BT(0, 23, -0.84566812812502e-2), GC__IF97_BT(1, 2, -0.12654315477714e1),
    GC__IF97_BT(1, 6, -0.11524407806681e1),  GC__IF97_BT(1, 15, 0.88521043984318e0),
    GC__IF97_BT(1, 17, -0.64207765181607e0), GC__IF97_BT(2, 0, 0.38493460186671e0),
    GC__IF97_BT(2, 2, -0.85214708824206e0),  GC__IF97_BT(2, 6, 0.48972281541877e1),
    GC__IF97_BT(2, 7, -0.30502617256965e1),  GC__IF97_BT(2, 22, 0.39420536879154e-1),
    GC__IF97_BT(2, 26, 0.12558408424308e0),  GC__IF97_BT(3, 0, -0.27999329698710e0),
    GC__IF97_BT(3, 2, 0.13899799569460e1),   GC__IF97_BT(3, 4, -0.20189915023570e1),
    GC__IF97_BT(3, 16, -0.82147637173963e-2), GC__IF97_BT(3, 26, -0.47596035734923e0),
    GC__IF97_BT(4, 0, 0.43984074473500e-1),  GC__IF97_BT(4, 2, -0.44476435428739e0),
    GC__IF97_BT(4, 4, 0.90572070719733e0),   GC__IF97_BT(4, 26, 0.70522450087967e0),
    GC__IF97_BT(5, 1, 0.10770512626332e0),   GC__IF97_BT(5, 3, -0.32913623258954e0),
    GC__IF97_BT(5, 26, -0.50871062041158e0), GC__IF97_BT(6, 0, -0.22175400873096e-1),
    GC__IF97_BT(6, 2, 0.94260751665092e-1),  GC__IF97_BT(6, 26, 0.16436278447961e0),
    GC__IF97_BT(7, 2, -0.13503372241348e-1), GC__IF97_BT(8, 26, -0.14834345352472e-1),
    GC__IF97_BT(9, 2, 0.57922953628084e-3),  GC__IF97_BT(9, 26, 0.32308904703711e-2),
    GC__IF97_BT(10, 0, 0.80964802996215e-4), GC__IF97_BT(10, 1, -0.16557679795037e-3),
    GC__IF97_BT(11, 26, -0.44923899061815e-4),
};

/* Eq. 28 and its derivatives (R7-97 Table 32), scaled as in gc__if97_helm:
 * no division, the powers of delta and tau multiply through. */
void gc__if97_r3_helm(double rho, double T_K, gc__if97_helm *f)
{
    double del = rho / GC_IF97_RHOC_KG_PER_M3, tau = GC_IF97_TC_K / T_K;
    double pd[12], pt[27], s[7];
    gc__if97_powers(del, 0, 11, pd);
    gc__if97_powers(tau, 0, 26, pt);
    gc__if97_bsums(R3, GC__IF97_NTERMS(R3), pd, 0, pt, 0, 1, s);
    f->f = R3_N1 * log(del) + s[0];
    f->A = R3_N1 + s[1];
    f->B = -R3_N1 + s[2];
    f->C = s[3];
    f->D = s[4];
    f->E = s[5];
}

/* ---- density at (p, T) ------------------------------------------------- */

#define RHO_REL_TOL 1e-12     /* converged when the Newton step is below this times rho */
#define P_REL_TOL 1e-13       /* ... or p(rho, T) meets P to this, the rounding level of Eq. 28 */
#define RHO_MAX_ITER 200
#define RHO_START_LIQ 760.0   /* kg/m3, above every region-3 liquid density */
#define RHO_CAP 1200.0        /* kg/m3, give up searching upwards beyond this */

/* One isotherm of Eq. 28: T and the powers of tau, built once per solve. */
typedef struct r3_iso {
    double T_K;
    double pt[27];
} r3_iso;

static void r3_iso_init(r3_iso *iso, double T_K)
{
    iso->T_K = T_K;
    gc__if97_powers(GC_IF97_TC_K / T_K, 0, 26, iso->pt);
}

/* p(rho, T) and dp/drho at T from Eq. 28 (R7-97 Table 31: p = rho R T delta
 * phi_delta; dp/drho = R T (2 delta phi_delta + delta^2 phi_deltadelta));
 * only the two delta-sums are formed. */
static double r3_p(const r3_iso *iso, double rho, double *dp_drho)
{
    double pd[12], A = R3_N1, B = -R3_N1;
    gc__if97_powers(rho / GC_IF97_RHOC_KG_PER_M3, 0, 11, pd);
    for (int i = 0; i < GC__IF97_NTERMS(R3); i++) {
        double q = pd[R3[i].I] * iso->pt[R3[i].J];
        A += R3[i].nI * q;
        B += R3[i].nII * q;
    }
    double RT = GC_IF97_R_J_PER_KGK * iso->T_K;
    *dp_drho = RT * (2.0 * A + B);
    return rho * RT * A;
}

/* Newton iteration kept inside the bracket (lo, hi) known so far: a step that
 * leaves it, or a point where p does not rise with rho, bisects instead.
 * From the liquid side (start above the root) the isotherm is convex and
 * Newton descends monotonically; from the vapour side (start below) it is
 * concave and Newton climbs monotonically; so neither crosses the unstable
 * part of a subcritical isotherm, and the bisection only guards rounding. */
static int r3_rho_newton(const r3_iso *iso, double P_Pa, double rho, double lo, double hi,
                         double *out)
{
    for (int it = 0; it < RHO_MAX_ITER; it++) {
        double dp, F = r3_p(iso, rho, &dp) - P_Pa;
        if (fabs(F) <= P_REL_TOL * P_Pa && dp > 0.0) {
            *out = rho;
            return GC_OK;
        }
        if (F > 0.0)
            hi = rho < hi ? rho : hi;
        else
            lo = rho > lo ? rho : lo;
        double rn = (dp > 0.0) ? rho - F / dp : -1.0;
        if (dp > 0.0 && fabs(rn - rho) <= RHO_REL_TOL * rho) {
            *out = rn;
            return GC_OK;
        }
        if (!(rn >= lo && rn <= hi)) {
            if (!(hi < RHO_CAP) || !(lo > 0.0))
                return GC_ERR_NOCONV;        /* no bracket yet to fall back on */
            rn = 0.5 * (lo + hi);
            if (hi - lo <= RHO_REL_TOL * rho) {   /* closed on rounding noise */
                *out = rn;
                return (dp > 0.0) ? GC_OK : GC_ERR_NOCONV;
            }
        }
        rho = rn;
    }
    return GC_ERR_NOCONV;
}

/* A density above the liquid root: the region-1 density at (623.15 K, P)
 * (a liquid at fixed P only expands on heating, and region 1 meets region 3
 * there), raised until p(rho, T) > P. */
static int r3_rho_above(const r3_iso *iso, double P_Pa, double *r)
{
    gc__if97_gibbs g;
    double dp, T13 = GC_IF97_T_R13_K;
    gc__if97_r1_gibbs(T13, P_Pa, 1, &g);
    *r = P_Pa / (GC_IF97_R_J_PER_KGK * T13 * g.a);   /* 1 / v, R7-97 Table 3 */
    if (!(*r > 0.0 && *r < RHO_CAP))
        *r = RHO_START_LIQ;
    while (r3_p(iso, *r, &dp) <= P_Pa) {
        *r *= 1.05;
        if (*r > RHO_CAP)
            return GC_ERR_NOCONV;
    }
    return GC_OK;
}

/* A density below the vapour root: the ideal-gas density (water vapour's
 * compressibility factor is below 1 in region 3), halved until p < P. */
static int r3_rho_below(const r3_iso *iso, double P_Pa, double *r)
{
    double dp;
    *r = P_Pa / (GC_IF97_R_J_PER_KGK * iso->T_K);
    while (r3_p(iso, *r, &dp) >= P_Pa) {
        *r *= 0.5;
        if (*r < 1e-6)
            return GC_ERR_NOCONV;
    }
    return GC_OK;
}

/* The root by bracket searches alone (no v(p, T) start). */
static int r3_rho_search(const r3_iso *iso, double P_Pa, int branch, double *rho)
{
    double r_hi = RHO_CAP, r_lo = 0.0;
    if (branch != GC__IF97_BRANCH_VAP && r3_rho_above(iso, P_Pa, &r_hi) != GC_OK)
        return GC_ERR_NOCONV;
    if (branch != GC__IF97_BRANCH_LIQ && r3_rho_below(iso, P_Pa, &r_lo) != GC_OK)
        return GC_ERR_NOCONV;
    if (branch == GC__IF97_BRANCH_LIQ)
        return r3_rho_newton(iso, P_Pa, r_hi, 0.0, r_hi, rho);
    if (branch == GC__IF97_BRANCH_VAP)
        return r3_rho_newton(iso, P_Pa, r_lo, r_lo, RHO_CAP, rho);
    /* monotonic isotherm: both bounds known */
    return r3_rho_newton(iso, P_Pa, 0.5 * (r_lo + r_hi), r_lo, r_hi, rho);
}

/* The root started from the SR5-05 density rho0 = 1 / v(p, T) of the
 * state's subregion (if97_region3_vpt.c) by the same safeguarded Newton
 * iteration and tolerances (RHO_REL_TOL, P_REL_TOL) as the search route. The
 * answer is taken only if it lies within a margin m of rho0 and on its
 * branch's side of the critical density: a liquid root at or above p_sat(T)
 * is above rho_c, a vapour root at or below it is below (between them lies
 * the unstable part of a subcritical isotherm, where Newton never converges
 * as dp/drho <= 0 there), so a root of the other phase, metastable or not,
 * is refused and the search route answers instead. m is about 5 times the
 * largest |dv/v| of the subregion's equation against Eq. 28 on a dense grid
 * (6.4 million states, near-critical ones dense; below 1e-5 in 3a..3t,
 * 1e-3 in 3u..3x, 1.8e-2 in 3y and 3z): there the started route answered
 * every state, within 1e-10 of the search route's density
 * (tests/unit/test_if97_sr505.c checks a coarser grid). */
static double sr5_margin(char sub)
{
    if (sub >= 'a' && sub <= 't')
        return 5e-5;
    if (sub >= 'u' && sub <= 'x')
        return 5e-3;
    return 0.1;
}

static int r3_rho_started(const r3_iso *iso, double P_Pa, int branch, double *rho)
{
    char sub = gc__if97_r3_subregion(P_Pa, iso->T_K, branch);
    double rho0 = 1.0 / gc__if97_sr5_v(sub, P_Pa, iso->T_K), m = sr5_margin(sub);
    double lo = rho0 * (1.0 - m), hi = rho0 * (1.0 + m), r = 0.0;
    if (!(rho0 > 0.0 && hi < RHO_CAP))
        return GC_ERR_NOCONV;
    int rc = r3_rho_newton(iso, P_Pa, rho0, 0.0, RHO_CAP, &r);
    if (rc != GC_OK || !(r >= lo && r <= hi))
        return GC_ERR_NOCONV;
    if ((branch == GC__IF97_BRANCH_LIQ && !(r > GC_IF97_RHOC_KG_PER_M3)) ||
        (branch == GC__IF97_BRANCH_VAP && !(r < GC_IF97_RHOC_KG_PER_M3)))
        return GC_ERR_NOCONV;
    *rho = r;
    return GC_OK;
}

int gc__if97_r3_rho_PT(double P_Pa, double T_K, int branch, double *rho)
{
    r3_iso iso;
    r3_iso_init(&iso, T_K);
    if (r3_rho_started(&iso, P_Pa, branch, rho) == GC_OK)
        return GC_OK;
    return r3_rho_search(&iso, P_Pa, branch, rho);
}

int gc__if97_r3_rho_PT_search(double P_Pa, double T_K, int branch, double *rho)
{
    r3_iso iso;
    r3_iso_init(&iso, T_K);
    return r3_rho_search(&iso, P_Pa, branch, rho);
}

/* ---- SR3-03 backward equations ----------------------------------------- */

/* SR3-03 Table 2: n_1..n_4 of Eq. 1, h_3ab(p) / 1 kJ/kg = sum n_i pi^(i-1),
 * pi = p / 1 MPa. */
double gc__if97_h3ab(double P_Pa)
{
    double pi = P_Pa / 1e6;
    return 1e3 * (0.201464004206875e4 +
                  pi * (0.374696550136983e1 +
                        pi * (-0.219921901054187e-1 + pi * 0.875131686009950e-4)));
}

/* SR3-03 Table 3: T3a(p, h), Eq. 2: T / 760 K = sum n (pi + 0.240)^I
 * (eta - 0.615)^J, pi = p / 100 MPa, eta = h / 2300 kJ/kg. */
static const gc__if97_term T3A_PH[] = {
    { -12, 0, -0.133645667811215e-6 }, { -12, 1, 0.455912656802978e-5 },
    { -12, 2, -0.146294640700979e-4 }, { -12, 6, 0.639341312970080e-2 },
    { -12, 14, 0.372783927268847e3 },  { -12, 16, -0.718654377460447e4 },
    { -12, 20, 0.573494752103400e6 },  { -12, 22, -0.267569329111439e7 },
    { -10, 1, -0.334066283302614e-4 }, { -10, 5, -0.245479214069597e-1 },
    { -10, 12, 0.478087847764996e2 },  { -8, 0, 0.764664131818904e-5 },
    { -8, 2, 0.128350627676972e-2 },   { -8, 4, 0.171219081377331e-1 },
    { -8, 10, -0.851007304583213e1 },  { -5, 2, -0.136513461629781e-1 },
    { -3, 0, -0.384460997596657e-5 },  { -2, 1, 0.337423807911655e-2 },
    { -2, 3, -0.551624873066791e0 },   { -2, 4, 0.729202277107470e0 },
    { -1, 0, -0.992522757376041e-2 },  { -1, 2, -0.119308831407288e0 },
    { 0, 0, 0.793929190615421e0 },     { 0, 1, 0.454270731799386e0 },
    { 1, 1, 0.209998591259910e0 },     { 3, 0, -0.642109823904738e-2 },
    { 3, 1, -0.235155868604540e-1 },   { 4, 0, 0.252233108341612e-2 },
    { 4, 3, -0.764885133368119e-2 },   { 10, 4, 0.136176427574291e-1 },
    { 12, 5, -0.133027883575669e-1 },
};

/* SR3-03 Table 4: T3b(p, h), Eq. 3: T / 860 K = sum n (pi + 0.298)^I
 * (eta - 0.720)^J, eta = h / 2800 kJ/kg. */
static const gc__if97_term T3B_PH[] = {
    { -12, 0, 0.323254573644920e-4 },  { -12, 1, -0.127575556587181e-3 },
    { -10, 0, -0.475851877356068e-3 }, { -10, 1, 0.156183014181602e-2 },
    { -10, 5, 0.105724860113781e0 },   { -10, 10, -0.858514221132534e2 },
    { -10, 12, 0.724140095480911e3 },  { -8, 0, 0.296475810273257e-2 },
    { -8, 1, -0.592721983365988e-2 },  { -8, 2, -0.126305422818666e-1 },
    { -8, 4, -0.115716196364853e0 },   { -8, 10, 0.849000969739595e2 },
    { -6, 0, -0.108602260086615e-1 },  { -6, 1, 0.154304475328851e-1 },
    { -6, 2, 0.750455441524466e-1 },   { -4, 0, 0.252520973612982e-1 },
    { -4, 1, -0.602507901232996e-1 },  { -3, 5, -0.307622221350501e1 },
    { -2, 0, -0.574011959864879e-1 },  { -2, 4, 0.503471360939849e1 },
    { -1, 2, -0.925081888584834e0 },   { -1, 4, 0.391733882917546e1 },
    { -1, 6, -0.773146007130190e2 },   { -1, 10, 0.949308762098587e4 },
    { -1, 14, -0.141043719679409e7 },  { -1, 16, 0.849166230819026e7 },
    { 0, 0, 0.861095729446704e0 },     { 0, 2, 0.323346442811720e0 },
    { 1, 1, 0.873281936020439e0 },     { 3, 1, -0.436653048526683e0 },
    { 5, 1, 0.286596714529479e0 },     { 6, 1, -0.131778331276228e0 },
    { 8, 1, 0.676682064330275e-2 },
};

/* SR3-03 Table 6: v3a(p, h), Eq. 4: v / 0.0028 m3/kg = sum n (pi + 0.128)^I
 * (eta - 0.727)^J, eta = h / 2100 kJ/kg. */
static const gc__if97_term V3A_PH[] = {
    { -12, 6, 0.529944062966028e-2 },  { -12, 8, -0.170099690234461e0 },
    { -12, 12, 0.111323814312927e2 },  { -12, 18, -0.217898123145125e4 },
    { -10, 4, -0.506061827980875e-3 }, { -10, 7, 0.556495239685324e0 },
    { -10, 10, -0.943672726094016e1 }, { -8, 5, -0.297856807561527e0 },
    { -8, 12, 0.939353943717186e2 },   { -6, 3, 0.192944939465981e-1 },
    { -6, 4, 0.421740664704763e0 },    { -6, 22, -0.368914126282330e7 },
    { -4, 2, -0.737566847600639e-2 },  { -4, 3, -0.354753242424366e0 },
    { -3, 7, -0.199768169338727e1 },   { -2, 3, 0.115456297059049e1 },
    { -2, 16, 0.568366875815960e4 },   { -1, 0, 0.808169540124668e-2 },
    { -1, 1, 0.172416341519307e0 },    { -1, 2, 0.104270175292927e1 },
    { -1, 3, -0.297691372792847e0 },   { 0, 0, 0.560394465163593e0 },
    { 0, 1, 0.275234661176914e0 },     { 1, 0, -0.148347894866012e0 },
    { 1, 1, -0.651142513478515e-1 },   { 1, 2, -0.292468715386302e1 },
    { 2, 0, 0.664876096952665e-1 },    { 2, 2, 0.352335014263844e1 },
    { 3, 0, -0.146340792313332e-1 },   { 4, 2, -0.224503486668184e1 },
    { 5, 2, 0.110533464706142e1 },     { 8, 2, -0.408757344495612e-1 },
};

/* SR3-03 Table 7: v3b(p, h), Eq. 5: v / 0.0088 m3/kg = sum n (pi + 0.0661)^I
 * (eta - 0.720)^J, eta = h / 2800 kJ/kg. */
static const gc__if97_term V3B_PH[] = {
    { -12, 0, -0.225196934336318e-8 }, { -12, 1, 0.140674363313486e-7 },
    { -8, 0, 0.233784085280560e-5 },   { -8, 1, -0.331833715229001e-4 },
    { -8, 3, 0.107956778514318e-2 },   { -8, 6, -0.271382067378863e0 },
    { -8, 7, 0.107202262490333e1 },    { -8, 8, -0.853821329075382e0 },
    { -6, 0, -0.215214194340526e-4 },  { -6, 1, 0.769656088222730e-3 },
    { -6, 2, -0.431136580433864e-2 },  { -6, 5, 0.453342167309331e0 },
    { -6, 6, -0.507749535873652e0 },   { -6, 10, -0.100475154528389e3 },
    { -4, 3, -0.219201924648793e0 },   { -4, 6, -0.321087965668917e1 },
    { -4, 10, 0.607567815637771e3 },   { -3, 0, 0.557686450685932e-3 },
    { -3, 2, 0.187499040029550e0 },    { -2, 1, 0.905368030448107e-2 },
    { -2, 2, 0.285417173048685e0 },    { -1, 0, 0.329924030996098e-1 },
    { -1, 1, 0.239897419685483e0 },    { -1, 4, 0.482754995951394e1 },
    { -1, 5, -0.118035753702231e2 },   { 0, 0, 0.169490044091791e0 },
    { 1, 0, -0.179967222507787e-1 },   { 1, 1, 0.371810116332674e-1 },
    { 2, 2, -0.536288335065096e-1 },   { 2, 6, 0.160697101092520e1 },
};

/* SR3-03 Table 10: T3a(p, s), Eq. 6: T / 760 K = sum n (pi + 0.240)^I
 * (sigma - 0.703)^J, sigma = s / 4.4 kJ/(kg K). */
static const gc__if97_term T3A_PS[] = {
    { -12, 28, 0.150042008263875e10 }, { -12, 32, -0.159397258480424e12 },
    { -10, 4, 0.502181140217975e-3 },  { -10, 10, -0.672057767855466e2 },
    { -10, 12, 0.145058545404456e4 },  { -10, 14, -0.823889534888890e4 },
    { -8, 5, -0.154852214233853e0 },   { -8, 7, 0.112305046746695e2 },
    { -8, 8, -0.297000213482822e2 },   { -8, 28, 0.438565132635495e11 },
    { -6, 2, 0.137837838635464e-2 },   { -6, 6, -0.297478527157462e1 },
    { -6, 32, 0.971777947349413e13 },  { -5, 0, -0.571527767052398e-4 },
    { -5, 14, 0.288307949778420e5 },   { -5, 32, -0.744428289262703e14 },
    { -4, 6, 0.128017324848921e2 },    { -4, 10, -0.368275545889071e3 },
    { -4, 36, 0.664768904779177e16 },  { -2, 1, 0.449359251958880e-1 },
    { -2, 4, -0.422897836099655e1 },   { -1, 1, -0.240614376434179e0 },
    { -1, 6, -0.474341365254924e1 },   { 0, 0, 0.724093999126110e0 },
    { 0, 1, 0.923874349695897e0 },     { 0, 4, 0.399043655281015e1 },
    { 1, 0, 0.384066651868009e-1 },    { 2, 0, -0.359344365571848e-2 },
    { 2, 3, -0.735196448821653e0 },    { 3, 2, 0.188367048396131e0 },
    { 8, 0, 0.141064266818704e-3 },    { 8, 1, -0.257418501496337e-2 },
    { 10, 2, 0.123220024851555e-2 },
};

/* SR3-03 Table 11: T3b(p, s), Eq. 7: T / 860 K = sum n (pi + 0.760)^I
 * (sigma - 0.818)^J, sigma = s / 5.3 kJ/(kg K). */
static const gc__if97_term T3B_PS[] = {
    { -12, 1, 0.527111701601660e0 },   { -12, 3, -0.401317830052742e2 },
    { -12, 4, 0.153020073134484e3 },   { -12, 7, -0.224799398218827e4 },
    { -8, 0, -0.193993484669048e0 },   { -8, 1, -0.140467557893768e1 },
    { -8, 3, 0.426799878114024e2 },    { -6, 0, 0.752810643416743e0 },
    { -6, 2, 0.226657238616417e2 },    { -6, 4, -0.622873556909932e3 },
    { -5, 0, -0.660823667935396e0 },   { -5, 1, 0.841267087271658e0 },
    { -5, 2, -0.253717501764397e2 },   { -5, 4, 0.485708963532948e3 },
    { -5, 6, 0.880531517490555e3 },    { -4, 12, 0.265015592794626e7 },
    { -3, 1, -0.359287150025783e0 },   { -3, 6, -0.656991567673753e3 },
    { -2, 2, 0.241768149185367e1 },    { 0, 0, 0.856873461222588e0 },
    { 2, 1, 0.655143675313458e0 },     { 3, 1, -0.213535213206406e0 },
    { 4, 0, 0.562974957606348e-2 },    { 5, 24, -0.316955725450471e15 },
    { 6, 0, -0.699997000152457e-3 },   { 8, 3, 0.119845803210767e-1 },
    { 12, 1, 0.193848122022095e-4 },   { 14, 2, -0.215095749182309e-4 },
};

/* SR3-03 Table 13: v3a(p, s), Eq. 8: v / 0.0028 m3/kg = sum n (pi + 0.187)^I
 * (sigma - 0.755)^J, sigma = s / 4.4 kJ/(kg K). */
static const gc__if97_term V3A_PS[] = {
    { -12, 10, 0.795544074093975e2 },  { -12, 12, -0.238261242984590e4 },
    { -12, 14, 0.176813100617787e5 },  { -10, 4, -0.110524727080379e-2 },
    { -10, 8, -0.153213833655326e2 },  { -10, 10, 0.297544599376982e3 },
    { -10, 20, -0.350315206871242e8 }, { -8, 5, 0.277513761062119e0 },
    { -8, 6, -0.523964271036888e0 },   { -8, 14, -0.148011182995403e6 },
    { -8, 16, 0.160014899374266e7 },   { -6, 28, 0.170802322663427e13 },
    { -5, 1, 0.246866996006494e-3 },   { -4, 5, 0.165326084797980e1 },
    { -3, 2, -0.118008384666987e0 },   { -3, 4, 0.253798642355900e1 },
    { -2, 3, 0.965127704669424e0 },    { -2, 8, -0.282172420532826e2 },
    { -1, 1, 0.203224612353823e0 },    { -1, 2, 0.110648186063513e1 },
    { 0, 0, 0.526127948451280e0 },     { 0, 1, 0.277000018736321e0 },
    { 0, 3, 0.108153340501132e1 },     { 1, 0, -0.744127885357893e-1 },
    { 2, 0, 0.164094443541384e-1 },    { 4, 2, -0.680468275301065e-1 },
    { 5, 2, 0.257988576101640e-1 },    { 6, 0, -0.145749861944416e-3 },
};

/* SR3-03 Table 14: v3b(p, s), Eq. 9: v / 0.0088 m3/kg = sum n (pi + 0.298)^I
 * (sigma - 0.816)^J, sigma = s / 5.3 kJ/(kg K). */
static const gc__if97_term V3B_PS[] = {
    { -12, 0, 0.591599780322238e-4 },  { -12, 1, -0.185465997137856e-2 },
    { -12, 2, 0.104190510480013e-1 },  { -12, 3, 0.598647302038590e-2 },
    { -12, 5, -0.771391189901699e0 },  { -12, 6, 0.172549765557036e1 },
    { -10, 0, -0.467076079846526e-3 }, { -10, 1, 0.134533823384439e-1 },
    { -10, 2, -0.808094336805495e-1 }, { -10, 4, 0.508139374365767e0 },
    { -8, 0, 0.128584643361683e-2 },   { -5, 1, -0.163899353915435e1 },
    { -5, 2, 0.586938199318063e1 },    { -5, 3, -0.292466667918613e1 },
    { -4, 0, -0.614076301499537e-2 },  { -4, 1, 0.576199014049172e1 },
    { -4, 2, -0.121613320606788e2 },   { -4, 3, 0.167637540957944e1 },
    { -3, 1, -0.744135838773463e1 },   { -2, 0, 0.378168091437659e-1 },
    { -2, 1, 0.401432203027688e1 },    { -2, 2, 0.160279837479185e2 },
    { -2, 3, 0.317848779347728e1 },    { -2, 4, -0.358362310304853e1 },
    { -2, 12, -0.115995260446827e7 },  { 0, 0, 0.199256573577909e0 },
    { 0, 1, -0.122270624794624e0 },    { 0, 2, -0.191449143716586e2 },
    { 1, 0, -0.150448002905284e-1 },   { 1, 2, 0.146407900162154e2 },
    { 2, 2, -0.327477787188230e1 },
};

/* One backward sum: star * sum n (pi + pa)^I (x + xb)^J, with pi = p / 100 MPa
 * and x the reduced h or s; exponents I in -12..14, J in 0..36. */
static double r3_backward(const gc__if97_term *t, int nt, double P_Pa, double pa,
                          double x, double xb, double star)
{
    double px[27], py[37];
    gc__if97_powers(P_Pa / 100e6 + pa, -12, 14, px);
    gc__if97_powers(x + xb, 0, 36, py);
    return star * gc__if97_sum(t, nt, px, -12, py, 0);
}

/* Subregion 3a for h <= h_3ab(p), 3b above (SR3-03 Sec. 2.2). */
double gc__if97_r3_T_Ph(double P_Pa, double h)
{
    if (h <= gc__if97_h3ab(P_Pa))
        return r3_backward(T3A_PH, GC__IF97_NTERMS(T3A_PH), P_Pa, 0.240, h / 2300e3, -0.615,
                           760.0);
    return r3_backward(T3B_PH, GC__IF97_NTERMS(T3B_PH), P_Pa, 0.298, h / 2800e3, -0.720, 860.0);
}

double gc__if97_r3_v_Ph(double P_Pa, double h)
{
    if (h <= gc__if97_h3ab(P_Pa))
        return r3_backward(V3A_PH, GC__IF97_NTERMS(V3A_PH), P_Pa, 0.128, h / 2100e3, -0.727,
                           0.0028);
    return r3_backward(V3B_PH, GC__IF97_NTERMS(V3B_PH), P_Pa, 0.0661, h / 2800e3, -0.720,
                       0.0088);
}

/* Subregion 3a for s <= s_c = 4.41202148223476 kJ/(kg K), 3b above
 * (SR3-03 Sec. 3.2). */
#define R3_SC_J_PER_KGK 4.41202148223476e3

double gc__if97_r3_T_Ps(double P_Pa, double s)
{
    if (s <= R3_SC_J_PER_KGK)
        return r3_backward(T3A_PS, GC__IF97_NTERMS(T3A_PS), P_Pa, 0.240, s / 4.4e3, -0.703,
                           760.0);
    return r3_backward(T3B_PS, GC__IF97_NTERMS(T3B_PS), P_Pa, 0.760, s / 5.3e3, -0.818, 860.0);
}

double gc__if97_r3_v_Ps(double P_Pa, double s)
{
    if (s <= R3_SC_J_PER_KGK)
        return r3_backward(V3A_PS, GC__IF97_NTERMS(V3A_PS), P_Pa, 0.187, s / 4.4e3, -0.755,
                           0.0028);
    return r3_backward(V3B_PS, GC__IF97_NTERMS(V3B_PS), P_Pa, 0.298, s / 5.3e3, -0.816, 0.0088);
}
