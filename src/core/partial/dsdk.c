/*
** dsdk.c -- dsigma/dk of a spin-1/2 projectile in a screened atom from
** exact Dirac partial waves: angular factors, radial multipole integrals
** (panels up to R, complex rays beyond), and the incoherent sum over
** kappa_i, kappa_f and the photon multipoles
** See Copyright Notice in LICENSE
**
** Method: Tseng & Pratt 1971, Phys. Rev. A 3, 100 (partial-wave
** multipole expansion of the bremsstrahlung matrix element); the
** direction-integrated spectrum as an incoherent sum, as in Yerokhin &
** Surzhykov 2010, Phys. Rev. A 82, 062702 (arXiv:1011.2743), Sec. II;
** transverse multipole fields and the reduced matrix elements of
** sigma . Y_{JLM} between spherical spinors as in Johnson 2007, "Atomic
** Structure Theory" (Springer), secs. 3 and 6 (their signs measured
** here against the 9j recoupling, tests/test_pwdsdk.c).  The derivation
** of the prefactor and the numerics: DEVELOPERS.md, "Partial waves:
** dsigma/dk".
**
**   dsigma/dk = 8 pi z^2 alpha k (E_i + 1)(E_f + 1) / (p_i^3 p_f)
**               sum_{kappa_i, kappa_f, J} |M_J(kappa_f, kappa_i)|^2
**
** (units of m), M_J the reduced matrix element of alpha . a_J of the
** transverse multipole field of parity (-1)^(l_f + l_i + J) (electric if
** even, magnetic if odd) between the radial functions of bl_pw_radial
** (unit amplitude at infinity).
*/

#include <complex.h>
#include <float.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include <gsl/gsl_errno.h>
#include <gsl/gsl_integration.h>
#include <gsl/gsl_sf_bessel.h>

#include "partial/dsdk.h"


#define NGL 16           /* Gauss-Legendre nodes per panel */
#define NLAG 48          /* Gauss-Laguerre nodes per complex ray */
#define RAY_TURN 2.0     /* rays start at RAY_TURN times every turning
                         ** point (l + 2)/p, (L + 2)/k */
#define PANEL_PHASE (4.0 * BL_PI)  /* largest phase of the fastest product
                         ** e^{i (p_i + p_f + k) r} over one panel: two
                         ** periods on 16 nodes (error below 1e-13) */
#define R_FIRST 1e-7     /* first panel [0, R_FIRST]: contributes ~ r^3 */
#define GEO 4.0          /* ratio of the graded panels near r = 0 */
#define B_FAC 10.0       /* impact parameters up to B_FAC / max(q_min,
                         ** 2 c_min) set the cap of l */
#define LCAP_MAX 6000    /* hard cap of l */
#define JCAP_MAX 60      /* hard cap of the photon multipole J */
#define SKIP_NU 30       /* waves with l + 1/2 >= SKIP_NU start at r_skip */
#define SKIP_FRAC 0.4    /* r_skip: local p r = SKIP_FRAC (l + 1/2) */


static int lof (int kappa) { return kappa > 0 ? kappa : -kappa - 1; }
static int j2of (int kappa) { return 2 * abs(kappa) - 1; }  /* 2 j */


/* (a b c; 0 0 0), closed form (Edmonds 1957, eq. 3.7.17) in logs */
static double three0 (int a, int b, int c) {
  int g2 = a + b + c, g = g2 / 2;
  double ln;
  if ((g2 & 1) || c > a + b || c < abs(a - b))
    return 0.0;
  ln = 0.5 * (lgamma(g2 - 2.0 * a + 1) + lgamma(g2 - 2.0 * b + 1)
              + lgamma(g2 - 2.0 * c + 1) - lgamma(g2 + 2.0))
       + lgamma(g + 1.0) - lgamma(g - a + 1.0) - lgamma(g - b + 1.0)
       - lgamma(g - c + 1.0);
  return ((g & 1) ? -1.0 : 1.0) * exp(ln);
}

