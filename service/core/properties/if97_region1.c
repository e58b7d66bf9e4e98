/*
 * if97_region1.c — IAPWS-IF97 region 1 (compressed liquid): the basic
 * equation gamma(pi, tau) (IAPWS R7-97(2012) Eq. 7, Table 2) with its
 * derivatives, and the backward equations T(p, h) (Eq. 11, Table 6) and
 * T(p, s) (Eq. 13, Table 8).
 *
 * Reduced variables: pi = p / 16.53 MPa, tau = 1386 K / T (Eq. 7); backward
 * equations pi = p / 1 MPa, eta = h / 2500 kJ/kg, sigma = s / 1 kJ/(kg K).
 * Validity: 273.15 K <= T <= 623.15 K, psat(T) <= p <= 100 MPa. The backward
 * equations agree with the basic equation to within 25 mK (R7-97 Sec. 5.2.1)
 * and only start the Newton iteration in if97.c.
 */
#include "if97_private.h"

/* R7-97(2012) Table 2: I_i, J_i, n_i of Eq. 7, i = 1..34. */
static const gc__if97_bterm R1[] = {
    GC__IF97_BT(0, -2, 0.14632971213167e0),   GC__IF97_BT(0, -1, -0.84548187169114e0),
    GC__IF97_BT(0, 0, -0.37563603672040e1),   GC__IF97_BT(0, 1, 0.33855169168385e1),
    GC__IF97_BT(0, 2, -0.95791963387872e0),   GC__IF97_BT(0, 3, 0.15772038513228e0),
    GC__IF97_BT(0, 4, -0.16616417199501e-1),  GC__IF97_BT(0, 5, 0.81214629983568e-3),
    GC__IF97_BT(1, -9, 0.28319080123804e-3),  GC__IF97_BT(1, -7, -0.60706301565874e-3),
    GC__IF97_BT(1, -1, -0.18990068218419e-1), GC__IF97_BT(1, 0, -0.32529748770505e-1),
    GC__IF97_BT(1, 1, -0.21841717175414e-1),  GC__IF97_BT(1, 3, -0.52838357969930e-4),
    GC__IF97_BT(2, -3, -0.47184321073267e-3), GC__IF97_BT(2, 0, -0.30001780793026e-3),
    GC__IF97_BT(2, 1, 0.47661393906987e-4),   GC__IF97_BT(2, 3, -0.44141845330846e-5),
    GC__IF97_BT(2, 17, -0.72694996297594e-15), GC__IF97_BT(3, -4, -0.31679644845054e-4),
    GC__IF97_BT(3, 0, -0.28270797985312e-5),  GC__IF97_BT(3, 6, -0.85205128120103e-9),
    GC__IF97_BT(4, -5, -0.22425281908000e-5), GC__IF97_BT(4, -2, -0.65171222895601e-6),
    GC__IF97_BT(4, 10, -0.14341729937924e-12), GC__IF97_BT(5, -8, -0.40516996860117e-6),
    GC__IF97_BT(8, -11, -0.12734301741641e-8), GC__IF97_BT(8, -6, -0.17424871230634e-9),
    GC__IF97_BT(21, -29, -0.68762131295531e-18), GC__IF97_BT(23, -31, 0.14478307828521e-19),
    GC__IF97_BT(29, -38, 0.26335781662795e-22), GC__IF97_BT(30, -39, -0.11947622640071e-22),
    GC__IF97_BT(31, -40, 0.18228094581404e-23), GC__IF97_BT(32, -41, -0.93537087292458e-25),
};
#define R1_PSTAR_PA 16.53e6
#define R1_TSTAR_K 1386.0
#define R1_ILO 0
#define R1_IHI 32
#define R1_JLO (-41)
#define R1_JHI 17

/* Power tables of (7.1 - pi) and (tau - 1.222) for Eq. 7. */
static void r1_powers(double T_K, double P_Pa, double *pa, double *pb, double *a, double *b)
{
    *a = 7.1 - P_Pa / R1_PSTAR_PA;
    *b = R1_TSTAR_K / T_K - 1.222;
    gc__if97_powers(*a, R1_ILO, R1_IHI, pa);
    gc__if97_powers(*b, R1_JLO, R1_JHI, pb);
}

/* Eq. 7 and its derivatives (R7-97 Table 4): with A = 7.1 - pi and
 * B = tau - 1.222, gamma_pi = -sum n I A^(I-1) B^J and so on; the sums below
 * collect I t, I(I-1) t ... over t = n A^I B^J and divide by A and B once. */
