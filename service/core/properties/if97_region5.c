/*
 * if97_region5.c — IAPWS-IF97 region 5 (high-temperature steam): the basic
 * equation gamma = gamma0 + gammar (IAPWS R7-97(2012) Eqs. 32-34, Tables 37
 * and 38, the coefficients as revised in 2007) with its derivatives.
 *
 * Reduced variables: pi = p / 1 MPa, tau = 1000 K / T (Eq. 32).
 * Validity: 1073.15 K < T <= 2273.15 K, 0 < p <= 50 MPa. No backward
 * equations exist for region 5: if97.c solves (p, h) and (p, s) by Newton
 * iteration on this equation.
 */
#include "if97_private.h"

#include <math.h>

/* R7-97(2012) Table 37: J0_i, n0_i of the ideal-gas part, Eq. 33. */
static const gc__if97_bterm R5_0[] = {
    GC__IF97_BT(0, 0, -0.13179983674201e2), GC__IF97_BT(0, 1, 0.68540841634434e1),
    GC__IF97_BT(0, -3, -0.24805148933466e-1), GC__IF97_BT(0, -2, 0.36901534980333e0),
    GC__IF97_BT(0, -1, -0.31161318213925e1), GC__IF97_BT(0, 2, -0.32961626538917e0),
};

/* R7-97(2012) Table 38: I_i, J_i, n_i of the residual part, Eq. 34. */
static const gc__if97_bterm R5_R[] = {
    GC__IF97_BT(1, 1, 0.15736404855259e-2),  GC__IF97_BT(1, 2, 0.90153761673944e-3),
    GC__IF97_BT(1, 3, -0.50270077677648e-2), GC__IF97_BT(2, 3, 0.22440037409485e-5),
    GC__IF97_BT(2, 9, -0.41163275453471e-5), GC__IF97_BT(3, 7, 0.37919454822955e-7),
};
#define R5_PSTAR_PA 1.0e6
#define R5_TSTAR_K 1000.0

/* Eq. 32 and the derivatives of R7-97 Tables 40 and 41, scaled as in
 * gc__if97_gibbs (pi g0_pi = 1, pi^2 g0_pipi = -1, g0_pitau = 0). */
void gc__if97_r5_gibbs(double T_K, double P_Pa, int full, gc__if97_gibbs *g)
{
    double pi = P_Pa / R5_PSTAR_PA, tau = R5_TSTAR_K / T_K;
    double pa[4], pt[13], one = 1.0, s0[7], s[7];
    gc__if97_powers(pi, 0, 3, pa);
    gc__if97_powers(tau, -3, 9, pt);
    gc__if97_bsums(R5_0, GC__IF97_NTERMS(R5_0), &one, 0, pt, -3, 0, s0);
    gc__if97_bsums(R5_R, GC__IF97_NTERMS(R5_R), pa, 0, pt, -3, full, s);
    g->g = log(pi) + s0[0] + s[0];
    g->a = 1.0 + s[1];
    g->b = -1.0 + s[2];
    g->c = s0[3] + s[3];
    g->d = s0[4] + s[4];
    g->e = s[5];
    g->t3 = s0[6] + s[6];
}

double gc__if97_r5_c(double T_K, double P_Pa)
{
    gc__if97_gibbs g;
    gc__if97_r5_gibbs(T_K, P_Pa, 0, &g);
    return g.c;
}
