/*
** radial.c -- regular radial Dirac continuum functions in the static field
** of a screened atom: the potential's cut radius, the solution on the
** caller's grid, its phase shift and its normalization
** See Copyright Notice in LICENSE
**
** The radial Dirac equation of internal.h (Rose 1961, "Relativistic
** Electron Theory", ch. 5; the same form as Tseng & Pratt 1971, Phys.
** Rev. A 3, 100, and Yerokhin & Surzhykov 2010, Phys. Rev. A 82,
** 062702, arXiv:1011.2743) is integrated outward, P and Q
** together, by Taylor steps of order TAYLOR_K = 30 (the classical Taylor
** series method for a linear equation with analytic coefficients): with
** W = r V, which is entire (zza sum a_i e^{-c_i r} outside the nucleus, a
** cubic plus exponentials inside), the equation times r gives the
** coefficients at r0 + s by a two-term recursion and a convolution with
** those of W (taylor_coef).  The step is the largest the last two terms
** allow for TAYLOR_TOL times the local amplitude A = sqrt(P^2 +
** ((E+1)/p)^2 Q^2) (A = 1 for the free wave far out), times 0.8, and at
** most r0/4 (the solution's branch point at r = 0 bounds the radius of
** convergence by r0).  Far out that is p h ~ 3 radians a step with no
** stage evaluations: grid points inside a step are read off its
** polynomial, and only R (where V'' jumps) and rc end a step.  Step
** lengths are exact differences of the radii they join, so r never
** drifts (with r += h rounded every step the phase error grew like x^2).
** Measured free-field phase error: 3e-17 per radian of x = p r.
**
** The start (derivation in DEVELOPERS.md, "Partial waves: radial
** functions"):
**  - point nucleus: the Frobenius series P, Q ~ r^gamma (a0 + a1 r,
**    b0 + b1 r), gamma = sqrt(kappa^2 - Z'^2), Z' = zza sum a_i, with
**    b0/a0 = Z'/(gamma - kappa) = -(gamma + kappa)/Z' and a1, b1 from
**    V = Z'/r + V1 + O(r) (start_vector);
**  - inside a uniform sphere (V regular, V(0) = V0): kappa < 0:
**    P = r^|kappa|, Q = -(E - 1 - V0) r^(|kappa|+1)/(2|kappa| + 1);
**    kappa > 0: Q = r^kappa, P = (E + 1 - V0) r^(kappa+1)/(2 kappa + 1),
** at r0 = START_KR / K, K = E + 1 + |V| scale.  The omitted higher terms
** put an irregular admixture of relative size ~ (r0 K)^2 (point nucleus)
** or r0 K (sphere) into the start, and it dies like (r0/r)^(2 gamma)
** (2 gamma >= 1.4 for |Z'| <= 0.7): below 1e-17 by r = 1/K.  For |kappa| >= WKB_KAPPA the start moves out to the
** radius where the WKB exponent up to the turning point (a barrier
** (gamma - 1)^2/r^2 against the largest local momentum the potential can
** give) reaches WKB_EFOLDS: the solution there is e^-60 of its
** turning-point size and any start vector converges to the regular
** solution to e^-120.  Grid points below the start get the leading power
** law scaled from the start (values below e^-60 of the wave's size).
**
** The match: at rc (V = 0 beyond) the solution is a combination
** alpha phi + beta chi of the free regular and irregular pairs
** phi = (u_l, s p/(E+1) u_lbar), chi = (w_l, s p/(E+1) w_lbar)
** (u = x j, w = x y, Riccati-Bessel), read off with their Wronskian
** p/(E+1): alpha = (P chi_Q - Q chi_P) (E+1)/p, beta = (phi_P Q - phi_Q P)
** (E+1)/p; tan d = -beta/alpha and the solution is divided by
** N = sqrt(alpha^2 + beta^2) (sign chosen so that d is in (-pi/2, pi/2]).
** The Riccati-Bessel functions carry a log scale (riccati below), so that
** a wave still under its barrier at rc (large |kappa| at low p) matches
** without overflow.
*/

#include <math.h>
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>

#include <gsl/gsl_errno.h>
#include <gsl/gsl_sf_expint.h>

#include "partial/internal.h"


#define STEP_MAX    200000000L  /* refuse more steps than this */
#define START_KR    1e-7    /* r0 K of the Frobenius start */
#define WKB_KAPPA   8       /* |kappa| from which the WKB start is tried */
#define WKB_EFOLDS  60.0    /* e-folds of the start under the barrier */
#define WKB_RATIO   0.99    /* radius ratio of the WKB exponent's scan */
#define RESCALE     1e250   /* the stored values are scaled down beyond */
#define CF_ITER_MAX 10000000L  /* continued-fraction terms, at most */
#define RICCATI_UP  20.0    /* upward recurrence for x > L + RICCATI_UP */
#define TAYLOR_K    30      /* order of the Taylor steps */
#define TAYLOR_TOL  1e-17   /* last terms / amplitude */
#define TAYLOR_SAFE 0.8     /* step = TAYLOR_SAFE times the allowed one */
#define TAYLOR_RMAX 0.25    /* step <= TAYLOR_RMAX r (the pole at r = 0) */


