/*
 * uncert_stats.c — numerical building blocks of the uncertainty engine
 * (uncert.h): quantiles of the normal and Student's t distributions,
 * coverage factors, the JCGM 101 numerical tolerance and coverage
 * intervals, a semi-definite Cholesky factorisation and the counter-based
 * random numbers.
 *
 * Methods and sources:
 *   - normal quantile: the rational start of Abramowitz & Stegun 26.2.23
 *     (|error| < 4.5e-4) refined by Halley steps on Q(x) = erfc(x / sqrt 2) / 2
 *     from the C library, to full double precision;
 *   - Student's t: the upper tail Q(t) = I_{nu/(nu+t^2)}(nu/2, 1/2) / 2
 *     (Abramowitz & Stegun 26.7.1 with 26.5.27), the regularised incomplete
 *     beta function by its continued fraction (A&S 26.5.8) evaluated with
 *     the modified Lentz method (Lentz 1976; Thompson & Barnett 1986), its
 *     prefactor with ln Gamma differences from the Stirling series for
 *     large a (A&S 6.1.41) so that nu up to 1e5 keeps full precision; the
 *     quantile by safeguarded Newton steps inside a bracket; nu = 1 and 2 in
 *     closed form; nu > 1e5 by the Cornish-Fisher expansion of A&S 26.7.5;
 *   - coverage intervals and the numerical tolerance: JCGM 101:2008 7.7.2,
 *     7.7.3 and 7.9.2;
 *   - Cholesky: the textbook column algorithm, with pivots that vanish
 *     (within 1e-10 of the diagonal) giving zero columns, so that perfectly
 *     correlated or exactly known inputs are accepted;
 *   - sorting: quicksort (Hoare 1962) with a median-of-three pivot;
 *   - random numbers: SplitMix64 (Steele, Lea & Flood, OOPSLA 2014) used as
 *     a counter-based generator, uniform doubles in (0, 1) from the top 53
 *     bits plus one half.
 * Validity: probabilities in (0, 1); nu > 0. Accuracy is checked against
 * scipy.stats in tests/unit/test_uncert.c.
 */
#include "uncert_internal.h"

#include <math.h>
#include <stdlib.h>

#ifndef M_PI
#define M_PI 3.14159265358979323846
#endif

#define SQRT2 1.41421356237309504880
#define SQRT2PI 2.50662827463100050242

/* ---- normal ------------------------------------------------------------ */

/* Q(x) = P(Z > x). */
static double normal_upper(double x)
{
    return 0.5 * erfc(x / SQRT2);
}

/* x > 0 with Q(x) = q, 0 < q < 0.5. */
static double normal_upper_quantile(double q)
{
    double t = sqrt(-2.0 * log(q));
    double x = t - (2.515517 + t * (0.802853 + t * 0.010328)) /
                       (1.0 + t * (1.432788 + t * (0.189269 + t * 0.001308)));
    for (int it = 0; it < 8; it++) {
        double phi = exp(-0.5 * x * x) / SQRT2PI;
        double u = (normal_upper(x) - q) / phi;
        double dx = u / (1.0 - 0.5 * x * u);   /* Halley: f = Q - q, f' = -phi, f'' = x phi */
        x += dx;
        if (fabs(dx) <= 1e-15 * fabs(x))
            break;
    }
    return x;
}

double gc_uncert_normal_quantile(double P)
{
    if (!(P > 0.0 && P < 1.0))
        return NAN;
    if (P == 0.5)
        return 0.0;
    return P < 0.5 ? -normal_upper_quantile(P) : normal_upper_quantile(1.0 - P);
}

/* ---- Student's t ------------------------------------------------------- */

#define BETA_TINY 1e-300
#define BETA_EPS 1e-16
#define BETA_MAXIT 20000

/* Continued fraction of I_x(a, b) (A&S 26.5.8), modified Lentz. */
static double beta_cf(double a, double b, double x)
{
    double c = 1.0, d = 1.0 - (a + b) * x / (a + 1.0);
    if (fabs(d) < BETA_TINY)
        d = BETA_TINY;
    d = 1.0 / d;
    double h = d;
    for (int m = 1; m <= BETA_MAXIT; m++) {
        double m2 = 2.0 * m;
        double aa = m * (b - m) * x / ((a + m2 - 1.0) * (a + m2));
        d = 1.0 + aa * d;
        c = 1.0 + aa / c;
        d = 1.0 / (fabs(d) < BETA_TINY ? BETA_TINY : d);
        if (fabs(c) < BETA_TINY)
            c = BETA_TINY;
        h *= d * c;
        aa = -(a + m) * (a + b + m) * x / ((a + m2) * (a + m2 + 1.0));
        d = 1.0 + aa * d;
        c = 1.0 + aa / c;
        d = 1.0 / (fabs(d) < BETA_TINY ? BETA_TINY : d);
        if (fabs(c) < BETA_TINY)
            c = BETA_TINY;
        double del = d * c;
        h *= del;
        if (fabs(del - 1.0) < BETA_EPS)
            break;
    }
    return h;
}