/*
** {a b c; 1/2 lb la} with a = L integer, b = j_a, c = j_b (given doubled,
** b2 = 2 j_a, c2 = 2 j_b), la = b -+ 1/2, lb = c -+ 1/2: the closed forms
** of 6j symbols with one argument 1/2 (Edmonds 1957, table 5), s = a+b+c:
**   {a b c; 1/2 c-1/2 b+1/2} = (-1)^s [(s-2b)(s-2c+1)
**                               / ((2b+1)(2b+2) 2c (2c+1))]^1/2
**   {a b c; 1/2 c-1/2 b-1/2} = (-1)^s [(s+1)(s-2a) / (2b(2b+1) 2c(2c+1))]^1/2
** the other two by the symmetries of the 6j symbol.
*/
static double six_half (int a, int b2, int c2, int la, int lb) {
  double b = 0.5 * b2, c = 0.5 * c2, s = a + b + c, x, y;
  int is = (int)lround(s);
  if (2 * lb == c2 - 1 && 2 * la == b2 + 1) {
    x = (s - 2 * b) * (s - 2 * c + 1);
    y = (2 * b + 1) * (2 * b + 2) * 2 * c * (2 * c + 1);
  } else if (2 * lb == c2 - 1 && 2 * la == b2 - 1) {
    x = (s + 1) * (s - 2 * a);
    y = 2 * b * (2 * b + 1) * 2 * c * (2 * c + 1);
  } else if (2 * lb == c2 + 1 && 2 * la == b2 - 1) {
    x = (s - 2 * c) * (s - 2 * b + 1);
    y = (2 * c + 1) * (2 * c + 2) * 2 * b * (2 * b + 1);
  } else {                    /* lb = c + 1/2, la = b + 1/2 */
    double b1 = c + 0.5, c1 = b + 0.5;
    s += 1.0;
    is += 1;
    x = (s + 1) * (s - 2 * a);
    y = 2 * b1 * (2 * b1 + 1) * 2 * c1 * (2 * c1 + 1);
  }
  if (!(x > 0.0) || !(y > 0.0))
    return 0.0;
  return ((is & 1) ? -1.0 : 1.0) * sqrt(x / y);
}

/*
** <kappa_a||C_L||kappa_b> in Edmonds' convention by recoupling the
** orbital operator (Edmonds eq. 7.1.7):
**   (-1)^(l_a + 1/2 + j_b + L) sqrt((2j_a+1)(2j_b+1)) {l_a j_a 1/2; j_b l_b L}
**   (-1)^l_a sqrt((2l_a+1)(2l_b+1)) (l_a L l_b; 0 0 0),
** with {l_a j_a 1/2; j_b l_b L} = {L j_a j_b; 1/2 l_b l_a} and both
** symbols in closed form (no alternating sums: exact to rounding at any
** j; GSL's general 3j loses 3 % at j = 1500).
*/
double bl_pw_cred (int ka, int L, int kb) {
  int la, lb, ja2, jb2, e2;
  double t;
  if (ka == 0 || kb == 0 || L < 0)
    return 0.0;
  la = lof(ka);
  lb = lof(kb);
  if ((la + L + lb) & 1)
    return 0.0;
  t = three0(la, L, lb);
  if (t == 0.0)
    return 0.0;
  ja2 = j2of(ka);
  jb2 = j2of(kb);
  e2 = 2 * la + 1 + jb2 + 2 * L + 2 * la;     /* twice the phase */
  return (((e2 / 2) & 1) ? -1.0 : 1.0) * sqrt((ja2 + 1.0) * (jb2 + 1.0))
         * six_half(L, ja2, jb2, la, lb)
         * sqrt((2.0 * la + 1.0) * (2.0 * lb + 1.0)) * t;
}