/* ------------------------------------------------------------------ */
/* checks                                                              */
/* ------------------------------------------------------------------ */

/* Write a message (printf style) when msg is not NULL; return code. */
static int fail (char *msg, size_t size, int code, const char *fmt, ...)
  __attribute__((format(printf, 4, 5)));

static int fail (char *msg, size_t size, int code, const char *fmt, ...) {
  if (msg != NULL && size > 0) {
    va_list ap;
    va_start(ap, fmt);
    vsnprintf(msg, size, fmt, ap);
    va_end(ap);
  }
  return code;
}


/*
** Arguments of bl_pwpot_init: BL_SUCCESS, BL_EDOMAIN or BL_EMODEL with
** the message.
*/
int bl_pwpot_check (double zza, const bl_yukawa *y, double m_mev,
                    double R_fm, double tol, char *msg, size_t size) {
  double s = 0.0;
  int i;
  if (msg != NULL && size > 0)
    msg[0] = '\0';
  if (!isfinite(zza))
    return fail(msg, size, BL_EDOMAIN, "zza = %g: must be finite", zza);
  if (y == NULL)
    return fail(msg, size, BL_EDOMAIN, "y = NULL: a Yukawa form is needed");
  if (y->n < 1 || y->n > BL_YUKAWA_MAX)
    return fail(msg, size, BL_EDOMAIN, "y->n = %d: allowed 1..%d", y->n,
                BL_YUKAWA_MAX);
  for (i = 0; i < y->n; i++) {
    if (!isfinite(y->alpha[i]))
      return fail(msg, size, BL_EDOMAIN, "y->alpha[%d] = %g: must be finite",
                  i, y->alpha[i]);
    if (!isfinite(y->b[i]) || y->b[i] < 0.0)
      return fail(msg, size, BL_EDOMAIN, "y->b[%d] = %g MeV: allowed [0, inf)",
                  i, y->b[i]);
    s += y->alpha[i];
  }
  if (!(fabs(s - 1.0) <= BL_PW_SUM_TOL))
    return fail(msg, size, BL_EDOMAIN, "sum of y->alpha = %.17g: allowed "
                "1 +- %g", s, BL_PW_SUM_TOL);
  if (!isfinite(m_mev) || m_mev <= 0.0)
    return fail(msg, size, BL_EDOMAIN, "m_mev = %g: allowed (0, inf)", m_mev);
  if (!isfinite(R_fm) || R_fm < 0.0)
    return fail(msg, size, BL_EDOMAIN, "R_fm = %g: allowed [0, inf)", R_fm);
  if (!(tol > 0.0 && tol < 1.0))
    return fail(msg, size, BL_EDOMAIN, "tol = %g: allowed (0, 1)", tol);
  for (i = 0; i < y->n; i++)
    if (y->b[i] == 0.0 && y->alpha[i] != 0.0 && zza != 0.0)
      return fail(msg, size, BL_EMODEL, "y->b[%d] = 0 with alpha = %g: a "
                  "bare Coulomb tail has no finite cut radius", i,
                  y->alpha[i]);
  return BL_SUCCESS;
}


/* The tail measure |zza| sum |a_i| E1(c_i r) of the cut radius. */
static double tail (const bl_pwpot *v, double r) {
  double s = 0.0;
  int i;
  for (i = 0; i < v->n; i++) {
    gsl_sf_result e;
    if (v->a[i] == 0.0)
      continue;
    if (gsl_sf_expint_E1_e(v->c[i] * r, &e) == GSL_SUCCESS)
      s += fabs(v->a[i]) * e.val;   /* (an underflow leaves 0 out) */
  }
  return fabs(v->zza) * s;
}