void gc__if97_r1_gibbs(double T_K, double P_Pa, int full, gc__if97_gibbs *g)
{
    double pa[GC__IF97_POW_MAX], pb[GC__IF97_POW_MAX], A, B, s[7];
    r1_powers(T_K, P_Pa, pa, pb, &A, &B);
    gc__if97_bsums(R1, GC__IF97_NTERMS(R1), pa, R1_ILO, pb, R1_JLO, full, s);
    double pi = P_Pa / R1_PSTAR_PA, tau = R1_TSTAR_K / T_K;
    g->g = s[0];
    g->a = -pi * s[1] / A;
    g->b = pi * pi * s[2] / (A * A);
    g->c = tau * s[3] / B;
    g->d = tau * tau * s[4] / (B * B);
    g->e = -pi * tau * s[5] / (A * B);
    g->t3 = tau * tau * tau * s[6] / (B * B * B);
}

double gc__if97_r1_c(double T_K, double P_Pa)
{
    double pa[GC__IF97_POW_MAX], pb[GC__IF97_POW_MAX], A, B;
    r1_powers(T_K, P_Pa, pa, pb, &A, &B);
    double sJ = gc__if97_bsum_J(R1, GC__IF97_NTERMS(R1), pa, R1_ILO, pb, R1_JLO);
    return (R1_TSTAR_K / T_K) * sJ / B;
}

/* R7-97(2012) Table 6: coefficients of the backward equation T(p, h), Eq. 11:
 * theta = sum n pi^I (eta + 1)^J. */
static const gc__if97_term R1_TPH[] = {
    { 0, 0, -0.23872489924521e3 },  { 0, 1, 0.40421188637945e3 },
    { 0, 2, 0.11349746881718e3 },   { 0, 6, -0.58457616048039e1 },
    { 0, 22, -0.15285482413140e-3 }, { 0, 32, -0.10866707695377e-5 },
    { 1, 0, -0.13391744872602e2 },  { 1, 1, 0.43211039183559e2 },
    { 1, 2, -0.54010067170506e2 },  { 1, 3, 0.30535892203916e2 },
    { 1, 4, -0.65964749423638e1 },  { 1, 10, 0.93965400878363e-2 },
    { 1, 32, 0.11573647505340e-6 }, { 2, 10, -0.25858641282073e-4 },
    { 2, 32, -0.40644363084799e-8 }, { 3, 10, 0.66456186191635e-7 },
    { 3, 32, 0.80670734103027e-10 }, { 4, 32, -0.93477771213947e-12 },
    { 5, 32, 0.58265442020601e-14 }, { 6, 32, -0.15020185953503e-16 },
};

double gc__if97_r1_T_Ph(double P_Pa, double h)
{
    double px[8], py[34];
    gc__if97_powers(P_Pa / 1e6, 0, 6, px);
    gc__if97_powers(h / 2500e3 + 1.0, 0, 32, py);
    return gc__if97_sum(R1_TPH, GC__IF97_NTERMS(R1_TPH), px, 0, py, 0);
}

/* R7-97(2012) Table 8: coefficients of the backward equation T(p, s), Eq. 13:
 * theta = sum n pi^I (sigma + 2)^J. */
static const gc__if97_term R1_TPS[] = {
    { 0, 0, 0.17478268058307e3 },   { 0, 1, 0.34806930892873e2 },
    { 0, 2, 0.65292584978455e1 },   { 0, 3, 0.33039981775489e0 },
    { 0, 11, -0.19281382923196e-6 }, { 0, 31, -0.24909197244573e-22 },
    { 1, 0, -0.26107636489332e0 },  { 1, 1, 0.22592965981586e0 },
    { 1, 2, -0.64256463395226e-1 }, { 1, 3, 0.78876289270526e-2 },
    { 1, 12, 0.35672110607366e-9 }, { 1, 31, 0.17332496994895e-23 },
    { 2, 0, 0.56608900654837e-3 },  { 2, 1, -0.32635483139717e-3 },
    { 2, 2, 0.44778286690632e-4 },  { 2, 9, -0.51322156908507e-9 },
    { 2, 31, -0.42522657042207e-25 }, { 3, 10, 0.26400441360689e-12 },
    { 3, 32, 0.78124600459723e-28 }, { 4, 32, -0.30732199903668e-30 },
};

double gc__if97_r1_T_Ps(double P_Pa, double s)
{
    double px[6], py[34];
    gc__if97_powers(P_Pa / 1e6, 0, 4, px);
    gc__if97_powers(s / 1e3 + 2.0, 0, 32, py);
    return gc__if97_sum(R1_TPS, GC__IF97_NTERMS(R1_TPS), px, 0, py, 0);
}
