/*
** fit-hf.c -- Yukawa sums fitted to xraylib's tabulated F and S; writes the
** generated table of the "hartree-fock" screening model (src/core/models/hf_table.c)
** See Copyright Notice in LICENSE
**
** Run through `make hf-table` (never by `make` or `make check`):
**
**   fit-hf [-n NF NS] [-o FILE]   fit Z = 1..100 and write FILE (default
**                                 src/core/models/hf_table.c); summary on stderr;
**                                 default 4 terms for F and 4 for S
**   fit-hf -s                     summary only, nothing written
**   fit-hf -c                     the scan behind the cut (below), then exit
**   fit-hf -v Z                   table and fit of element Z on stdout
**   fit-hf -z ,Z1,Z2,...,         only these elements (a quick look)
**   fit-hf -p | -l LAMBDA | -w N  variants for comparison: positive weights
**                                 only; penalty weight; reweighting rounds
**
** What it does.  xraylib (libxrl, its C library) tabulates the atomic form
** factor F(x) (FF_Rayl) and the incoherent scattering function S(x)
** (SF_Compt) of the free atoms Z = 1..98, x = sin(theta/2)/lambda in 1/A,
** i.e. x = |q| / (4 pi) with |q| in 1/A, |q| [1/A] = q [MeV] / (hbar c),
** hbar c = 1.973269804e-3 MeV A.  The core needs them as Yukawa sums
** (include/brakelight/bl_models.h):
**
**   F(x)/Z = sum_i alpha_i b_i^2 / (b_i^2 + x^2),
**   S(x)/Z = sum_i alpha_i x^2 / (b_i^2 + x^2),     sum_i alpha_i = 1,
**
** so that F(0) = Z, S(0) = 0, F -> 0 and S -> Z by construction.
**
** Why the weights may be negative.  With every alpha_i > 0 the sum is the
** form factor of a density with r rho(r) = sum_i c_i exp(-b_i r), c_i > 0,
** a completely monotone function; no atom has one (hydrogen: rho ~
** exp(-2r/a)).  Such fits stall at a floor that more terms do not lower:
** hydrogen's F is then off by 5.3e-2 Z and its L (below) by -2.1 %,
** helium's by -1.9 %, with 2 terms as with 6 (run with -p).  A shell is
** closer to a double pole, the limit of two close poles with opposite
** weights.  So the weights may have either sign, under three guards:
**   - a penalty lambda min(alpha_i, 0) per term among the residuals, so
**     that no cancelling pair grows large (sum |alpha_i| <= ABS_MAX is
**     then required), and momenta at least RMIN apart (b_{i+1} >= RMIN b_i,
**     built into the parameters), so that partial fractions in b_i^2 - b_j^2
**     stay well conditioned;
**   - penalties (weight MU) on any departure from a valid screening
**     function at the fit points: 0 <= F/Z, S/Z <= 1, F/Z non-increasing,
**     S/Z non-decreasing, and on the wrong sign of the q -> 0 and q -> inf
**     terms;
**   - acceptance only if valid(): all of that on x = 1e-6 ... 1e6 1/A.
** The best positive fit is always valid, the fallback.  The core's closed
** forms are bilinear in alpha and do not need alpha > 0.
**
** The fit.  Nonlinear least squares (GSL gsl_multifit_nlinear, trust
** region, Levenberg-Marquardt steps, Jacobian in closed form) of the
** absolute errors of F/Z and S/Z at FIT_PPD log-spaced points per decade
** of x on [X_MIN, X_MAX] (a bremsstrahlung integral is one over d ln q),
** plus the penalties.  Starts: for positive fits, equal weights with
** momenta spread around the table's half point; for signed fits, every
** choice of n momenta among NCAND log-spaced candidates gets its weights by
** linear least squares, and the NKEEP best choices, the best positive fit
** and the previous element's fit start full fits; then opt_lawson rounds of
** Lawson's reweighting (w_j *= sqrt(|r_j| / rms)) push towards a smaller
** largest error.  Every result is a candidate; among the valid ones the
** fit kept is the one with the smallest score, the larger of
**   - the largest relative error of the screening functions phi1, phi2
**     (below) against the table's, and
**   - a quarter of the largest |fit - table| at the fit points,
** that is, chosen for what a cross section sees, without large pointwise
** errors.  Deterministic: fixed grids, starts and iteration limits.
**
** The cut.  xraylib interpolates its tables by cubic splines in x; where the
** tabulated points are sparse the spline rings.  Scanning x from 1e-3 at
** 400 points per decade for Z = 1..98 (option -c), the largest departure
** from a positive non-increasing F and a non-decreasing S <= Z, per Z, is
**   x <= 10:   F 0,          S 2.0e-5 Z;
**   x <= 100:  F 1.4e-4 Z,   S 2.3e-4 Z  (ripple: Si has F < 0 at x = 28..45);
**   x <= 1e3:  F 1.4e-3 Z;   far out it is garbage: FF_Rayl(82, 1e8) = 0.498,
**              FF_Rayl(86, 4.4e8) = 3.4 Z.
** X_MAX = 100 1/A (q = 2.48 MeV = 4.86 m_e c) keeps the K shells of the
** heaviest atoms (F/Z = 3.2e-4 for Pb there, 5.4e-4 for U) with a ripple
** below the fit error.  Above X_MAX the Yukawa form continues to F = 0 and
** S = Z by itself; the table values it neglects there are < 6e-4 Z.
** X_MIN = 1e-3 1/A is where SF_Compt's table begins (below, the library
** refuses to extrapolate); there F/Z and S/Z are within 1e-4 of their q -> 0
** limits, which the Yukawa form follows as q^2.
**
** Z = 99, 100 lie beyond xraylib's tables: their fits are Z = 98's with the
** momenta scaled as the Thomas-Fermi atom scales them, b_F ~ Z^(1/3) and
** b_S ~ Z^(2/3), the scalings of Tsai's L_rad = ln(184.15 Z^-1/3) and
** L'_rad = ln(1194 Z^-2/3).  The output marks them.
**
** Checks, per Z and as worst cases in the generated header: the largest
** |fit - table| / Z on a grid CHK_PPD points per decade offset from the fit
** points; the complete-screening constants L = 1 + int_0^1 (1 - F/Z)^2 dq/q
** and L' = 1 + int_0^1 S/Z dq/q (q in m_e c, x up to 20.6 1/A) from table
** and fit; and the screening functions of the high-energy limit
** (Tsai 1974, Rev. Mod. Phys. 46, 815, sec. 3), phi1(d) = 4 + 4 int_d^1 (q - d)^2/q^3 g dq and
** phi2(d) = 10/3 + 4 int_d^1 [q^3 - 6 d^2 q ln(q/d) + 3 d^2 q - 4 d^3]/q^4 g dq
** with g = (1 - F/Z)^2 or S/Z, for d = 5e-5 ... 0.6: the largest relative
** difference fit/table, which is what a cross section at high energy sees.
*/

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include <gsl/gsl_errno.h>
#include <gsl/gsl_matrix.h>
#include <gsl/gsl_multifit_nlinear.h>
#include <gsl/gsl_vector.h>
#include <gsl/gsl_version.h>
#include <xraylib.h>