/*
** <kappa_b||sigma . Y_{J L}||kappa_a>.  With f = sqrt((2J+1)/(4 pi)),
** c = sqrt(J (J+1)) and C the function above (Edmonds' convention):
**   L = J:                 (ka - kb)/c <kb||C_J||ka> f
**   Y^(1) (gradient):      (ka + kb)/c <-kb||C_J||ka> f
**   Y^(-1) (r-hat Y_JM):  -<-kb||C_J||ka> f
** and Y_{J,J-1} = sqrt((J+1)/(2J+1)) Y^(1) + sqrt(J/(2J+1)) Y^(-1),
** Y_{J,J+1} = sqrt(J/(2J+1)) Y^(1) - sqrt((J+1)/(2J+1)) Y^(-1).  These are
** the relations of Johnson 2007 (sec. 3) up to phases, which the 9j
** recoupling fixes (tests/test_pwdsdk.c).
*/
double bl_pw_sred (int kb, int ka, int J, int L) {
  double f, c, s1, sn, a, b;
  if (ka == 0 || kb == 0 || J < 1 || L < J - 1 || L > J + 1)
    return 0.0;
  f = sqrt((2.0 * J + 1.0) / (4.0 * BL_PI));
  c = sqrt(J * (J + 1.0));
  if (L == J)
    return (ka - kb) / c * bl_pw_cred(kb, J, ka) * f;
  s1 = (ka + kb) / c * bl_pw_cred(-kb, J, ka) * f;
  sn = -bl_pw_cred(-kb, J, ka) * f;
  a = sqrt((J + 1.0) / (2.0 * J + 1.0));
  b = sqrt(J / (2.0 * J + 1.0));
  return (L == J - 1) ? a * s1 + b * sn : b * s1 - a * sn;
}


/* ------------------------------------------------------------------ */
/* radial nodes on [0, R]                                              */

typedef struct grid {
  int n;
  double *r, *w;
  double R;
} grid;

static void grid_free (grid *g) {
  free(g->r);
  free(g->w);
  g->r = g->w = NULL;
}

/* Gauss-Legendre nodes of [a, b] appended at g->n. */
static void panel (grid *g, const gsl_integration_glfixed_table *t,
                   double a, double b) {
  int i;
  for (i = 0; i < NGL; i++) {
    double x, w;
    gsl_integration_glfixed_point(a, b, (size_t)i, &x, &w, t);
    g->r[g->n] = x;
    g->w[g->n] = w;
    g->n++;
  }
}

/*
** Nodes of [0, R]: [0, R_FIRST], panels growing by GEO up to width h,
** then panels of width <= h.  Returns BL_SUCCESS or BL_ENOMEM.
*/
static int grid_make (grid *g, double R, double h) {
  gsl_integration_glfixed_table *t;
  int np = 0, m;
  double a, b;
  memset(g, 0, sizeof *g);
  g->R = R;
  for (a = R_FIRST; a < R && a < h; a *= GEO)
    np++;
  m = (int)ceil(R / h) + 1;
  np += m + 2;
  g->r = malloc((size_t)np * NGL * sizeof *g->r);
  g->w = malloc((size_t)np * NGL * sizeof *g->w);
  t = gsl_integration_glfixed_table_alloc(NGL);
  if (g->r == NULL || g->w == NULL || t == NULL) {
    grid_free(g);
    gsl_integration_glfixed_table_free(t);
    return BL_ENOMEM;
  }
  a = 0.0;
  b = fmin(R_FIRST, R);
  panel(g, t, a, b);
  while (b < R && b * GEO < h) {
    a = b;
    b = fmin(b * GEO, R);
    panel(g, t, a, b);
  }
  if (b < R) {
    double w = (R - b) / ceil((R - b) / h);
    int i, nu = (int)ceil((R - b) / h - 1e-9);
    a = b;
    for (i = 0; i < nu; i++)
      panel(g, t, a + i * w, (i == nu - 1) ? R : a + (i + 1) * w);
  }
  gsl_integration_glfixed_table_free(t);
  return BL_SUCCESS;
}


/* ------------------------------------------------------------------ */
/* complex rays beyond R                                               */