/*
** Fill *v (internal.h).  The cut radius: tail(rc) = tol, by bisection in
** ln r between a radius where the tail exceeds tol and one where it does
** not; at least R.  With zza = 0, rc = R.
*/
int bl_pwpot_init (bl_pwpot *v, double zza, const bl_yukawa *y, double m_mev,
                   double R_fm, double tol) {
  double lo, hi, cmin = HUGE_VAL;
  int i, st, it;
  if (v == NULL)
    return BL_EDOMAIN;
  st = bl_pwpot_check(zza, y, m_mev, R_fm, tol, NULL, 0);
  if (st != BL_SUCCESS)
    return st;
  v->zza = zza;
  v->n = y->n;
  for (i = 0; i < BL_YUKAWA_MAX; i++) {
    v->a[i] = i < y->n ? y->alpha[i] : 0.0;
    v->c[i] = i < y->n ? y->b[i] / m_mev : 0.0;
    if (i < y->n && v->a[i] != 0.0 && v->c[i] < cmin)
      cmin = v->c[i];
  }
  v->R = R_fm * m_mev / BL_HBARC_MEVFM;
  v->rc = v->R;
  if (zza == 0.0 || !isfinite(cmin) || tail(v, v->R > 0.0 ? v->R : 1e-300)
      <= tol)
    return BL_SUCCESS;
  lo = v->R > 0.0 ? v->R : 1e-3 / cmin;
  hi = 1.0 / cmin;
  for (it = 0; it < 2000 && tail(v, hi) > tol; it++)
    hi *= 2.0;
  if (tail(v, hi) > tol)
    return BL_ENOTCONV;
  for (it = 0; it < 200 && hi - lo > 1e-13 * hi; it++) {
    double mid = sqrt(lo * hi);
    if (tail(v, mid) > tol)
      lo = mid;
    else
      hi = mid;
  }
  v->rc = hi;
  return BL_SUCCESS;
}


/*
** Arguments of bl_pw_radial: BL_SUCCESS or BL_EDOMAIN with the message.
*/
int bl_pw_radial_check (const bl_pwpot *v, double E, int kappa, int n,
                        const double *r, char *msg, size_t size) {
  double s = 0.0;
  int i;
  if (msg != NULL && size > 0)
    msg[0] = '\0';
  if (v == NULL)
    return fail(msg, size, BL_EDOMAIN, "v = NULL: a potential is needed");
  if (!isfinite(v->zza))
    return fail(msg, size, BL_EDOMAIN, "v->zza = %g: must be finite", v->zza);
  if (v->n < 1 || v->n > BL_YUKAWA_MAX)
    return fail(msg, size, BL_EDOMAIN, "v->n = %d: allowed 1..%d", v->n,
                BL_YUKAWA_MAX);
  for (i = 0; i < v->n; i++) {
    if (!isfinite(v->a[i]))
      return fail(msg, size, BL_EDOMAIN, "v->a[%d] = %g: must be finite", i,
                  v->a[i]);
    if (!isfinite(v->c[i]) || v->c[i] < 0.0)
      return fail(msg, size, BL_EDOMAIN, "v->c[%d] = %g: allowed [0, inf)",
                  i, v->c[i]);
    s += v->a[i];
  }
  if (!(fabs(s - 1.0) <= BL_PW_SUM_TOL))
    return fail(msg, size, BL_EDOMAIN, "sum of v->a = %.17g: allowed 1 +- %g",
                s, BL_PW_SUM_TOL);
  if (!isfinite(v->R) || v->R < 0.0)
    return fail(msg, size, BL_EDOMAIN, "v->R = %g: allowed [0, inf)", v->R);
  if (!isfinite(v->rc) || v->rc < v->R)
    return fail(msg, size, BL_EDOMAIN, "v->rc = %g: allowed [R = %g, inf)",
                v->rc, v->R);
  if (!(E > 1.0) || !isfinite(E))
    return fail(msg, size, BL_EDOMAIN, "E = %g (units of m c^2): allowed "
                "(1, inf)", E);
  if (kappa == 0 || kappa > BL_PW_KAPPA_MAX || kappa < -BL_PW_KAPPA_MAX)
    return fail(msg, size, BL_EDOMAIN, "kappa = %d: allowed +-1..+-%d",
                kappa, BL_PW_KAPPA_MAX);
  if (v->R == 0.0 && v->rc > 0.0 && !(fabs(v->zza * s) < abs(kappa)))
    return fail(msg, size, BL_EDOMAIN, "|zza sum a| = %g at kappa = %d: a "
                "point nucleus needs |zza sum a| < |kappa|",
                fabs(v->zza * s), kappa);
  if (n <= 0)
    return fail(msg, size, BL_EDOMAIN, "n = %d: allowed 1.. (grid points)",
                n);
  if (r == NULL)
    return fail(msg, size, BL_EDOMAIN, "r = NULL: a grid is needed");
  for (i = 0; i < n; i++) {
    if (!isfinite(r[i]) || r[i] <= 0.0)
      return fail(msg, size, BL_EDOMAIN, "r[%d] = %g: allowed (0, inf)", i,
                  r[i]);
    if (i > 0 && !(r[i] > r[i - 1]))
      return fail(msg, size, BL_EDOMAIN, "r[%d] = %.17g after r[%d] = %.17g:"
                  " the grid must increase", i, r[i], i - 1, r[i - 1]);
  }
  return BL_SUCCESS;
}