#include "brakelight/bl_const.h"

#define ZTAB      98          /* last element xraylib tabulates */
#define ZOUT      100         /* elements written (BL_ZMAX) */
#define NMAX      6           /* terms per sum, at most */
#define X_MIN     1e-3        /* 1/A: SF_Compt's first point */
#define X_MAX     100.0       /* 1/A: the cut, see above */
#define FIT_PPD   40          /* fit points per decade of x */
#define CHK_PPD   320         /* check points per decade */
#define INT_PPD   2000        /* quadrature points per decade for L, phi */
#define MAXITER   2000        /* trust-region iterations per start */
#define ABS_MAX   10.0        /* largest sum |alpha_i| accepted */
#define RMIN      1.1         /* smallest ratio b_{i+1}/b_i */
#define NCAND     16          /* candidate momenta of the signed starts */
#define CAND_LO   20.0        /* ... from xh / CAND_LO */
#define CAND_HI   300.0       /* ... to xh * CAND_HI */
#define NKEEP     6           /* best candidate choices fitted in full */
#define MAXPTS    256

/* x [1/A] per q [MeV]: x = q / (4 pi hbar c), hbar c in MeV A. */
#define HBARC_MEVA (BL_HBARC_MEVFM * 1e-5)
#define X_PER_MEV  (1.0 / (4.0 * BL_PI * HBARC_MEVA))
/* x at q = m_e c: the upper end of the complete-screening integrals */
#define X_ME       (BL_ME_MEV * X_PER_MEV)

enum { KIND_F = 0, KIND_S = 1 };

/* Options (main sets them once). */
static int opt_signed = 1;        /* -p clears it */
static double opt_lambda = 0.01;  /* -l */
static int opt_lawson = 10;       /* -w */
static const char *opt_zlist = NULL;  /* -z LIST: only these elements */

/* One fitted sum: n terms, momenta b in x units (1/A). */
typedef struct fit {
  int n;
  double alpha[NMAX], b[NMAX];
} fit;

/* Checks of one fitted sum against the table. */
typedef struct check {
  double maxerr, xworst;   /* max |fit - table| / Z on the check grid */
  double ltab, lfit;       /* L (F) or L' (S) from table and fit */
  double phierr;           /* max relative error of phi1, phi2 */
  double abssum;           /* sum |alpha_i| */
} check;


/*
** Table value per electron, F/Z or S/Z at x (1/A), from xraylib; NaN where
** the library refuses (below its table, Z > 98).
*/
static double table (int kind, int Z, double x) {
  xrl_error *err = NULL;
  double v = kind == KIND_F ? FF_Rayl(Z, x, &err) : SF_Compt(Z, x, &err);
  if (err != NULL) {
    xrl_error_free(err);
    return NAN;
  }
  return v / Z;
}


/* The Yukawa sum at x (1/A). */
static double fit_eval (int kind, const fit *f, double x) {
  double s = 0.0, x2 = x * x;
  int i;
  for (i = 0; i < f->n; i++) {
    double b2 = f->b[i] * f->b[i];
    s += f->alpha[i] * (kind == KIND_F ? b2 : x2) / (b2 + x2);
  }
  return s;
}


/* ------------------------------------------------- screening functions */

/* Quadrature grid in ln x on [X_MIN, X_ME]: n + 1 points, step h. */
static int grid_n (void) {
  return 2 * (int)lround(0.5 * INT_PPD * log10(X_ME / X_MIN));
}


/*
** g on the quadrature grid: (1 - F/Z)^2 (kind F) or S/Z, from the table
** (f == NULL) or the fit.
*/
static void grid_g (int kind, int Z, const fit *f, double *g, int n) {
  double h = log(X_ME / X_MIN) / n;
  int j;
  for (j = 0; j <= n; j++) {
    double x = X_MIN * exp(j * h);
    double v = f == NULL ? table(kind, Z, x) : fit_eval(kind, f, x);
    g[j] = kind == KIND_F ? (1.0 - v) * (1.0 - v) : v;
  }
}


/*
** 1 + int_0^1 g dq/q: Simpson in ln q from X_MIN up, plus the part below
** X_MIN from the small-q law g ~ q^p (p = 4 for F, 2 for S): g(X_MIN)/p.
*/
static double constant (int kind, const double *g, int n) {
  double h = log(X_ME / X_MIN) / n, s = 0.0;
  int j;
  for (j = 0; j <= n; j++)
    s += ((j == 0 || j == n) ? 1.0 : (j % 2 ? 4.0 : 2.0)) * g[j];
  return 1.0 + s * h / 3.0 + g[0] / (kind == KIND_F ? 4.0 : 2.0);
}


/*
** phi1(d) and phi2(d) of the header for d = the grid's q at index i0
** (trapezoid in ln q; the part below X_MIN is absent for d >= q(X_MIN)).
*/
static void phis (const double *g, int n, int i0, double *p1, double *p2) {
  double h = log(X_ME / X_MIN) / n, d = X_MIN * exp(i0 * h) / X_ME;
  double s1 = 0.0, s2 = 0.0, d2 = d * d;
  int j;
  for (j = i0; j <= n; j++) {
    double q = X_MIN * exp(j * h) / X_ME, wt = (j == i0 || j == n) ? 0.5 : 1.0;
    double k1 = (q - d) * (q - d) / (q * q);
    double k2 = (q * q * q - 6.0 * d2 * q * log(q / d) + 3.0 * d2 * q
                 - 4.0 * d2 * d) / (q * q * q);
    s1 += wt * k1 * g[j];
    s2 += wt * k2 * g[j];
  }
  *p1 = 4.0 + 4.0 * h * s1;
  *p2 = 10.0 / 3.0 + 4.0 * h * s2;
}


#define PHI_STEP (INT_PPD / 20)   /* a delta every 1/20 decade */
#define PHI_MAXD 512

/* The table's g on the quadrature grid and its phi1, phi2 at the deltas
** d = q(j PHI_STEP) from q(X_MIN) = 4.9e-5 up to ~0.6 m_e c. */
typedef struct phiref {
  int kind, n, nd;
  double *g;
  double p1[PHI_MAXD], p2[PHI_MAXD];
} phiref;


/* malloc that ends the program on failure (a generator, not the core). */
static void *xmalloc (size_t n) {
  void *p = malloc(n);
  if (p == NULL) {
    fprintf(stderr, "fit-hf: out of memory\n");
    exit(EXIT_FAILURE);
  }
  return p;
}