/* The Stirling series of ln Gamma(x) beyond its leading terms (A&S 6.1.41):
 * 1/(12x) - 1/(360x^3) + 1/(1260x^5) - 1/(1680x^7). */
static double stirling_tail(double x)
{
    double r = 1.0 / x, r2 = r * r;
    return r * (1.0 / 12.0 - r2 * (1.0 / 360.0 - r2 * (1.0 / 1260.0 - r2 / 1680.0)));
}

/* ln Gamma(a + b) - ln Gamma(a) - ln Gamma(b). For a >= 50 the difference
 * of the first two is taken from the Stirling series in differences,
 * b ln a + (a + b - 1/2) ln(1 + b/a) - b + tail(a + b) - tail(a), so that
 * the two large logarithms (about a ln a) do not cancel in rounding. */
static double log_inv_beta(double a, double b)
{
    if (a < 50.0)
        return lgamma(a + b) - lgamma(a) - lgamma(b);
    double d = b * log(a) + (a + b - 0.5) * log1p(b / a) - b + stirling_tail(a + b) -
               stirling_tail(a);
    return d - lgamma(b);
}

/* ln z for z = 1 - w with both given: the accurate one of log(z), log1p(-w). */
static double log_either(double z, double w)
{
    return z <= 0.5 ? log(z) : log1p(-w);
}

/* Regularised incomplete beta I_x(a, b), with y = 1 - x given exactly. */
static double ibeta(double a, double b, double x, double y)
{
    if (x <= 0.0)
        return 0.0;
    if (y <= 0.0)
        return 1.0;
    double lbt = log_inv_beta(a, b) + a * log_either(x, y) + b * log_either(y, x);
    double bt = exp(lbt);
    if (x < (a + 1.0) / (a + b + 2.0))
        return bt * beta_cf(a, b, x) / a;
    return 1.0 - bt * beta_cf(b, a, y) / b;
}

/* P(T > t), t >= 0. */
static double t_upper(double t, double nu)
{
    double t2 = t * t;
    return 0.5 * ibeta(0.5 * nu, 0.5, nu / (nu + t2), t2 / (nu + t2));
}

static double t_pdf(double t, double nu)
{
    double l = lgamma(0.5 * (nu + 1.0)) - lgamma(0.5 * nu) - 0.5 * log(nu * M_PI) -
               0.5 * (nu + 1.0) * log1p(t * t / nu);
    return exp(l);
}

/* A&S 26.7.5: t_p(nu) = x + g1/nu + g2/nu^2 + g3/nu^3 + ..., x = z_p. */
static double t_cornish_fisher(double x, double nu)
{
    double x2 = x * x;
    double g1 = x * (x2 + 1.0) / 4.0;
    double g2 = x * ((5.0 * x2 + 16.0) * x2 + 3.0) / 96.0;
    double g3 = x * (((3.0 * x2 + 19.0) * x2 + 17.0) * x2 - 15.0) / 384.0;
    return x + (g1 + (g2 + g3 / nu) / nu) / nu;
}

/* t > 0 with P(T > t) = q, 0 < q < 0.5. */
static double t_upper_quantile(double q, double nu)
{
    double lo = 0.0, hi = t_cornish_fisher(normal_upper_quantile(q), nu);
    if (!(hi > 0.0) || !isfinite(hi))
        hi = 1.0;
    while (t_upper(hi, nu) > q && hi < 1e300)
        hi *= 2.0;
    double t = hi;
    for (int it = 0; it < 400; it++) {
        double f = t_upper(t, nu) - q;          /* decreasing in t */
        if (f > 0.0)
            lo = t;
        else
            hi = t;
        double tn = t + f / t_pdf(t, nu);
        if (!(tn > lo && tn < hi))
            tn = 0.5 * (lo + hi);
        if (fabs(tn - t) <= 1e-15 * tn || hi - lo <= 1e-15 * hi)
            return tn;
        t = tn;
    }
    return t;
}

double gc_uncert_t_quantile(double P, double nu)
{
    if (!(P > 0.0 && P < 1.0) || !(nu > 0.0))
        return NAN;
    if (P == 0.5)
        return 0.0;
    double q = P < 0.5 ? P : 1.0 - P, t;
    if (nu == 1.0)
        t = 1.0 / tan(M_PI * q);           /* = tan(pi (1/2 - q)), accurate for small q */
    else if (nu == 2.0)
        t = (1.0 - 2.0 * q) * sqrt(2.0 / (4.0 * q * (1.0 - q)));
    else if (nu > 1e5)
        t = t_cornish_fisher(normal_upper_quantile(q), nu);
    else
        t = t_upper_quantile(q, nu);
    return P < 0.5 ? -t : t;
}

double gc_uncert_coverage_factor(double p, double nu)
{
    if (!(p > 0.0 && p < 1.0))
        return NAN;
    double P = 0.5 * (1.0 + p);
    return nu > 0.0 ? gc_uncert_t_quantile(P, nu) : gc_uncert_normal_quantile(P);
}

/* ---- JCGM 101 ---------------------------------------------------------- */