/* ------------------------------------------------------------------ */
/* the potential and the equation                                      */
/* ------------------------------------------------------------------ */

/*
** V(r) of internal.h.  Outside the nucleus zza sum a_i e^{-c_i r}/r;
** inside, phi_N - 1/r = (3R^2 - r^2)/(2R^3) - 1/r is summed with
** sum a_i e^{-c_i r}/r as (sum a - 1)/r - sum a_i (1 - e^{-c_i r})/r +
** (3R^2 - r^2)/(2R^3), free of cancellation at r -> 0.
*/
static double potential (const bl_pwpot *v, double sa, double r) {
  double s = 0.0;
  int i;
  if (r >= v->R) {
    for (i = 0; i < v->n; i++)
      s += v->a[i] * exp(-v->c[i] * r);
    return v->zza * s / r;
  }
  for (i = 0; i < v->n; i++)
    s -= v->a[i] * (-expm1(-v->c[i] * r));
  return v->zza * ((s + (sa - 1.0)) / r
                   + (3.0 * v->R * v->R - r * r) / (2.0 * v->R * v->R * v->R));
}

typedef struct eqn {
  const bl_pwpot *v;
  double E, sa, kappa;
  int vfree;             /* 1: V = 0 (the free equation, beyond rc) */
} eqn;

/* ------------------------------------------------------------------ */
/* Riccati-Bessel functions                                            */
/* ------------------------------------------------------------------ */

/*
** u_l = x j_l(x), w_l = x y_l(x) at l = L-1 and L (L >= 1, x > 0) as
** mantissas and log scales: u_l = u[l-L+1] e^{su}, w_l = w[l-L+1] e^{sw}.
** w by the upward recurrence w_{l+1} = (2l+1)/x w_l - w_{l-1} (the
** dominant solution: stable) from w_0 = -cos x, w_1 = -cos x/x - sin x,
** scaled down by 1e-200 whenever it passes 1e200.  u for x > L + 20 by
** the same recurrence from u_0 = sin x, u_1 = sin x/x - cos x (stable
** while l < x: both solutions oscillate); otherwise the ratio
** g = u_L/u_{L-1} by the continued fraction of the recurrence,
** 1/g_l = (2l+1)/x - g_{l+1} (modified Lentz), and the Wronskian
** u_L w_{L-1} - u_{L-1} w_L = 1: u_{L-1} = 1/(g w_{L-1} - w_L).
** Returns BL_SUCCESS or BL_ENOTCONV (continued fraction too long).
*/
static int riccati (int L, double x, double u[2], double *su, double w[2],
                    double *sw) {
  double wm = -cos(x), wl = -cos(x) / x - sin(x), s = 0.0;
  int l;
  for (l = 1; l < L; l++) {
    double wn = (2.0 * l + 1.0) / x * wl - wm;
    wm = wl;
    wl = wn;
    if (fabs(wl) > 1e200) {
      wm *= 1e-200;
      wl *= 1e-200;
      s += 460.51701859880913680 /* 200 ln 10 */;
    }
  }
  w[0] = wm;
  w[1] = wl;
  *sw = s;
  if (x > L + RICCATI_UP) {
    double um = sin(x), ul = sin(x) / x - cos(x);
    for (l = 1; l < L; l++) {
      double un = (2.0 * l + 1.0) / x * ul - um;
      um = ul;
      ul = un;
    }
    u[0] = um;
    u[1] = ul;
    *su = 0.0;
  } else {
    const double tiny = 1e-300;
    double f = (2.0 * L + 1.0) / x, C = f, D = 0.0, g;
    long j;
    for (j = 1; j < CF_ITER_MAX; j++) {
      double b = (2.0 * (L + j) + 1.0) / x, dl;
      D = b - D;
      if (D == 0.0)
        D = tiny;
      C = b - 1.0 / C;
      if (C == 0.0)
        C = tiny;
      D = 1.0 / D;
      dl = C * D;
      f *= dl;
      if (fabs(dl - 1.0) < 1e-16)
        break;
    }
    if (j >= CF_ITER_MAX)
      return BL_ENOTCONV;
    g = 1.0 / f;
    u[0] = 1.0 / (g * w[0] - w[1]);
    u[1] = g * u[0];
    *su = -s;
  }
  return BL_SUCCESS;
}

/* m e^s without overflow in e^s (0 for m = 0). */
static double sexp (double m, double s) {
  if (m == 0.0)
    return 0.0;
  if (fabs(s) < 600.0)
    return m * exp(s);
  return copysign(exp(log(fabs(m)) + s), m);
}