/* The table's screening functions for element Z; free r->g after use. */
static void phiref_init (phiref *r, int kind, int Z) {
  int j;
  r->kind = kind;
  r->n = grid_n();
  r->g = xmalloc((size_t)(r->n + 1) * sizeof *r->g);
  grid_g(kind, Z, NULL, r->g, r->n);
  r->nd = 0;
  for (j = 0; j < r->n * 95 / 100 && r->nd < PHI_MAXD; j += PHI_STEP) {
    phis(r->g, r->n, j, &r->p1[r->nd], &r->p2[r->nd]);
    r->nd++;
  }
}


/* Largest relative difference of phi1, phi2 between a fit and the table. */
static double phi_error (const phiref *r, const fit *f) {
  double *g = xmalloc((size_t)(r->n + 1) * sizeof *g), e = 0.0;
  int k;
  grid_g(r->kind, 0, f, g, r->n);
  for (k = 0; k < r->nd; k++) {
    double f1, f2;
    phis(g, r->n, k * PHI_STEP, &f1, &f2);
    e = fmax(e, fmax(fabs(f1 / r->p1[k] - 1.0), fabs(f2 / r->p2[k] - 1.0)));
  }
  free(g);
  return isfinite(e) ? e : HUGE_VAL;
}


/* ---------------------------------------------------------------- fitting */

typedef struct problem {
  int kind, n, m;          /* kind, terms, data points */
  int sign;                /* 1: alpha of either sign, 0: alpha > 0 */
  double lambda;           /* weight of the penalty on negative alpha */
  double s2;               /* scale^2 of the leading coefficients (1/A^2) */
  const double *x, *y, *w;
} problem;

/*
** Residuals of a signed fit beyond the m data rows, each a penalty that is
** zero for a valid screening function:
**   n rows       lambda min(alpha_i, 0)            (no large cancellations)
**   1 row        MU min(T, 0), T = sum alpha b^2 / s2   (q -> inf: F, 1 - S
**                                                   approach 0 from above)
**   1 row        MU min(B, 0), B = s2 sum alpha / b^2   (q -> 0: the same)
**   m rows       MU (min(v_j, 0) + max(v_j - 1, 0))     (0 <= F/Z, S/Z <= 1)
**   m - 1 rows   MU max(+-(v_{j+1} - v_j), 0)            (F/Z non-increasing,
**                                                   S/Z non-decreasing)
** at the fit points x_j, v_j the model there.
*/
#define MU 100.0
#define NROWS(pb) ((pb)->sign ? 3 * (pb)->m + (pb)->n + 1 : (pb)->m)


/*
** Parameters -> terms: p = (a_1..a_{n-1}, ln b_0, w_1..w_{n-1}) with
** ln b_i = ln b_{i-1} + ln RMIN + e^(w_i) (increasing, at least RMIN
** apart).  Signed: alpha_i = a_i, alpha_0 = 1 - the others.  Positive:
** alpha = softmax(0, a_1..a_{n-1}).
*/
static void unpack (const problem *pb, const gsl_vector *p, fit *f) {
  int i, n = pb->n;
  f->n = n;
  if (pb->sign) {
    f->alpha[0] = 1.0;
    for (i = 1; i < n; i++) {
      f->alpha[i] = gsl_vector_get(p, i - 1);
      f->alpha[0] -= f->alpha[i];
    }
  }
  else {
    double s, umax = 0.0;
    for (i = 1; i < n; i++)
      if (gsl_vector_get(p, i - 1) > umax)
        umax = gsl_vector_get(p, i - 1);
    f->alpha[0] = s = exp(-umax);
    for (i = 1; i < n; i++)
      s += f->alpha[i] = exp(gsl_vector_get(p, i - 1) - umax);
    for (i = 0; i < n; i++)
      f->alpha[i] /= s;
  }
  f->b[0] = exp(gsl_vector_get(p, n - 1));
  for (i = 1; i < n; i++)
    f->b[i] = f->b[i - 1] * RMIN * exp(exp(gsl_vector_get(p, n - 1 + i)));
}


/*
** Gradient in ln b_0..ln b_{n-1} (d[n-1..2n-2]) -> gradient in the
** parameters ln b_0, w_1..w_{n-1}, ln b_i = ln b_{i-1} + ln RMIN + e^(w_i):
** d/d ln b_0 = sum_k d_k, d/dw_j = e^(w_j) sum_{k>=j} d_k.
*/
static void chain (const fit *f, double *d) {
  int n = f->n, j;
  double tail = 0.0;
  for (j = n - 1; j >= 1; j--) {
    tail += d[n - 1 + j];
    d[n - 1 + j] = (log(f->b[j] / f->b[j - 1]) - log(RMIN)) * tail;
  }
  d[n - 1] += tail;
}


/*
** The model at x and, if d != NULL, its gradient in the parameters.  With
** g_i = b_i^2/(b_i^2+x^2) (F) or x^2/(b_i^2+x^2) (S) and m = sum alpha_i
** g_i: signed, dm/dalpha_k = g_k - g_0; positive, dm/du_k = alpha_k (g_k -
** m); both, dm/d ln b_k = +-2 alpha_k g_k (1 - g_k) (+ for F, - for S).
*/
static double model (const problem *pb, const fit *f, double x, double *d) {
  double x2 = x * x, g[NMAX], m = 0.0;
  int i, n = f->n;
  for (i = 0; i < n; i++) {
    double b2 = f->b[i] * f->b[i];
    g[i] = (pb->kind == KIND_F ? b2 : x2) / (b2 + x2);
    m += f->alpha[i] * g[i];
  }
  if (d != NULL) {
    double sgn = pb->kind == KIND_F ? 2.0 : -2.0;
    for (i = 1; i < n; i++)
      d[i - 1] = pb->sign ? g[i] - g[0] : f->alpha[i] * (g[i] - m);
    for (i = 0; i < n; i++)
      d[n - 1 + i] = sgn * f->alpha[i] * g[i] * (1.0 - g[i]);
    chain(f, d);
  }
  return m;
}


/* The leading coefficients T and B (see NROWS) and their gradients. */
static void leading (const problem *pb, const fit *f, double *T, double *B,
                     double *dT, double *dB) {
  int i, n = f->n;
  double b02 = f->b[0] * f->b[0];
  *T = *B = 0.0;
  for (i = 0; i < n; i++) {
    double b2 = f->b[i] * f->b[i];
    *T += f->alpha[i] * b2 / pb->s2;
    *B += f->alpha[i] * pb->s2 / b2;
    if (dT != NULL) {
      if (i > 0) {
        dT[i - 1] = (b2 - b02) / pb->s2;
        dB[i - 1] = pb->s2 * (1.0 / b2 - 1.0 / b02);
      }
      dT[n - 1 + i] = 2.0 * f->alpha[i] * b2 / pb->s2;
      dB[n - 1 + i] = -2.0 * f->alpha[i] * pb->s2 / b2;
    }
  }
  if (dT != NULL) {
    chain(f, dT);
    chain(f, dB);
  }
}