/*
** Beyond R every wave is free: with H^{+-}_l(x) = x (j_l(x) +- i y_l(x))
** (Riccati-Hankel), P = Re[e^{i d} H^+_l(p r)], Q = sgn(kappa) p/(E+1)
** Re[e^{i d} H^+_lbar(p r)], j_L(k r) = (H^+_L + H^-_L)(k r)/(2 k r).  A
** product A B j_L of two such real functions is
**   2 Re (1/(8 k r)) sum_{sA, sB = +-} alpha_A^{sA} alpha_B^{sB}
**        H^{sA}_{lA}(pA r) H^{sB}_{lB}(pB r) H^+_L(k r)
** (alpha^+ = alpha, alpha^- = conj alpha), and each of the four terms is
** e^{i w r} times a rational function of r, w = sA pA + sB pB + k != 0.
** Its integral over [R, inf) is taken on the ray r = R + i sgn(w) u/|w|,
** u >= 0, where e^{i w r} = e^{i w R} e^{-u}: Gauss-Laguerre in u.  The
** rational factors are h~^s_l = e^{-i s x} H^s_l(x) by the upward
** recurrence h~_{l+1} = (2l+1)/x h~_l - h~_{l-1} (stable: the Hankel
** functions dominate), h~^s_0 = -s i, h~^s_1 = -(1 + s i/x); R is chosen
** beyond every turning point (p R > l, k R > L) so no term is large.
** Their poles are at r = 0, at distance |w| R in u: R >= 4/|w| keeps the
** 48-node rule at 1e-12 (measured in test_pwdsdk's free-field check).
*/
typedef struct ray {
  double complex c[NLAG];     /* (i s/|w|) e^{i w R} W_n / (8 k z_n) */
  double complex *hA, *hB, *hL;   /* [n][l]: h~ at pA z_n, pB z_n, k z_n */
  int nA, nB, nL;             /* l = 0 .. n-1 in each table */
} ray;

typedef struct rays {
  ray r[4];                   /* (sA, sB) = (+,+), (+,-), (-,+), (-,-) */
} rays;

static void rays_free (rays *q) {
  int i;
  for (i = 0; i < 4; i++) {
    free(q->r[i].hA);
    free(q->r[i].hB);
    free(q->r[i].hL);
    q->r[i].hA = q->r[i].hB = q->r[i].hL = NULL;
  }
}

/* h~^s_l(x) for l = 0..n-1 into h. */
static void htab (double complex x, int s, int n, double complex *h) {
  int l;
  h[0] = -s * I;
  if (n > 1)
    h[1] = -(1.0 + s * I / x);
  for (l = 1; l + 1 < n; l++)
    h[l + 1] = (2.0 * l + 1.0) / x * h[l] - h[l - 1];
}

/*
** The four rays for products of a wave of momentum pA (l < nA) and one
** of pB (l < nB) with j_L(k r) (L < nL), from R.  BL_SUCCESS, BL_ENOMEM
** or BL_EDOMAIN (some w = 0).
*/
static int rays_make (rays *q, double R, double pA, int nA, double pB,
                      int nB, double k, int nL) {
  gsl_integration_fixed_workspace *lw;
  const double *u, *W;
  int i, n;
  memset(q, 0, sizeof *q);
  lw = gsl_integration_fixed_alloc(gsl_integration_fixed_laguerre, NLAG,
                                   0.0, 1.0, 0.0, 0.0);
  if (lw == NULL)
    return BL_ENOMEM;
  u = gsl_integration_fixed_nodes(lw);
  W = gsl_integration_fixed_weights(lw);
  for (i = 0; i < 4; i++) {
    ray *y = &q->r[i];
    int sA = (i < 2) ? 1 : -1, sB = (i & 1) ? -1 : 1;
    double w = sA * pA + sB * pB + k, aw = fabs(w), s = w > 0 ? 1.0 : -1.0;
    if (!(aw > 0.0)) {
      gsl_integration_fixed_free(lw);
      rays_free(q);
      return BL_EDOMAIN;
    }
    y->nA = nA;
    y->nB = nB;
    y->nL = nL;
    y->hA = malloc((size_t)NLAG * nA * sizeof *y->hA);
    y->hB = malloc((size_t)NLAG * nB * sizeof *y->hB);
    y->hL = malloc((size_t)NLAG * nL * sizeof *y->hL);
    if (y->hA == NULL || y->hB == NULL || y->hL == NULL) {
      gsl_integration_fixed_free(lw);
      rays_free(q);
      return BL_ENOMEM;
    }
    for (n = 0; n < NLAG; n++) {
      double complex z = R + I * s * u[n] / aw;
      y->c[n] = (I * s / aw) * cexp(I * w * R) * W[n] / (8.0 * k * z);
      htab(pA * z, sA, nA, y->hA + (size_t)n * nA);
      htab(pB * z, sB, nB, y->hB + (size_t)n * nB);
      htab(k * z, 1, nL, y->hL + (size_t)n * nL);
    }
  }
  gsl_integration_fixed_free(lw);
  return BL_SUCCESS;
}