/*
** The free form of internal.h at x = p r: P = cos d u_l - sin d w_l,
** Q = s p/(E+1) (cos d u_lbar - sin d w_lbar).
*/
static int free_wave (int kappa, double p, double E, double cd, double sd,
                      double r, double *P, double *Q) {
  double u[2], w[2], su, sw, x = p * r;
  int L = abs(kappa), il = kappa < 0 ? 0 : 1, st;
  st = riccati(L, x, u, &su, w, &sw);
  if (st != BL_SUCCESS)
    return st;
  *P = sexp(cd * u[il], su) - sexp(sd * w[il], sw);
  *Q = (kappa < 0 ? -1.0 : 1.0) * p / (E + 1.0)
       * (sexp(cd * u[1 - il], su) - sexp(sd * w[1 - il], sw));
  return BL_SUCCESS;
}


/* ------------------------------------------------------------------ */
/* the start                                                           */
/* ------------------------------------------------------------------ */

/*
** The start radius for |kappa| >= WKB_KAPPA: scanning down from the free
** turning point (|kappa| + 1)/p with ratio WKB_RATIO, the radius where
** int_r^rt sqrt(max(0, (gamma - 1)^2/r^2 - (E + Vb)^2 + 1)) dr reaches
** WKB_EFOLDS, Vb = |zza| sum |a_i| / max(r, 2R/3) a bound on |V|;
** at least r0.  Below r0 the Frobenius start is used anyway.
*/
static double wkb_start (const bl_pwpot *v, double E, int kappa, double r0) {
  double p = sqrt((E - 1.0) * (E + 1.0)), sabs = 0.0, g, r, S = 0.0;
  int i;
  for (i = 0; i < v->n; i++)
    sabs += fabs(v->a[i]);
  g = sqrt((double)kappa * kappa - v->zza * v->zza * sabs * sabs) - 1.0;
  r = (abs(kappa) + 1.0) / p;
  while (r > r0) {
    double rn = r * WKB_RATIO, rm = 0.5 * (r + rn);
    double vb = fabs(v->zza) * sabs / fmax(rm, 2.0 * v->R / 3.0);
    double k2 = (E + vb) * (E + vb) - 1.0, f2 = g * g / (rm * rm) - k2;
    if (f2 > 0.0)
      S += sqrt(f2) * (r - rn);
    r = rn;
    if (S >= WKB_EFOLDS)
      break;
  }
  return r > r0 ? r : r0;
}

/*
** The start vector y at rs and the exponents of the power laws used for
** grid points below rs (see the file's header).
*/
static void start_vector (const bl_pwpot *v, double E, int kappa, double sa,
                          double rs, double y[2], double *eP, double *eQ) {
  double k = kappa;
  if (v->R > 0.0 && rs < v->R) {
    double V0 = potential(v, sa, 0.5 * rs);   /* V(0) to O(rs) */
    if (kappa < 0) {
      y[0] = 1.0;
      y[1] = -(E - 1.0 - V0) * rs / (1.0 - 2.0 * k);
      *eP = -k;
      *eQ = 1.0 - k;
    } else {
      y[1] = 1.0;
      y[0] = (E + 1.0 - V0) * rs / (2.0 * k + 1.0);
      *eP = k + 1.0;
      *eQ = k;
    }
  } else {
    /* V = Z'/r + V1 + O(r): the leading pair and its first correction,
    ** (g+1+kappa) a1 + Z' b1 = (E+1-V1) b0,
    ** -Z' a1 + (g+1-kappa) b1 = -(E-1-V1) a0, determinant 2g + 1 */
    double z = v->zza * sa, g = sqrt(k * k - z * z), V1 = 0.0, a0, b0, a1, b1;
    int i;
    for (i = 0; i < v->n; i++)
      V1 -= v->zza * v->a[i] * v->c[i];
    if (kappa < 0) {
      a0 = 1.0;
      b0 = z / (g - k);
    } else {
      a0 = -z / (g + k);
      b0 = 1.0;
    }
    a1 = ((E + 1.0 - V1) * b0 * (g + 1.0 - k) + z * (E - 1.0 - V1) * a0)
         / (2.0 * g + 1.0);
    b1 = (-(g + 1.0 + k) * (E - 1.0 - V1) * a0 + z * (E + 1.0 - V1) * b0)
         / (2.0 * g + 1.0);
    y[0] = a0 + a1 * rs;
    y[1] = b0 + b1 * rs;
    *eP = *eQ = g;
  }
}


/* ------------------------------------------------------------------ */
/* the solution                                                        */
/* ------------------------------------------------------------------ */

/* Multiply P[0..m-1], Q[0..m-1] by e^f (f may be far outside exp's range). */
static void scale_all (double *P, double *Q, int m, double f) {
  int i;
  if (fabs(f) < 700.0) {
    double e = exp(f);
    for (i = 0; i < m; i++) {
      P[i] *= e;
      Q[i] *= e;
    }
    return;
  }
  for (i = 0; i < m; i++) {
    P[i] = sexp(P[i], f);
    Q[i] = sexp(Q[i], f);
  }
}