/*
** All residuals (r) and, if J != NULL, the Jacobian, at the terms f; the
** row layout is NROWS's.  Penalty rows have zero gradient where inactive.
*/
static void rows (const problem *pb, const fit *f, gsl_vector *r,
                  gsl_matrix *J) {
  int n = f->n, np = 2 * n - 1, m = pb->m, j, i;
  double d[2 * NMAX], dprev[2 * NMAX], v, vprev = 0.0;
  for (j = 0; j < m; j++) {
    v = model(pb, f, pb->x[j], J != NULL ? d : NULL);
    gsl_vector_set(r, j, pb->w[j] * (v - pb->y[j]));
    if (J != NULL)
      for (i = 0; i < np; i++)
        gsl_matrix_set(J, j, i, pb->w[j] * d[i]);
    if (pb->sign) {
      int rb = m + n + 2 + j, rm = 2 * m + n + 2 + j - 1;
      double out = fmin(v, 0.0) + fmax(v - 1.0, 0.0);
      gsl_vector_set(r, rb, MU * out);
      if (J != NULL)
        for (i = 0; i < np; i++)
          gsl_matrix_set(J, rb, i, out != 0.0 ? MU * d[i] : 0.0);
      if (j > 0) {
        double up = pb->kind == KIND_F ? v - vprev : vprev - v;
        gsl_vector_set(r, rm, MU * fmax(up, 0.0));
        if (J != NULL)
          for (i = 0; i < np; i++)
            gsl_matrix_set(J, rm, i, up > 0.0 ? MU * (pb->kind == KIND_F
                                                      ? d[i] - dprev[i]
                                                      : dprev[i] - d[i])
                                             : 0.0);
      }
      if (J != NULL)
        for (i = 0; i < np; i++)
          dprev[i] = d[i];
      vprev = v;
    }
  }
  if (pb->sign) {
    double T, B, dT[2 * NMAX], dB[2 * NMAX];
    leading(pb, f, &T, &B, dT, dB);
    for (j = 0; j < n; j++) {
      gsl_vector_set(r, m + j, pb->lambda * fmin(f->alpha[j], 0.0));
      if (J != NULL) {
        double on = f->alpha[j] < 0.0 ? pb->lambda : 0.0;
        for (i = 0; i < np; i++)
          gsl_matrix_set(J, m + j, i, 0.0);
        if (j == 0)
          for (i = 1; i < n; i++)
            gsl_matrix_set(J, m, i - 1, -on);
        else
          gsl_matrix_set(J, m + j, j - 1, on);
      }
    }
    gsl_vector_set(r, m + n, MU * fmin(T, 0.0));
    gsl_vector_set(r, m + n + 1, MU * fmin(B, 0.0));
    if (J != NULL)
      for (i = 0; i < np; i++) {
        gsl_matrix_set(J, m + n, i, T < 0.0 ? MU * dT[i] : 0.0);
        gsl_matrix_set(J, m + n + 1, i, B < 0.0 ? MU * dB[i] : 0.0);
      }
  }
}


static int resid (const gsl_vector *p, void *data, gsl_vector *r) {
  const problem *pb = data;
  fit f;
  unpack(pb, p, &f);
  rows(pb, &f, r, NULL);
  return GSL_SUCCESS;
}


static int jac (const gsl_vector *p, void *data, gsl_matrix *J) {
  const problem *pb = data;
  fit f;
  gsl_vector *r = gsl_vector_alloc((size_t)NROWS(pb));
  unpack(pb, p, &f);
  rows(pb, &f, r, J);
  gsl_vector_free(r);
  return GSL_SUCCESS;
}


/* The objective: the sum of squares of all rows. */
static double cost (const problem *pb, const fit *f) {
  gsl_vector *r = gsl_vector_alloc((size_t)NROWS(pb));
  double c = 0.0;
  size_t j;
  rows(pb, f, r, NULL);
  for (j = 0; j < r->size; j++)
    c += gsl_vector_get(r, j) * gsl_vector_get(r, j);
  gsl_vector_free(r);
  return isfinite(c) ? c : HUGE_VAL;
}


/* Terms in order of increasing b (the table's canonical order). */
static void sort_terms (fit *f) {
  int i, j;
  for (i = 1; i < f->n; i++)
    for (j = i; j > 0 && f->b[j] < f->b[j - 1]; j--) {
      double t = f->b[j]; f->b[j] = f->b[j - 1]; f->b[j - 1] = t;
      t = f->alpha[j]; f->alpha[j] = f->alpha[j - 1]; f->alpha[j - 1] = t;
    }
}


/*
** The barrier leaves the q -> inf coefficient T = sum alpha b^2 at most
** slightly negative; move weight between the terms of largest and smallest
** b (sum alpha unchanged) so that T = 1e-9 sum |alpha| b_max^2 > 0.
*/
static void fix_tail (fit *f) {
  int i, lo = 0, hi = 0;
  double T = 0.0, a = 0.0, want, d;
  for (i = 0; i < f->n; i++) {
    T += f->alpha[i] * f->b[i] * f->b[i];
    a += fabs(f->alpha[i]);
    if (f->b[i] > f->b[hi])
      hi = i;
    if (f->b[i] < f->b[lo])
      lo = i;
  }
  want = 1e-9 * a * f->b[hi] * f->b[hi];
  d = f->b[hi] * f->b[hi] - f->b[lo] * f->b[lo];
  if (T >= want || hi == lo || !(d > 0.0))
    return;
  f->alpha[hi] += (want - T) / d;
  f->alpha[lo] -= (want - T) / d;
}


/*
** One trust-region run from *start (positive weights required for positive
** fits); the result in *out.  Returns the objective.
*/
static double solve (const problem *pb, const fit *start, fit *out) {
  gsl_multifit_nlinear_parameters par =
    gsl_multifit_nlinear_default_parameters();
  gsl_multifit_nlinear_fdf fdf;
  gsl_multifit_nlinear_workspace *w;
  gsl_vector *p0;
  fit s0;
  int n = pb->n, np = 2 * n - 1, nr = NROWS(pb), i, info;
  fdf.f = resid;
  fdf.df = jac;
  fdf.fvv = NULL;
  fdf.n = (size_t)nr;
  fdf.p = (size_t)np;
  fdf.params = (void *)pb;
  p0 = gsl_vector_alloc((size_t)np);
  s0 = *start;
  sort_terms(&s0);
  for (i = 1; i < n; i++) {
    double lr = log(s0.b[i] / s0.b[i - 1]) - log(RMIN);
    if (!(lr > 1e-3)) {
      s0.b[i] = s0.b[i - 1] * RMIN * exp(1e-3);
      lr = 1e-3;
    }
    gsl_vector_set(p0, n - 1 + i, log(lr));
  }
  gsl_vector_set(p0, n - 1, log(s0.b[0]));
  for (i = 1; i < n; i++)
    gsl_vector_set(p0, i - 1, pb->sign ? s0.alpha[i]
                   : log(s0.alpha[i] / s0.alpha[0]));
  par.scale = gsl_multifit_nlinear_scale_more;
  w = gsl_multifit_nlinear_alloc(gsl_multifit_nlinear_trust, &par,
                                 (size_t)nr, (size_t)np);
  gsl_multifit_nlinear_init(p0, &fdf, w);
  gsl_multifit_nlinear_driver(MAXITER, 1e-12, 1e-12, 0.0, NULL, NULL, &info,
                              w);
  unpack(pb, gsl_multifit_nlinear_position(w), out);
  gsl_multifit_nlinear_free(w);
  gsl_vector_free(p0);
  if (pb->sign)
    fix_tail(out);
  return cost(pb, out);
}