double gc_uncert_numerical_tolerance(double z, int n_dig)
{
    z = fabs(z);
    if (!(z > 0.0) || !isfinite(z) || n_dig < 1)
        return 0.0;
    int l = (int)floor(log10(z)) - n_dig + 1;
    double c = nearbyint(z / pow(10.0, l));
    if (c >= pow(10.0, n_dig))
        l++;
    return 0.5 * pow(10.0, l);
}

void gc_uncert_coverage_interval(const double *s, long M, double p, double *lo, double *hi,
                                 double *slo, double *shi)
{
    long q = (long)floor(p * (double)M + 0.5);   /* 7.7.1: pM, or int(pM + 1/2) */
    if (q > M - 1)
        q = M - 1;
    if (q < 1)
        q = 1;
    if (lo && hi) {                               /* 7.7.3: shortest, first r on ties */
        long best = 0;
        for (long r = 1; r + q < M; r++)
            if (s[r + q] - s[r] < s[best + q] - s[best])
                best = r;
        *lo = s[best];
        *hi = s[best + q];
    }
    if (slo && shi) {                             /* 7.7.2: r = (M - q) / 2, 1-based */
        long r = (M - q) % 2 == 0 ? (M - q) / 2 : (M - q + 1) / 2;
        if (r < 1)
            r = 1;
        if (r + q > M)
            r = M - q;
        *slo = s[r - 1];
        *shi = s[r + q - 1];
    }
}

/* ---- sorting ----------------------------------------------------------- */

#define SORT_SMALL 24

static void insertion_sort(double *v, long n)
{
    for (long i = 1; i < n; i++) {
        double t = v[i];
        long j = i;
        for (; j > 0 && v[j - 1] > t; j--)
            v[j] = v[j - 1];
        v[j] = t;
    }
}

static void swap_d(double *a, double *b)
{
    double t = *a;
    *a = *b;
    *b = t;
}

/* Quicksort: median-of-three pivot, Hoare partition (equal values split
 * evenly, so a constant output sorts in n log n), insertion sort below
 * SORT_SMALL, recursion on the smaller part only (depth <= log2 n). */
void gc__uncert_sort(double *v, long n)
{
    while (n > SORT_SMALL) {
        long mid = n / 2;
        if (v[mid] < v[0])
            swap_d(&v[mid], &v[0]);
        if (v[n - 1] < v[0])
            swap_d(&v[n - 1], &v[0]);
        if (v[n - 1] < v[mid])
            swap_d(&v[n - 1], &v[mid]);
        double pivot = v[mid];
        long i = -1, j = n;
        for (;;) {
            do
                i++;
            while (v[i] < pivot);
            do
                j--;
            while (v[j] > pivot);
            if (i >= j)
                break;
            swap_d(&v[i], &v[j]);
        }
        long left = j + 1;              /* v[0..j] <= pivot <= v[j+1..n-1] */
        if (left < n - left) {
            gc__uncert_sort(v, left);
            v += left;
            n -= left;
        } else {
            gc__uncert_sort(v + left, n - left);
            n = left;
        }
    }
    insertion_sort(v, n);
}

/* ---- Cholesky ---------------------------------------------------------- */

#define CHOL_TOL 1e-10

int gc_uncert_cholesky(const double *V, int n, double *L)
{
    for (int i = 0; i < n * n; i++)
        L[i] = 0.0;
    for (int j = 0; j < n; j++) {
        double d = V[j * n + j];
        for (int k = 0; k < j; k++)
            d -= L[j * n + k] * L[j * n + k];
        double scale = V[j * n + j];
        if (d < -CHOL_TOL * scale || scale < 0.0)
            return GC_ERR_INVALID;
        int zero = d <= CHOL_TOL * scale;
        double ljj = zero ? 0.0 : sqrt(d);
        L[j * n + j] = ljj;
        for (int i = j + 1; i < n; i++) {
            double v = V[i * n + j];
            for (int k = 0; k < j; k++)
                v -= L[i * n + k] * L[j * n + k];
            if (zero) {
                if (fabs(v) > CHOL_TOL * sqrt(V[i * n + i] * scale) + 1e-300)
                    return GC_ERR_INVALID;
                continue;
            }
            L[i * n + j] = v / ljj;
        }
    }
    return GC_OK;
}

/* ---- random numbers ---------------------------------------------------- */

#define SPLITMIX_GAMMA 0x9e3779b97f4a7c15ull

uint64_t gc__uncert_mix64(uint64_t z)
{
    z = (z ^ (z >> 30)) * 0xbf58476d1ce4e5b9ull;
    z = (z ^ (z >> 27)) * 0x94d049bb133111ebull;
    return z ^ (z >> 31);
}

double gc__uncert_uniform_key(uint64_t key, uint64_t n)
{
    uint64_t z = gc__uncert_mix64(key + (n + 1u) * SPLITMIX_GAMMA);
    return ((double)(z >> 11) + 0.5) * (1.0 / 9007199254740992.0);
}

double gc_uncert_uniform(uint64_t seed, uint64_t n)
{
    return gc__uncert_uniform_key(gc__uncert_mix64(seed), n);
}