/*
** The Taylor coefficients W[0..K] of W(r) = r V(r) at r0 + s: outside the
** nucleus W = zza sum a_i e^{-c_i r}; inside (r0 < R) W = zza [(sum a - 1)
** - sum a_i (1 - e^{-c_i r}) + (3 R^2 r - r^3)/(2 R^3)] (a polynomial
** plus exponentials: entire either way).
*/
static void w_series (const bl_pwpot *v, double sa, double r0, int inside,
                      double *W) {
  int i, k;
  for (k = 0; k <= TAYLOR_K; k++)
    W[k] = 0.0;
  for (i = 0; i < v->n; i++) {
    double t = v->a[i] * exp(-v->c[i] * r0);
    if (inside)
      W[0] -= v->a[i] * (-expm1(-v->c[i] * r0));
    else
      W[0] += t;
    for (k = 1; k <= TAYLOR_K && t != 0.0; k++) {
      t *= -v->c[i] / k;
      W[k] += t;
    }
  }
  if (inside) {
    double R3 = 2.0 * v->R * v->R * v->R, R2 = 3.0 * v->R * v->R;
    W[0] += (sa - 1.0) + (R2 * r0 - r0 * r0 * r0) / R3;
    W[1] += (R2 - 3.0 * r0 * r0) / R3;
    W[2] += -3.0 * r0 / R3;
    W[3] += -1.0 / R3;
  }
  for (k = 0; k <= TAYLOR_K; k++)
    W[k] *= v->zza;
}

/* 1/(k+1), k = 0..TAYLOR_K-1 (a multiplication instead of a division) */
static const double inv_k1[TAYLOR_K] = {
  1.0 / 1, 1.0 / 2, 1.0 / 3, 1.0 / 4, 1.0 / 5, 1.0 / 6,
  1.0 / 7, 1.0 / 8, 1.0 / 9, 1.0 / 10, 1.0 / 11, 1.0 / 12,
  1.0 / 13, 1.0 / 14, 1.0 / 15, 1.0 / 16, 1.0 / 17, 1.0 / 18,
  1.0 / 19, 1.0 / 20, 1.0 / 21, 1.0 / 22, 1.0 / 23, 1.0 / 24,
  1.0 / 25, 1.0 / 26, 1.0 / 27, 1.0 / 28, 1.0 / 29, 1.0 / 30
};

/*
** One Taylor step of the equation multiplied by r (r = r0 + s, W = r V):
**   r0 (k+1) P_{k+1} = -(kappa + k) P_k + (E+1)(r0 Q_k + Q_{k-1}) - (W*Q)_k
**   r0 (k+1) Q_{k+1} =  (kappa - k) Q_k - (E-1)(r0 P_k + P_{k-1}) + (W*P)_k
** ((W*Q)_k = sum_j W_j Q_{k-j}), to order TAYLOR_K, from (P, Q) = y at r0,
** in the scaled form p_k = P_k hs^k (hs = *hsc, the power of 2 at or below
** r0: s/hs is exact, and p_k stays in range where P_k ~ r0^-k would
** overflow at tiny r0):
**   p_{k+1} = (hs/r0) [-(kappa + k) p_k + (E+1)(r0 q_k + hs q_{k-1})
**             - sum_j w_j q_{k-j}] / (k+1),   w_j = W_j hs^j,
** and the same for q.  Coefficients into cP, cQ; returns the step h the
** last two terms allow for TAYLOR_TOL times the amplitude A, times
** TAYLOR_SAFE, at most hmax.
*/
static double taylor_coef (const eqn *q, double r0, int inside, double w,
                           const double y[2], double hmax, double *cP,
                           double *cQ, double *hsc) {
  double W[TAYLOR_K + 1], A = sqrt(y[0] * y[0] + w * w * y[1] * y[1]);
  double hs = ldexp(1.0, ilogb(r0)), rho = hs / r0, sig = hmax / hs;
  double kap = q->kappa, E = q->E, t = 1.0, th = 1.0, big;
  int k, j, J = 0;
  if (q->vfree)
    for (k = 0; k <= TAYLOR_K; k++)
      W[k] = 0.0;
  else
    w_series(q->v, q->sa, r0, inside, W);
  /* J: the last W_j with W_j hmax^j above 1e-17 of the other terms'
  ** scale, (E+1) r0 + |kappa| + k (the convolution beyond J adds nothing
  ** for a step of at most hmax) */
  big = 1e-17 * ((E + 1.0) * r0 + fabs(kap) + TAYLOR_K);
  for (k = 0; k <= TAYLOR_K; k++) {
    if (fabs(W[k]) * th > big)
      J = k;
    th *= hmax;
    W[k] *= t;
    t *= hs;
  }
  cP[0] = y[0];
  cQ[0] = y[1];
  for (k = 0; k < TAYLOR_K; k++) {
    double sp = 0.0, sq = 0.0, pm = k > 0 ? cP[k - 1] : 0.0;
    double qm = k > 0 ? cQ[k - 1] : 0.0;
    for (j = 0; j <= k && j <= J; j++) {
      sp += W[j] * cQ[k - j];
      sq += W[j] * cP[k - j];
    }
    cP[k + 1] = rho * inv_k1[k] * (-(kap + k) * cP[k]
                                   + (E + 1.0) * (r0 * cQ[k] + hs * qm) - sp);
    cQ[k + 1] = rho * inv_k1[k] * ((kap - k) * cQ[k]
                                   - (E - 1.0) * (r0 * cP[k] + hs * pm) + sq);
  }
  for (k = TAYLOR_K - 1; k <= TAYLOR_K; k++) {
    double c = fmax(fabs(cP[k]), w * fabs(cQ[k]));
    if (c > 0.0)
      sig = fmin(sig, pow(TAYLOR_TOL * A / c, 1.0 / k));
  }
  *hsc = hs;
  return TAYLOR_SAFE * sig * hs;
}