/*
** A valid screening function for every momentum: finite terms, b > 0,
** sum |alpha| <= ABS_MAX; on x = 1e-6 ... 1e6 (50 points per decade)
** 0 <= F/Z <= 1 non-increasing, or 0 <= S/Z <= 1 non-decreasing; beyond,
** the leading terms F/Z ~ 1 - x^2 sum alpha/b^2 (S/Z ~ x^2 sum alpha/b^2)
** and F/Z ~ sum alpha b^2 / x^2 (1 - S/Z ~ the same) have the right sign.
*/
static int valid (int kind, const fit *f) {
  const double slack = 1e-13;
  double a = 0.0, lo = 0.0, hi = 0.0, prev = kind == KIND_F ? 1.0 : 0.0;
  int i, j;
  for (i = 0; i < f->n; i++) {
    if (!isfinite(f->alpha[i]) || !isfinite(f->b[i]) || !(f->b[i] > 0.0))
      return 0;
    if (i > 0 && !(f->b[i] >= f->b[i - 1] * RMIN * (1.0 - 1e-12)))
      return 0;
    a += fabs(f->alpha[i]);
    lo += f->alpha[i] / (f->b[i] * f->b[i]);
    hi += f->alpha[i] * f->b[i] * f->b[i];
  }
  if (a > ABS_MAX || !(lo > 0.0) || !(hi > 0.0))
    return 0;
  for (j = 0; j <= 600; j++) {
    double v = fit_eval(kind, f, 1e-6 * pow(10.0, j / 50.0));
    if (!(v >= -slack && v <= 1.0 + slack))
      return 0;
    if (kind == KIND_F ? v > prev + slack : v < prev - slack)
      return 0;
    prev = v;
  }
  return 1;
}


/*
** x where the table crosses 1/2 (F/Z falling, S/Z rising), by bisection in
** ln x on [X_MIN, X_MAX]: the scale the starts are spread around.
*/
static double half_point (int kind, int Z) {
  double lo = log(X_MIN), hi = log(X_MAX);
  int it;
  for (it = 0; it < 60; it++) {
    double mid = 0.5 * (lo + hi), v = table(kind, Z, exp(mid));
    if ((kind == KIND_F) == (v > 0.5))
      lo = mid;
    else
      hi = mid;
  }
  return exp(0.5 * (lo + hi));
}


/*
** Weights for fixed momenta by linear least squares with the sum fixed to 1
** (alpha_0 = 1 - the others) and a ridge lambda^2 sum alpha_i^2 that keeps
** cancelling pairs small; normal equations, Gaussian elimination with
** partial pivoting.  Returns 0, or -1 if singular.
*/
static int linear_alpha (const problem *pb, fit *f) {
  double H[NMAX][NMAX + 1], g[NMAX];
  double l2 = pb->lambda * pb->lambda;
  int n = f->n, k = n - 1, i, j, r, c;
  for (i = 0; i < k; i++)
    for (j = 0; j <= k; j++)
      H[i][j] = j < k ? l2 * (1.0 + (i == j)) : l2;
  for (r = 0; r < pb->m; r++) {
    double x2 = pb->x[r] * pb->x[r], w2 = pb->w[r] * pb->w[r];
    for (i = 0; i < n; i++) {
      double b2 = f->b[i] * f->b[i];
      g[i] = (pb->kind == KIND_F ? b2 : x2) / (b2 + x2);
    }
    for (i = 0; i < k; i++) {
      double di = g[i + 1] - g[0];
      for (j = 0; j < k; j++)
        H[i][j] += w2 * di * (g[j + 1] - g[0]);
      H[i][k] += w2 * di * (pb->y[r] - g[0]);
    }
  }
  for (c = 0; c < k; c++) {
    int p = c;
    for (r = c + 1; r < k; r++)
      if (fabs(H[r][c]) > fabs(H[p][c]))
        p = r;
    if (!(fabs(H[p][c]) > 1e-300))
      return -1;
    for (j = 0; j <= k; j++) {
      double t = H[c][j]; H[c][j] = H[p][j]; H[p][j] = t;
    }
    for (r = c + 1; r < k; r++) {
      double q = H[r][c] / H[c][c];
      for (j = c; j <= k; j++)
        H[r][j] -= q * H[c][j];
    }
  }
  f->alpha[0] = 1.0;
  for (i = k - 1; i >= 0; i--) {
    double s = H[i][k];
    for (j = i + 1; j < k; j++)
      s -= H[i][j] * f->alpha[j + 1];
    f->alpha[i + 1] = s / H[i][i];
    f->alpha[0] -= f->alpha[i + 1];
  }
  return 0;
}


/*
** Keep the NKEEP starts of smallest cost, sorted: insert f with cost c.
*/
static void keep_best (fit *keep, double *ckeep, int *nkeep, const fit *f,
                       double c) {
  int at;
  if (!isfinite(c) || (*nkeep == NKEEP && c >= ckeep[NKEEP - 1]))
    return;
  at = *nkeep < NKEEP ? (*nkeep)++ : NKEEP - 1;
  while (at > 0 && ckeep[at - 1] > c) {
    ckeep[at] = ckeep[at - 1];
    keep[at] = keep[at - 1];
    at--;
  }
  ckeep[at] = c;
  keep[at] = *f;
}


/*
** The best valid fit so far.  Score: the larger of the screening functions'
** largest relative error and a quarter of the largest |fit - table| at the
** fit points (a pointwise error enters phi1 about 4 times diluted).
*/
typedef struct chooser {
  int kind;
  const phiref *ref;
  const problem *pb;
  fit best;
  double score;
} chooser;


/* Keep f if it is valid and scores better than the best. */
static void consider (chooser *ch, const fit *f) {
  double sc, e = 0.0;
  int j;
  if (!valid(ch->kind, f))
    return;
  for (j = 0; j < ch->pb->m; j++)
    e = fmax(e, fabs(fit_eval(ch->kind, f, ch->pb->x[j]) - ch->pb->y[j]));
  sc = fmax(phi_error(ch->ref, f), 0.25 * e);
  if (sc < ch->score) {
    ch->score = sc;
    ch->best = *f;
  }
}