/*
** The tail integral over [R, inf) of A B j_L for L = L0..L1 added to
** out[L - L0]; A = Re[aA H^+_lA(pA r)], B = Re[aB H^+_lB(pB r)].  With
** mag non-NULL, the moduli of the ray integrals are added to mag[].
*/
static void tail (const rays *q, int lA, double complex aA, int lB,
                  double complex aB, int L0, int L1, double *out,
                  double *mag) {
  int i, n, L;
  for (i = 0; i < 4; i++) {
    const ray *y = &q->r[i];
    double complex g[NLAG], a;
    a = ((i < 2) ? aA : conj(aA)) * ((i & 1) ? conj(aB) : aB);
    for (n = 0; n < NLAG; n++)
      g[n] = y->c[n] * y->hA[(size_t)n * y->nA + lA]
             * y->hB[(size_t)n * y->nB + lB];
    for (L = L0; L <= L1; L++) {
      double complex s = 0.0;
      for (n = 0; n < NLAG; n++)
        s += g[n] * y->hL[(size_t)n * y->nL + L];
      out[L - L0] += 2.0 * creal(a * s);
      if (mag != NULL)
        mag[L - L0] += 2.0 * cabs(a * s);
    }
  }
}


/* ------------------------------------------------------------------ */
/* the free-field integral (test of the quadrature)                     */

/* x j_l(x) */
static double rj (int l, double x) {
  gsl_sf_result r;
  if (gsl_sf_bessel_jl_e(l, x, &r) != GSL_SUCCESS)
    return 0.0;
  return x * r.val;
}

/* The ray start for waves up to l of momentum p, multipoles up to L of
** k, frequencies down to wmin and the potential's rc. */
static double ray_start (double rc, int l, double p, int L, double k,
                         double wmin) {
  double R = rc;
  R = fmax(R, RAY_TURN * (l + 2.0) / p);
  R = fmax(R, RAY_TURN * (L + 2.0) / k);
  R = fmax(R, 4.0 / wmin);
  R = fmax(R, 20.0 / p);
  return R;
}

int bl_pw_free3 (double pa, int la, double pb, int lb, double k, int L,
                 double *val, double *scale) {
  grid g;
  rays q;
  double wmin, R, s = 0.0, m = 0.0, t = 0.0, tm = 0.0;
  int i, st;
  if (val == NULL || scale == NULL)
    return BL_EDOMAIN;
  *val = *scale = 0.0;
  if (!(pa > 0.0 && pb > 0.0 && k > 0.0) || !isfinite(pa + pb + k)
      || la < 0 || lb < 0 || L < 0 || la > 2000 || lb > 2000 || L > 2000)
    return BL_EDOMAIN;
  wmin = fmin(fmin(fabs(pa + pb + k), fabs(pa - pb + k)),
              fmin(fabs(-pa + pb + k), fabs(-pa - pb + k)));
  if (!(wmin > 0.0))
    return BL_EDOMAIN;
  R = ray_start(0.0, la > lb ? la : lb, fmin(pa, pb), L, k, wmin);
  st = grid_make(&g, R, PANEL_PHASE / (pa + pb + k));
  if (st)
    return st;
  st = rays_make(&q, R, pa, la + 1, pb, lb + 1, k, L + 1);
  if (st) {
    grid_free(&g);
    return st;
  }
  for (i = 0; i < g.n; i++) {
    double r = g.r[i], f;
    gsl_sf_result jL;
    if (gsl_sf_bessel_jl_e(L, k * r, &jL) != GSL_SUCCESS)
      continue;
    f = rj(la, pa * r) * rj(lb, pb * r) * jL.val * g.w[i];
    s += f;
    m += fabs(f);
  }
  tail(&q, la, 1.0, lb, 1.0, L, L, &t, &tm);
  *val = s + t;
  *scale = m + tm;
  rays_free(&q);
  grid_free(&g);
  return BL_SUCCESS;
}