/* The polynomials at sigma = s/hs (Horner). */
static void taylor_eval (const double *cP, const double *cQ, double sig,
                         double *P, double *Q) {
  double a = cP[TAYLOR_K], b = cQ[TAYLOR_K];
  int k;
  for (k = TAYLOR_K - 1; k >= 0; k--) {
    a = a * sig + cP[k];
    b = b * sig + cQ[k];
  }
  *P = a;
  *Q = b;
}

/*
** Integrate from rs to rm by Taylor steps (see the file's header),
** storing the grid points r[i0..m-1] (rs < r[i] < rm) into P, Q by the
** step's polynomial, the end values into y; when the amplitude passes
** RESCALE, y and every value stored so far (r[0..i-1], those below rs
** too) are divided by RESCALE: one factor for all, which the match
** removes.  Returns BL_SUCCESS, BL_ENOTCONV or BL_ENONFINITE.
** Steps end at R and at rm exactly, and their lengths are exact
** differences of the radii they join (no drift of r).
*/
static int integrate (const eqn *q, double rs, double rm, const double *r,
                      int i0, int m, double *P, double *Q, double y[2]) {
  const double w = (q->E + 1.0) / sqrt((q->E - 1.0) * (q->E + 1.0));
  double t = rs, cP[TAYLOR_K + 1] = {0.0}, cQ[TAYLOR_K + 1] = {0.0};
  double hprev = HUGE_VAL;
  long steps = 0;
  int i = i0;
  for (; i < m && r[i] <= t; i++) {   /* points at the start itself */
    P[i] = y[0];
    Q[i] = y[1];
  }
  while (t < rm) {
    int inside = t < q->v->R;
    double t1 = inside ? q->v->R : rm, h, tn, A, hs;
    h = taylor_coef(q, t, inside, w, y, fmin(TAYLOR_RMAX * t, 2.0 * hprev),
                    cP, cQ, &hs);
    if (!(h > 0.0) || ++steps > STEP_MAX)
      return BL_ENOTCONV;
    tn = t + h;
    if (tn >= t1 || t1 - tn < 1e-3 * h)
      tn = t1;
    h = tn - t;   /* exact */
    if (tn != t1)
      hprev = h;
    for (; i < m && r[i] <= tn; i++)
      taylor_eval(cP, cQ, (r[i] - t) / hs, P + i, Q + i);
    taylor_eval(cP, cQ, h / hs, y, y + 1);
    t = tn;
    if (!isfinite(y[0]) || !isfinite(y[1]))
      return BL_ENONFINITE;
    A = sqrt(y[0] * y[0] + w * w * y[1] * y[1]);
    if (A > RESCALE) {
      y[0] /= RESCALE;
      y[1] /= RESCALE;
      scale_all(P, Q, i, -log(RESCALE));   /* with those below rs */
    }
  }
  return BL_SUCCESS;
}

/* Reduce d (tan d = t, N cos d = alpha) to (-pi/2, pi/2]: sign of N. */
static double phase (double alpha, double beta, double *sign) {
  double d = atan2(-beta, alpha);
  *sign = 1.0;
  if (d > (0.5 * BL_PI)) {
    d -= BL_PI;
    *sign = -1.0;
  } else if (d <= -(0.5 * BL_PI)) {
    d += BL_PI;
    *sign = -1.0;
  }
  return d;
}