/*
** Fit n terms to the table of element Z (see the header for the method).
** prev: the previous element's fit, a start (may be NULL); ref: the
** table's screening functions, by which the valid candidates are ranked.
*/
static void fit_element (int kind, int Z, int n, const fit *prev,
                         const phiref *ref, fit *best) {
  static const double ratios[] = { 2.0, 4.0, 8.0, 16.0, 32.0 };
  const int nr = (int)(sizeof ratios / sizeof ratios[0]);
  int m = 0, j, s, i, nx, idx[NMAX], nkeep = 0;
  double x[MAXPTS], y[MAXPTS], w[MAXPTS], xh, cbest = HUGE_VAL;
  double ckeep[NKEEP], cand[NCAND];
  fit keep[NKEEP], pos, cur;
  problem pb;
  chooser ch;
  nx = (int)lround(FIT_PPD * log10(X_MAX / X_MIN));
  for (j = 0; j <= nx && m < MAXPTS; j++) {
    double xj = X_MIN * pow(10.0, (double)j / FIT_PPD), v = table(kind, Z, xj);
    if (!isfinite(v))
      continue;
    x[m] = xj;
    y[m] = v;
    w[m] = 1.0;
    m++;
  }
  pb.kind = kind;
  pb.n = n;
  pb.m = m;
  pb.x = x;
  pb.y = y;
  pb.w = w;
  pb.lambda = opt_lambda;
  xh = half_point(kind, Z);
  pb.s2 = xh * xh;
  ch.kind = kind;
  ch.ref = ref;
  ch.pb = &pb;
  ch.score = HUGE_VAL;

  /* positive fits: the smallest sum of squares is a candidate */
  pb.sign = 0;
  for (s = 0; s < nr; s++) {
    fit start, out;
    double c;
    start.n = n;
    for (i = 0; i < n; i++) {
      start.alpha[i] = 1.0 / n;
      start.b[i] = xh * pow(ratios[s], i - 0.5 * (n - 1));
    }
    c = solve(&pb, &start, &out);
    if (c < cbest) {
      cbest = c;
      pos = out;
    }
  }
  consider(&ch, &pos);
  if (!(ch.score < HUGE_VAL)) {
    fprintf(stderr, "fit-hf: Z = %d: no valid positive fit\n", Z);
    exit(EXIT_FAILURE);
  }

  if (opt_signed) {
    /* screen every n-subset of the candidates, lexicographic order */
    pb.sign = 1;
    for (i = 0; i < NCAND; i++)
      cand[i] = xh / CAND_LO * pow(CAND_LO * CAND_HI, (double)i / (NCAND - 1));
    for (i = 0; i < n; i++)
      idx[i] = i;
    for (;;) {
      fit f;
      f.n = n;
      for (i = 0; i < n; i++)
        f.b[i] = cand[idx[i]];
      if (linear_alpha(&pb, &f) == 0)
        keep_best(keep, ckeep, &nkeep, &f, cost(&pb, &f));
      for (i = n - 1; i >= 0 && idx[i] == NCAND - n + i; i--)
        ;
      if (i < 0)
        break;
      idx[i]++;
      for (j = i + 1; j < n; j++)
        idx[j] = idx[j - 1] + 1;
    }
    for (s = 0; s < nkeep + 2; s++) {
      const fit *start = s < nkeep ? &keep[s] : s == nkeep ? &pos : prev;
      fit out;
      if (start == NULL || start->n != n)
        continue;
      solve(&pb, start, &out);
      consider(&ch, &out);
    }
  }

  /* Lawson's reweighting from the best so far; every round a candidate */
  cur = ch.best;
  for (s = 0; s < opt_lawson; s++) {
    double rms = 0.0;
    fit out;
    for (j = 0; j < m; j++) {
      double r = fit_eval(kind, &cur, x[j]) - y[j];
      rms += r * r;
    }
    rms = sqrt(rms / m);
    if (!(rms > 0.0))
      break;
    for (j = 0; j < m; j++) {
      double r = fabs(fit_eval(kind, &cur, x[j]) - y[j]);
      w[j] *= sqrt(fmax(r / rms, 0.05));
    }
    solve(&pb, &cur, &out);
    consider(&ch, &out);
    if (valid(kind, &out))
      cur = out;
  }
  *best = ch.best;
  sort_terms(best);
}


/* ----------------------------------------------------------------- checks */

/* All checks of one fit; ref: the table's screening functions. */
static void check_fit (int kind, int Z, const fit *f, const phiref *ref,
                       check *c) {
  int nx = (int)lround(CHK_PPD * log10(X_MAX / X_MIN)), j;
  double *g = xmalloc((size_t)(ref->n + 1) * sizeof *g);
  c->maxerr = c->xworst = c->abssum = 0.0;
  for (j = 0; j < f->n; j++)
    c->abssum += fabs(f->alpha[j]);
  for (j = 0; j < nx; j++) {
    double x = X_MIN * pow(10.0, (j + 0.5) / CHK_PPD);
    double d = fabs(fit_eval(kind, f, x) - table(kind, Z, x));
    if (d > c->maxerr) {
      c->maxerr = d;
      c->xworst = x;
    }
  }
  grid_g(kind, Z, f, g, ref->n);
  c->ltab = constant(kind, ref->g, ref->n);
  c->lfit = constant(kind, g, ref->n);
  c->phierr = phi_error(ref, f);
  free(g);
}


/*
** The scan behind the cut: per range x <= X, the largest departure of the
** tables from a positive non-increasing F and a non-decreasing S <= Z, per
** Z, over Z = 1..98 at 400 points per decade from x = X_MIN.
*/
static void scan_cut (void) {
  static const double edges[] = { 10, 30, 100, 300, 1e3, 1e4, 1e9 };
  size_t k;
  for (k = 0; k < sizeof edges / sizeof edges[0]; k++) {
    double X = edges[k], vf = 0.0, vs = 0.0, xf = 0.0, xs = 0.0;
    int Z, zf = 0, zs = 0;
    for (Z = 1; Z <= ZTAB; Z++) {
      int n = (int)lround(400 * log10(X / X_MIN)), j;
      double fmin_ = 1.0, smax = 0.0;
      for (j = 0; j <= n; j++) {
        double x = X_MIN * pow(10.0, (double)j / 400);
        double f = table(KIND_F, Z, x), s = table(KIND_S, Z, x);
        double v1 = f > fmin_ ? f - fmin_ : 0.0, v2 = s < smax ? smax - s : 0.0;
        if (-f > v1)
          v1 = -f;
        if (s - 1.0 > v2)
          v2 = s - 1.0;
        if (v1 > vf) { vf = v1; zf = Z; xf = x; }
        if (v2 > vs) { vs = v2; zs = Z; xs = x; }
        if (f < fmin_)
          fmin_ = f;
        if (s > smax)
          smax = s;
      }
    }
    printf("x <= %-6g  F: %.2e Z (Z = %d, x = %.4g)   S: %.2e Z (Z = %d, "
           "x = %.4g)\n", X, vf, zf, xf, vs, zs, xs);
  }
}