/*
** The regular solution (internal.h): check, start, integrate to rc,
** match, normalize, fill the free form beyond rc.
*/
int bl_pw_radial (const bl_pwpot *v, double E, int kappa, int n,
                  const double *r, double *P, double *Q, double *delta) {
  double p, sa = 0.0, rm, rs, r0, K, eP, eQ, y[2], d = 0.0, cd, sd;
  int i, m, i0, st;
  eqn q;
  st = bl_pw_radial_check(v, E, kappa, n, r, NULL, 0);
  if (st != BL_SUCCESS)
    return st;
  if (P == NULL || Q == NULL || delta == NULL)
    return BL_EDOMAIN;
  p = sqrt((E - 1.0) * (E + 1.0));
  for (i = 0; i < v->n; i++)
    sa += v->a[i];
  rm = v->rc;
  /* the start */
  K = E + 1.0 + fabs(v->zza) * (v->R > 0.0 ? 1.5 / v->R : 0.0);
  for (i = 0; i < v->n; i++)
    K += fabs(v->zza * v->a[i]) * v->c[i];
  r0 = START_KR / K;
  if (v->R > 0.0 && r0 > 1e-3 * v->R)
    r0 = 1e-3 * v->R;
  rs = abs(kappa) >= WKB_KAPPA ? wkb_start(v, E, kappa, r0) : r0;
  /* the match at rm = max(rc, rs): a start beyond rc means that the wave
  ** never reaches the potential, and the match there gives d ~ 0 */
  if (rs > rm)
    rm = rs;
  for (m = 0; m < n && r[m] < rm; m++)
    ;
  {
    double y0[2], ur[2], wr[2], su, sw, wq = (E + 1.0) / p;
    double phP, phQ, chP, chQ, al, be, sal, sbe, smax, nrm, sgn;
    double sg = kappa < 0 ? -1.0 : 1.0;
    int il = kappa < 0 ? 0 : 1;
    start_vector(v, E, kappa, sa, rs, y0, &eP, &eQ);
    for (i0 = 0; i0 < m && r[i0] <= rs; i0++) {
      P[i0] = y0[0] * pow(r[i0] / rs, eP);
      Q[i0] = y0[1] * pow(r[i0] / rs, eQ);
    }
    q.v = v;
    q.E = E;
    q.sa = sa;
    q.kappa = kappa;
    q.vfree = 0;
    y[0] = y0[0];
    y[1] = y0[1];
    st = integrate(&q, rs, rm, r, i0, m, P, Q, y);
    if (st != BL_SUCCESS)
      return st;
    /* the match at rm */
    st = riccati(abs(kappa), p * rm, ur, &su, wr, &sw);
    if (st != BL_SUCCESS)
      return st;
    phP = ur[il];
    phQ = sg / wq * ur[1 - il];
    chP = wr[il];
    chQ = sg / wq * wr[1 - il];
    al = (y[0] * chQ - y[1] * chP) * wq;    /* times e^sw */
    be = (phP * y[1] - phQ * y[0]) * wq;    /* times e^su */
    sal = sw;
    sbe = su;
    smax = fmax(sal, sbe);
    al = sexp(al, sal - smax);
    be = sexp(be, sbe - smax);
    d = phase(al, be, &sgn);
    nrm = hypot(al, be);
    if (!(nrm > 0.0) || !isfinite(nrm))
      return BL_ENONFINITE;
    /* the points beyond rm by the free equation's Taylor steps where that
    ** is cheaper than free_wave's O(|kappa|) recurrences per point (cost
    ** in flops: a step ~ 2000 for ~3 radians, a dense point ~ 120, a
    ** recurrence order ~ 6) */
    if (m < n && 2000.0 * p * (r[n - 1] - rm) / 3.0 + 120.0 * (n - m)
                 < (6.0 * abs(kappa) + 100.0) * (n - m)) {
      q.vfree = 1;
      st = integrate(&q, rm, r[n - 1], r, m, n, P, Q, y);
      if (st != BL_SUCCESS)
        return st;
      m = n;
    }
    /* P / (sgn N), N = nrm e^smax in the units of the stored values */
    scale_all(P, Q, m, -smax - log(nrm));
    if (sgn < 0.0)
      for (i = 0; i < m; i++) {
        P[i] = -P[i];
        Q[i] = -Q[i];
      }
  }
  cd = cos(d);
  sd = sin(d);
  for (i = m; i < n; i++) {
    st = free_wave(kappa, p, E, cd, sd, r[i], P + i, Q + i);
    if (st != BL_SUCCESS)
      return st;
  }
  for (i = 0; i < n; i++)
    if (!isfinite(P[i]) || !isfinite(Q[i]))
      return BL_ENONFINITE;
  *delta = d;
  return BL_SUCCESS;
}