/* ----------------------------------------------------------------- output */

static void usage (void) {
  fprintf(stderr,
          "usage: fit-hf [-n NF NS] [-o FILE] [-s] [-c] [-v Z] [-z LIST] "
          "[-p] [-l LAMBDA] [-w N]\n"
          "  -n NF NS   terms of the F and S sums (1..%d; default %d %d)\n"
          "  -o FILE    output (default src/core/models/hf_table.c)\n"
          "  -s         summary only, write nothing\n"
          "  -c         print the scan behind the cut and exit\n"
          "  -v Z       print table and fit of element Z (stdout)\n"
          "  -z LIST    only the elements in LIST, written ,Z1,Z2,...,\n"
          "  -p         positive weights only (comparison)\n"
          "  -l LAMBDA  penalty on negative weights (default %g)\n"
          "  -w N       rounds of Lawson reweighting (default %d)\n",
          NMAX, 4, 4, opt_lambda, opt_lawson);
}


/* "{a0, a1, ...}, {b0, b1, ...}" with b in MeV. */
static void print_terms (FILE *out, const fit *f) {
  int i;
  fprintf(out, "    {");
  for (i = 0; i < f->n; i++)
    fprintf(out, "%s%.17g", i ? ", " : "", f->alpha[i]);
  fprintf(out, "},\n    {");
  for (i = 0; i < f->n; i++)
    fprintf(out, "%s%.17g", i ? ", " : "", f->b[i] / X_PER_MEV);
  fprintf(out, "}");
}


/* Worst cases over Z = 1..ZTAB. */
typedef struct summary {
  double maxerr, lrel, phierr, abssum;
  int zmax, zl, zphi, zabs;
} summary;


static void summarise (check chk[][ZOUT + 1], int k, summary *s) {
  int Z;
  memset(s, 0, sizeof *s);
  for (Z = 1; Z <= ZTAB; Z++) {
    const check *c = &chk[k][Z];
    double rel = fabs(c->lfit / c->ltab - 1.0);
    if (c->maxerr > s->maxerr) { s->maxerr = c->maxerr; s->zmax = Z; }
    if (rel > s->lrel) { s->lrel = rel; s->zl = Z; }
    if (c->phierr > s->phierr) { s->phierr = c->phierr; s->zphi = Z; }
    if (c->abssum > s->abssum) { s->abssum = c->abssum; s->zabs = Z; }
  }
}


static int write_table (const char *path, int nf, int ns,
                        fit fits[][ZOUT + 1], check chk[][ZOUT + 1],
                        const summary *sf, const summary *ss) {
  FILE *out = fopen(path, "w");
  int Z;
  if (out == NULL) {
    perror(path);
    return -1;
  }
  fprintf(out,
    "/*\n"
    "** hf_table.c -- Yukawa fits of the Hartree-Fock F and S per element\n"
    "** See Copyright Notice in LICENSE\n"
    "**\n"
    "** GENERATED FILE, do not edit: made by scripts/fit-hf.c through\n"
    "** `make hf-table` (fit-hf -n %d %d -l %g -w %d) from xraylib %d.%d.%d\n"
    "** (FF_Rayl, SF_Compt) with GSL %s.\n"
    "**\n"
    "**   F/Z = sum_i alpha_i b_i^2 / (b_i^2 + q^2)   n_F = %d terms\n"
    "**   S/Z = sum_i alpha_i q^2 / (b_i^2 + q^2)     n_S = %d terms\n"
    "**\n"
    "** sum_i alpha_i = 1 (alpha_i of either sign, sum |alpha_i| <= %g), b_i\n"
    "** in MeV with b_{i+1} >= %g b_i; each sum a valid screening function\n"
    "** (0 <= F/Z, S/Z <= 1, monotonic) for every q.\n"
    "** Fitted on x = q/(4 pi hbar c) in [%g, %g] 1/A,\n"
    "** i.e. q <= %.4g MeV: the cut, beyond which the tables ring (see the\n"
    "** generator).  Z = 1..%d from the tables; Z = %d, %d are Z = %d with b\n"
    "** scaled by (Z/%d)^(1/3) (F) and (Z/%d)^(2/3) (S), as the Thomas-Fermi\n"
    "** atom scales.\n"
    "**\n"
    "** Accuracy, Z = 1..%d (worst element in parentheses):\n"
    "**   max |F_fit - F_table| / Z = %.2e (Z = %d), over the fitted range\n"
    "**   max |S_fit - S_table| / Z = %.2e (Z = %d)\n"
    "**   complete-screening constants (q in m_e c), fit against table:\n"
    "**   L  = 1 + int_0^1 (1 - F/Z)^2 dq/q: max rel. %.2e (Z = %d)\n"
    "**   L' = 1 + int_0^1 S/Z dq/q:         max rel. %.2e (Z = %d)\n"
    "**   screening functions phi1, phi2 (delta = 5e-5 .. 0.6 m_e c),\n"
    "**   max rel.: %.2e with F (Z = %d), %.2e with S (Z = %d)\n"
    "**   largest sum |alpha_i|: %.2f (F, Z = %d), %.2f (S, Z = %d)\n"
    "*/\n\n"
    "#include \"models/internal.h\"\n\n"
    "/* The cut in MeV (x = %g 1/A). */\n"
    "const double bl_hf_qmax = %.17g;\n\n"
    "/* Index Z - 1: F terms (alpha, b), S terms (alpha, b), the Z whose\n"
    "** table was fitted. */\n"
    "const bl_hf_fit bl_hf_table[%d] = {\n",
    nf, ns, opt_lambda, opt_lawson, XRAYLIB_MAJOR, XRAYLIB_MINOR,
    XRAYLIB_MICRO, GSL_VERSION, nf, ns, ABS_MAX, RMIN, X_MIN, X_MAX,
    X_MAX / X_PER_MEV, ZTAB, ZTAB + 1, ZOUT, ZTAB, ZTAB, ZTAB, ZTAB,
    sf->maxerr, sf->zmax, ss->maxerr, ss->zmax, sf->lrel, sf->zl, ss->lrel,
    ss->zl, sf->phierr, sf->zphi, ss->phierr, ss->zphi, sf->abssum, sf->zabs,
    ss->abssum, ss->zabs, X_MAX, X_MAX / X_PER_MEV, ZOUT);
  for (Z = 1; Z <= ZOUT; Z++) {
    if (Z <= ZTAB)
      fprintf(out, "  /* Z = %d: max|dF|/Z %.1e, max|dS|/Z %.1e; L %.4f"
              " (table %.4f), L' %.4f (table %.4f) */\n", Z,
              chk[0][Z].maxerr, chk[1][Z].maxerr, chk[0][Z].lfit,
              chk[0][Z].ltab, chk[1][Z].lfit, chk[1][Z].ltab);
    else
      fprintf(out, "  /* Z = %d: scaled from Z = %d */\n", Z, ZTAB);
    fprintf(out, "  { %d, %d,\n", fits[0][Z].n, fits[1][Z].n);
    print_terms(out, &fits[0][Z]);
    fprintf(out, ",\n");
    print_terms(out, &fits[1][Z]);
    fprintf(out, ",\n    %d },\n", Z <= ZTAB ? Z : ZTAB);
  }
  fprintf(out, "};\n");
  if (fclose(out) != 0) {
    perror(path);
    return -1;
  }
  return 0;
}


int main (int argc, char **argv) {
  static fit fits[2][ZOUT + 1];
  static check chk[2][ZOUT + 1];
  const char *path = "src/core/models/hf_table.c";
  int nf = 4, ns = 4, only_summary = 0, verbose_z = 0, a, Z, k;
  summary sf, ss;
  for (a = 1; a < argc; a++) {
    if (strcmp(argv[a], "-n") == 0 && a + 2 < argc) {
      nf = atoi(argv[++a]);
      ns = atoi(argv[++a]);
    }
    else if (strcmp(argv[a], "-o") == 0 && a + 1 < argc)
      path = argv[++a];
    else if (strcmp(argv[a], "-s") == 0)
      only_summary = 1;
    else if (strcmp(argv[a], "-c") == 0) {
      scan_cut();
      return EXIT_SUCCESS;
    }
    else if (strcmp(argv[a], "-v") == 0 && a + 1 < argc)
      verbose_z = atoi(argv[++a]);
    else if (strcmp(argv[a], "-p") == 0)
      opt_signed = 0;
    else if (strcmp(argv[a], "-l") == 0 && a + 1 < argc)
      opt_lambda = atof(argv[++a]);
    else if (strcmp(argv[a], "-w") == 0 && a + 1 < argc)
      opt_lawson = atoi(argv[++a]);
    else if (strcmp(argv[a], "-z") == 0 && a + 1 < argc)
      opt_zlist = argv[++a];
    else {
      usage();
      return EXIT_FAILURE;
    }
  }
  if (nf < 1 || nf > NMAX || ns < 1 || ns > NMAX || !(opt_lambda >= 0.0)
      || opt_lawson < 0) {
    usage();
    return EXIT_FAILURE;
  }
  if (opt_zlist != NULL)
    only_summary = 1;     /* a partial table is never written */
  gsl_set_error_handler_off();
  for (Z = 1; Z <= ZTAB; Z++) {
    if (verbose_z != 0 && Z != verbose_z)
      continue;
    if (opt_zlist != NULL) {
      char key[8];
      snprintf(key, sizeof key, ",%d,", Z);
      if (strstr(opt_zlist, key) == NULL)
        continue;
    }
    for (k = 0; k < 2; k++) {
      phiref ref;
      phiref_init(&ref, k, Z);
      fit_element(k, Z, k == KIND_F ? nf : ns,
                  Z > 1 ? &fits[k][Z - 1] : NULL, &ref, &fits[k][Z]);
      check_fit(k, Z, &fits[k][Z], &ref, &chk[k][Z]);
      free(ref.g);
    }
    fprintf(stderr, "Z=%3d F: max %.2e at x=%-7.3g L %.4f/%.4f (%+.1e) phi "
            "%.1e |a| %.2f  S: max %.2e at x=%-7.3g L' %.4f/%.4f (%+.1e) "
            "psi %.1e |a| %.2f\n", Z, chk[0][Z].maxerr, chk[0][Z].xworst,
            chk[0][Z].ltab, chk[0][Z].lfit,
            chk[0][Z].lfit / chk[0][Z].ltab - 1.0, chk[0][Z].phierr,
            chk[0][Z].abssum, chk[1][Z].maxerr, chk[1][Z].xworst,
            chk[1][Z].ltab, chk[1][Z].lfit,
            chk[1][Z].lfit / chk[1][Z].ltab - 1.0, chk[1][Z].phierr,
            chk[1][Z].abssum);
  }
  if (verbose_z != 0) {
    int j;
    if (verbose_z < 1 || verbose_z > ZTAB)
      return EXIT_FAILURE;
    for (k = 0; k < 2; k++) {
      const fit *f = &fits[k][verbose_z];
      int i;
      printf("# %s: alpha, b (1/A)\n", k == KIND_F ? "F/Z" : "S/Z");
      for (i = 0; i < f->n; i++)
        printf("#   %.6g %.6g\n", f->alpha[i], f->b[i]);
      printf("# x (1/A)  table  fit  fit - table\n");
      for (j = 0; j <= 5 * 20; j++) {
        double x = X_MIN * pow(10.0, j / 20.0), t = table(k, verbose_z, x);
        double v = fit_eval(k, f, x);
        printf("%d %.6g %.8g %.8g %+.3e\n", k, x, t, v, v - t);
      }
    }
    return EXIT_SUCCESS;
  }
  /* Z = 99, 100: Z = 98 scaled as the Thomas-Fermi atom (header) */
  for (Z = ZTAB + 1; Z <= ZOUT; Z++)
    for (k = 0; k < 2; k++) {
      double r = pow((double)Z / ZTAB, k == KIND_F ? 1.0 / 3.0 : 2.0 / 3.0);
      int i;
      fits[k][Z] = fits[k][ZTAB];
      for (i = 0; i < fits[k][Z].n; i++)
        fits[k][Z].b[i] *= r;
    }
  summarise(chk, KIND_F, &sf);
  summarise(chk, KIND_S, &ss);
  fprintf(stderr,
          "n_F = %d, n_S = %d, lambda = %g, Lawson rounds = %d; x in "
          "[%g, %g] 1/A\n"
          "max |F_fit - F_tab|/Z %.2e (Z = %d)   max |S_fit - S_tab|/Z %.2e "
          "(Z = %d)\n"
          "max |L/L_tab - 1| %.2e (Z = %d)        max |L'/L'_tab - 1| %.2e "
          "(Z = %d)\n"
          "max phi rel. err. %.2e (Z = %d)        max psi rel. err. %.2e "
          "(Z = %d)\n"
          "max sum|alpha| F %.2f (Z = %d)         S %.2f (Z = %d)\n",
          nf, ns, opt_lambda, opt_lawson, X_MIN, X_MAX, sf.maxerr, sf.zmax,
          ss.maxerr, ss.zmax, sf.lrel, sf.zl, ss.lrel, ss.zl, sf.phierr,
          sf.zphi, ss.phierr, ss.zphi, sf.abssum, sf.zabs, ss.abssum,
          ss.zabs);
  if (only_summary)
    return EXIT_SUCCESS;
  return write_table(path, nf, ns, fits, chk, &sf, &ss) == 0
         ? EXIT_SUCCESS : EXIT_FAILURE;
}
