/*
** test_pwradial.c -- the partial-wave room's radial Dirac functions
** (src/core/partial/radial.c): free field, grid and cut independence, an
** independent integrator, the first Born limit, the Dirac-Coulomb phase
** differences, bad input
** See Copyright Notice in LICENSE
**
** Suite pwradial.  Units hbar = c = m = 1 (partial/internal.h).
*/

#include <complex.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include <criterion/criterion.h>
#include <gsl/gsl_errno.h>
#include <gsl/gsl_integration.h>
#include <gsl/gsl_sf_bessel.h>
#include <gsl/gsl_sf_expint.h>
#include <gsl/gsl_sf_gamma.h>
#include <gsl/gsl_sf_legendre.h>
#include <gsl/gsl_sf_result.h>

#include "brakelight.h"
#include "partial/internal.h"
#include "testutil.h"

TestSuite(pwradial, .init = setup);

#define ZAU (79.0 / 137.035999084)
#define ME  0.51099895000

/* The Thomas-Fermi (Moliere) Yukawa form of Au, for an electron. */
static void au_pot (bl_pwpot *v, double zza, double R_fm, double tol) {
  const bl_model *mod = bl_model_find("thomas-fermi");
  double par[8];
  bl_yukawa y;
  cr_assert(mod != NULL);
  bl_model_defaults(mod, par);
  cr_assert_eq(mod->yukawa(79, par, &y), BL_SUCCESS);
  cr_assert_eq(bl_pwpot_init(v, zza, &y, ME, R_fm, tol), BL_SUCCESS);
}

/* One Yukawa term e^{-c r}/r (c in m c/hbar), point nucleus. */
static void yuk_pot (bl_pwpot *v, double zza, double c, double tol) {
  bl_yukawa y;
  y.n = 1;
  y.alpha[0] = 1.0;
  y.b[0] = c * ME;
  cr_assert_eq(bl_pwpot_init(v, zza, &y, ME, 0.0, tol), BL_SUCCESS);
}

static int lof (int kappa) { return kappa > 0 ? kappa : -kappa - 1; }
static int lbarof (int kappa) { return kappa > 0 ? kappa - 1 : -kappa; }

/* x j_l(x), x y_l(x) from GSL (an implementation apart from radial.c's). */
static double rj (int l, double x) { return x * gsl_sf_bessel_jl(l, x); }
static double ry (int l, double x) { return x * gsl_sf_bessel_yl(l, x); }

/* difference of two phases modulo pi, in (-pi/2, pi/2] */
static double dphase (double a, double b) {
  double d = fmod(a - b, BL_PI);
  if (d > 0.5 * BL_PI)
    d -= BL_PI;
  if (d <= -0.5 * BL_PI)
    d += BL_PI;
  return d;
}


/* ==================================================================
** Free field: with zza = 0 the regular solution is the free wave,
** P = x j_l(x), Q = s p/(E+1) x j_lbar(x), delta = 0 (internal.h; the
** free Dirac spherical waves, Rose 1961 ch. 5), to 1e-12 absolute (the
** amplitude is 1), with GSL's gsl_sf_bessel_jl as the reference.  rc is
** set by hand so that the integrator runs over [0, rc] and the free form
** (radial.c's own Riccati-Bessel functions) fills beyond.
*/
Test(pwradial, free_field) {
  const double Es[] = {1.02, 3.0, 20.0};
  const int ks[] = {-1, 1, -5, 5, 20, -200};
  size_t ie, ik;
  int i;
  enum { N = 60 };
  double r[N], P[N], Q[N], d;
  for (ie = 0; ie < 3; ie++)
    for (ik = 0; ik < sizeof ks / sizeof ks[0]; ik++) {
      bl_pwpot v;
      double E = Es[ie], p = sqrt(E * E - 1.0);
      int k = ks[ik], l = lof(k), lb = lbarof(k);
      au_pot(&v, 0.0, 7.0, 1e-12);
      v.rc = 40.0;
      for (i = 0; i < N; i++)
        r[i] = 80.0 * (i + 1.0) / N;
      cr_assert_eq(bl_pw_radial(&v, E, k, N, r, P, Q, &d), BL_SUCCESS);
      cr_expect(fabs(d) <= 1e-12, "E %g kappa %d: delta %g", E, k, d);
      for (i = 0; i < N; i++) {
        double x = p * r[i], Pw = rj(l, x);
        double Qw = (k > 0 ? 1.0 : -1.0) * p / (E + 1.0) * rj(lb, x);
        cr_expect(fabs(P[i] - Pw) <= 1e-12,
                  "E %g kappa %d r %g: P %.15g want %.15g", E, k, r[i],
                  P[i], Pw);
        cr_expect(fabs(Q[i] - Qw) <= 1e-12,
                  "E %g kappa %d r %g: Q %.15g want %.15g", E, k, r[i],
                  Q[i], Qw);
      }
    }
}


/* ==================================================================
** Independence of the grid and of the cut: the same solution on a grid
** twice as dense, and with rc raised (tol 1e-12 -> 1e-15), gives delta
** and P, Q within 1e-9 relative or 1e-12 absolute (no external source: a
** property of the method).
*/
/* within 1e-9 relative or 1e-12 absolute (the amplitude is 1) */
static int close9 (double a, double b) {
  return fabs(a - b) <= 1e-9 * fabs(a) + 1e-12;
}

Test(pwradial, grid_and_cut) {
  const double Es[] = {1.02, 3.0, 20.0};
  const int ks[] = {-1, 1, -5, 20, -200};
  const double zs[] = {-ZAU, ZAU};
  size_t ie, ik, iz;
  int i;
  enum { N = 2000 };
  double *r = malloc(2 * N * sizeof *r), *P = malloc(2 * N * sizeof *P);
  double *Q = malloc(2 * N * sizeof *Q), *P2 = malloc(2 * N * sizeof *P2);
  double *Q2 = malloc(2 * N * sizeof *Q2), *r2 = malloc(2 * N * sizeof *r2);
  double gmax = 0.0, cmax = 0.0;
  cr_assert(r && P && Q && P2 && Q2 && r2);
  for (iz = 0; iz < 2; iz++)
    for (ie = 0; ie < 3; ie++)
      for (ik = 0; ik < sizeof ks / sizeof ks[0]; ik++) {
        bl_pwpot v, v2;
        double E = Es[ie], d, d2, d3;
        int k = ks[ik];
        au_pot(&v, zs[iz], 7.0, 1e-12);
        au_pot(&v2, zs[iz], 7.0, 1e-15);
        for (i = 0; i < N; i++)
          r[i] = 0.5 * v.rc * pow((i + 1.0) / N, 2.0);
        for (i = 0; i < 2 * N; i++)
          r2[i] = 0.5 * v.rc * pow((i + 1.0) / (2 * N), 2.0);
        cr_assert_eq(bl_pw_radial(&v, E, k, N, r, P, Q, &d), BL_SUCCESS);
        cr_assert_eq(bl_pw_radial(&v, E, k, 2 * N, r2, P2, Q2, &d2),
                     BL_SUCCESS);
        cr_expect(fabs(dphase(d, d2)) <= 1e-9, "zza %g E %g kappa %d: "
                  "delta %.15g, dense grid %.15g", zs[iz], E, k, d, d2);
        gmax = fmax(gmax, fabs(dphase(d, d2)));
        /* r[i] = r2[2i+1]; the first failing point only */
        for (i = 0; i < N; i++)
          if (!close9(P[i], P2[2 * i + 1]) || !close9(Q[i], Q2[2 * i + 1])) {
            cr_expect(0, "zza %g E %g kappa %d r %g: P %.15g dense %.15g, "
                      "Q %.15g dense %.15g", zs[iz], E, k, r[i], P[i],
                      P2[2 * i + 1], Q[i], Q2[2 * i + 1]);
            break;
          }
        cr_assert_eq(bl_pw_radial(&v2, E, k, N, r, P2, Q2, &d3), BL_SUCCESS);
        cr_expect(v2.rc > 1.2 * v.rc, "rc %g -> %g", v.rc, v2.rc);
        cr_expect(fabs(dphase(d, d3)) <= 1e-9, "zza %g E %g kappa %d: "
                  "delta %.15g, rc raised %.15g", zs[iz], E, k, d, d3);
        cmax = fmax(cmax, fabs(dphase(d, d3)));
        for (i = 0; i < N; i++)
          if (!close9(P[i], P2[i]) || !close9(Q[i], Q2[i])) {
            cr_expect(0, "zza %g E %g kappa %d r %g: P %.15g rc raised %.15g,"
                      " Q %.15g rc raised %.15g", zs[iz], E, k, r[i], P[i],
                      P2[i], Q[i], Q2[i]);
            break;
          }
      }
  cr_log_info("largest delta change: grid doubled %.2e, rc raised %.2e",
              gmax, cmax);
  free(r); free(P); free(Q); free(P2); free(Q2); free(r2);
}


/* ==================================================================
** An independent integrator: classical fourth-order Runge-Kutta in long
** double with uniform steps (in ln r below r = 1, in r above), run with
** h and h/2 and Richardson-extrapolated ((16 y_{h/2} - y_h)/15), started
** from the Frobenius leading term at 1e-9 (point nucleus) or 1e-6 R
** (uniform sphere), or for large |kappa| at r_t 10^(-30/|kappa|)
** (r_t = |kappa|/p: 10^-60 under the barrier, so that the start's error is
** gone by the first check radius) but at most rc/2; matched at rc with GSL's spherical
** Bessel functions.  Every check radius, R and rc end a segment.
*/

typedef struct refp {
  const bl_pwpot *v;
  long double E, kappa, sa;
} refp;

static long double ref_V (const refp *q, long double r) {
  const bl_pwpot *v = q->v;
  long double s = 0.0L, R = v->R;
  int i;
  if (r >= R) {
    for (i = 0; i < v->n; i++)
      s += v->a[i] * expl(-v->c[i] * r);
    return v->zza * s / r;
  }
  /* phi_N - 1/r + sum a e^{-cr}/r, phi_N = (3 - r^2/R^2)/(2R) */
  for (i = 0; i < v->n; i++)
    s += v->a[i] * expm1l(-v->c[i] * r);
  return v->zza * ((s + (q->sa - 1.0L)) / r + (3.0L * R * R - r * r)
                   / (2.0L * R * R * R));
}

/* dy/dt with r = r(t): in ln r (logv) or r */
static void ref_f (const refp *q, long double t, int logv,
                   const long double y[2], long double f[2]) {
  long double r = logv ? expl(t) : t, V = ref_V(q, r);
  long double j = logv ? r : 1.0L;
  f[0] = j * (-q->kappa * y[0] / r + (q->E + 1.0L - V) * y[1]);
  f[1] = j * (q->kappa * y[1] / r - (q->E - 1.0L - V) * y[0]);
}

static void ref_seg (const refp *q, long double a, long double b, int logv,
                     long nst, long double y[2]) {
  long double t0 = logv ? logl(a) : a, t1 = logv ? logl(b) : b;
  long double h = (t1 - t0) / nst;
  long s;
  for (s = 0; s < nst; s++) {
    long double t = t0 + s * h, k1[2], k2[2], k3[2], k4[2], z[2];
    int c;
    ref_f(q, t, logv, y, k1);
    for (c = 0; c < 2; c++) z[c] = y[c] + 0.5L * h * k1[c];
    ref_f(q, t + 0.5L * h, logv, z, k2);
    for (c = 0; c < 2; c++) z[c] = y[c] + 0.5L * h * k2[c];
    ref_f(q, t + 0.5L * h, logv, z, k3);
    for (c = 0; c < 2; c++) z[c] = y[c] + h * k3[c];
    ref_f(q, t + h, logv, z, k4);
    for (c = 0; c < 2; c++)
      y[c] += h / 6.0L * (k1[c] + 2.0L * k2[c] + 2.0L * k3[c] + k4[c]);
  }
}

static int cmp_ld (const void *a, const void *b) {
  long double x = *(const long double *)a, y = *(const long double *)b;
  return x < y ? -1 : x > y;
}

/* raw (unnormalized) values at the stops st[0..ns-1], steps scaled by mul */
static void ref_run (const refp *q, long double r0, const long double *st,
                     int ns, int mul, const long double y0[2],
                     long double (*out)[2]) {
  long double y[2] = {y0[0], y0[1]}, a = r0;
  long double lam = fabsl(q->kappa) + q->E + 3.0L;
  long double kmax = q->E + 1.0L + 0.6L;
  int i;
  for (i = 0; i < ns; i++) {
    long double b = st[i];
    if (b > a) {
      if (b <= 1.0L) {
        long n = (long)ceill(logl(b / a) * lam / 0.02L) + 1;
        ref_seg(q, a, b, 1, n * mul, y);
      } else {
        long n = (long)ceill((b - a) * kmax / 0.02L) + 1;
        ref_seg(q, a, b, 0, n * mul, y);
      }
    }
    out[i][0] = y[0];
    out[i][1] = y[1];
    a = b;
  }
}

/* delta and P at rr[0..nr-1] (rr increasing, all < v->rc) */
/* (0, or -1 when GSL's Riccati-Bessel functions at rc overflow or the
** wave at rc is below double's range) */
static int reference (const bl_pwpot *v, double E, int kappa, int nr,
                      const double *rr, double *delta, double *Pr,
                      double *Qr) {
  refp q;
  long double st[64], (*o1)[2], (*o2)[2], y0[2], r0, z, g, k = kappa;
  double p = sqrt(E * E - 1.0), rc = v->rc, x = p * rc, phP, phQ, chP, chQ;
  long double NL;
  double Pm, Qm, wq = (E + 1.0) / p, sg = kappa < 0 ? -1 : 1;
  int ns = 0, i, l = lof(kappa), lb = lbarof(kappa);
  q.v = v;
  q.E = E;
  q.kappa = kappa;
  q.sa = 0.0L;
  for (i = 0; i < v->n; i++)
    q.sa += v->a[i];
  if (v->R > 0.0)
    r0 = 1e-6L * v->R;
  else
    r0 = 1e-9L;
  if (abs(kappa) >= 8) {
    long double rt = fabsl(k) / p * powl(10.0L, -60.0L / fabsl(k));
    if (rt > r0)
      r0 = rt;
    if (r0 > 0.5L * rc)
      r0 = 0.5L * rc;
  }
  z = v->zza * q.sa;
  if (v->R > 0.0 && r0 < v->R) {
    /* inside the sphere: V regular; leading term */
    y0[0] = kappa < 0 ? 1.0L : 0.0L;
    y0[1] = kappa < 0 ? 0.0L : 1.0L;
  } else {
    g = sqrtl(k * k - z * z);
    y0[0] = kappa < 0 ? g - k : z;
    y0[1] = kappa < 0 ? z : -(g + k);
  }
  for (i = 0; i < nr; i++)
    if (rr[i] > r0)
      st[ns++] = rr[i];
  if (v->R > r0 && v->R < rc)
    st[ns++] = v->R;
  if (r0 < 1.0L && rc > 1.0L)
    st[ns++] = 1.0L;
  st[ns++] = rc;
  qsort(st, ns, sizeof st[0], cmp_ld);
  o1 = malloc(ns * sizeof *o1);
  o2 = malloc(ns * sizeof *o2);
  cr_assert(o1 && o2);
  ref_run(&q, r0, st, ns, 1, y0, o1);
  ref_run(&q, r0, st, ns, 2, y0, o2);
  for (i = 0; i < ns; i++) {
    o2[i][0] = (16.0L * o2[i][0] - o1[i][0]) / 15.0L;
    o2[i][1] = (16.0L * o2[i][1] - o1[i][1]) / 15.0L;
  }
  Pm = (double)o2[ns - 1][0];
  Qm = (double)o2[ns - 1][1];
  /* the match: F = alpha phi + beta chi, Wronskian p/(E+1) */
  phP = rj(l, x);
  phQ = sg / wq * rj(lb, x);
  chP = ry(l, x);
  chQ = sg / wq * ry(lb, x);
  if (!isfinite(chP) || !isfinite(chQ) || !isfinite(Pm) || !isfinite(Qm)
      || (Pm == 0.0 && Qm == 0.0)) {
    free(o1);
    free(o2);
    return -1;
  }
  /* (in long double: the wave's raw size times w_l may pass 1e308) */
  {
    long double A = (o2[ns - 1][0] * chQ - o2[ns - 1][1] * chP) * wq;
    long double B = (phP * o2[ns - 1][1] - phQ * o2[ns - 1][0]) * wq;
    NL = sqrtl(A * A + B * B);
    *delta = (double)atanl(-B / A);
    if (A < 0.0L)
      NL = -NL;
  }
  for (i = 0; i < nr; i++) {
    int j;
    Pr[i] = Qr[i] = 0.0;
    for (j = 0; j < ns; j++)
      if (st[j] == (long double)rr[i]) {
        Pr[i] = (double)(o2[j][0] / NL);
        Qr[i] = (double)(o2[j][1] / NL);
      }
  }
  free(o1);
  free(o2);
  return 0;
}

static void against_reference (const bl_pwpot *v, const char *what) {
  const double Es[] = {1.02, 3.0, 20.0};
  const int ks[] = {-1, 1, -5, 20, -200};
  size_t ie, ik;
  double dmax = 0.0, pmax = 0.0;
  for (ie = 0; ie < 3; ie++)
    for (ik = 0; ik < sizeof ks / sizeof ks[0]; ik++) {
      enum { NR = 7 };
      double E = Es[ie], rr[NR], P[NR], Q[NR], Pr[NR], Qr[NR], d, dr;
      int k = ks[ik], i;
      for (i = 0; i < NR; i++)
        rr[i] = v->rc * pow(0.5, NR - 1 - i) * 0.999;
      cr_assert_eq(bl_pw_radial(v, E, k, NR, rr, P, Q, &d), BL_SUCCESS);
      if (reference(v, E, k, NR, rr, &dr, Pr, Qr) != 0) {
        /* the wave is far under its barrier up to rc: nothing to see */
        cr_expect(fabs(d) <= 1e-15, "%s E %g kappa %d: delta %g", what, E,
                  k, d);
        for (i = 0; i < NR; i++)
          cr_expect(fabs(P[i]) <= 1e-200, "%s E %g kappa %d r %g: P %g", what,
                    E, k, rr[i], P[i]);
        continue;
      }
      cr_expect(fabs(dphase(d, dr)) <= 1e-8, "%s E %g kappa %d: delta "
                "%.15g reference %.15g", what, E, k, d, dr);
      dmax = fmax(dmax, fabs(dphase(d, dr)));
      for (i = 0; i < NR; i++) {
        if (fabs(Pr[i]) > 1e-12)
          pmax = fmax(pmax, fabs(P[i] - Pr[i]) / fabs(Pr[i]));
        cr_expect(fabs(P[i] - Pr[i]) <= 1e-8 * fabs(Pr[i]) + 1e-20,
                  "%s E %g kappa %d r %g: P %.15g reference %.15g", what, E,
                  k, rr[i], P[i], Pr[i]);
        cr_expect(fabs(Q[i] - Qr[i]) <= 1e-8 * fabs(Qr[i]) + 1e-20,
                  "%s E %g kappa %d r %g: Q %.15g reference %.15g", what, E,
                  k, rr[i], Q[i], Qr[i]);
      }
    }
  cr_log_info("%s: largest |delta - reference| %.2e, |P/P_ref - 1| %.2e "
              "(|P_ref| > 1e-12)", what, dmax, pmax);
}

Test(pwradial, independent_au) {
  bl_pwpot v;
  au_pot(&v, -ZAU, 7.0, 1e-12);
  v.rc = fmin(v.rc, 60.0);    /* the same cut for both: a faster check */
  against_reference(&v, "Au e- TF R=7fm rc=60");
  au_pot(&v, ZAU, 7.0, 1e-12);
  v.rc = fmin(v.rc, 60.0);
  against_reference(&v, "Au e+ TF R=7fm rc=60");
}

Test(pwradial, independent_yukawa) {
  bl_pwpot v;
  yuk_pot(&v, -ZAU, 1.0, 1e-12);
  against_reference(&v, "Yukawa c=1 zza<0 point");
  yuk_pot(&v, ZAU, 1.0, 1e-12);
  against_reference(&v, "Yukawa c=1 zza>0 point");
  /* strong field: gamma(kappa = +-1) = 0.31, the start's admixture
  ** decays only like r^-0.62 */
  yuk_pot(&v, -0.95, 1.0, 1e-12);
  against_reference(&v, "Yukawa c=1 zza=-0.95 point");
}


/* ==================================================================
** First Born limit.  The Dirac variable-phase equation (derivation in
** DEVELOPERS.md, "Partial waves: radial functions") is
**   d' = -((E+1)/p) V [psi_P^2 + ((E-1)/(E+1)) psi_Q^2],
** psi the free form of internal.h with the running phase; to first order
** in V, d = -(1/p) int_0^inf V [(E+1) u_l^2 + (E-1) u_lbar^2] dr.  For
** V = zza sum a_i e^{-c_i r}/r the integrals are
**   int_0^inf e^{-c r} u_l(p r)^2 dr/r = Q_l(1 + c^2/(2 p^2))/2
** (Q_l the Legendre function of the second kind; the classic Born
** integral of a Yukawa potential, from memory, so it is checked here
** against a direct quadrature first).  zza = +-1e-4: ratio within 1e-3.
*/

typedef struct bornp { int l; double p, c; } bornp;
static double born_f (double r, void *par) {
  const bornp *b = par;
  double u = rj(b->l, b->p * r);
  return exp(-b->c * r) * u * u / r;
}

Test(pwradial, born_limit) {
  const double Es[] = {1.5, 3.0, 20.0};
  const int ks[] = {-1, 1, -5, 5, 20, -30};
  const double cs[] = {0.1, 1.0};
  size_t ie, ik, ic;
  int iz;
  /* the Q_l formula against quadrature */
  {
    gsl_integration_workspace *w = gsl_integration_workspace_alloc(2000);
    bornp b = {3, 2.0, 0.3};
    gsl_function F = {born_f, &b};
    double res, err;
    cr_assert(w != NULL);
    cr_assert_eq(gsl_integration_qag(&F, 0.0, 300.0, 0.0, 1e-11, 2000,
                                     GSL_INTEG_GAUSS61, w, &res, &err), 0);
    EXPECT_REL(res, 0.5 * gsl_sf_legendre_Ql(3, 1.0 + 0.09 / 8.0), 1e-9,
               "Born integral l=3 p=2 c=0.3 against Q_3");
    b.l = 0;
    cr_assert_eq(gsl_integration_qag(&F, 0.0, 300.0, 0.0, 1e-11, 2000,
                                     GSL_INTEG_GAUSS61, w, &res, &err), 0);
    EXPECT_REL(res, 0.5 * gsl_sf_legendre_Ql(0, 1.0 + 0.09 / 8.0), 1e-9,
               "Born integral l=0 p=2 c=0.3 against Q_0");
    gsl_integration_workspace_free(w);
  }
  for (iz = -1; iz <= 1; iz += 2)
    for (ic = 0; ic < 2; ic++)
      for (ie = 0; ie < 3; ie++)
        for (ik = 0; ik < sizeof ks / sizeof ks[0]; ik++) {
          bl_pwpot v;
          double E = Es[ie], p = sqrt(E * E - 1.0), c = cs[ic];
          double zza = iz * 1e-4, r = 1.0, P, Q, d, z = 1.0 + c * c / (2 * p * p);
          int k = ks[ik];
          double born = -(zza / p) * 0.5 * ((E + 1.0) * gsl_sf_legendre_Ql(lof(k), z)
                                            + (E - 1.0) * gsl_sf_legendre_Ql(lbarof(k), z));
          yuk_pot(&v, zza, c, 1e-16);
          cr_assert_eq(bl_pw_radial(&v, E, k, 1, &r, &P, &Q, &d), BL_SUCCESS);
          /* (a phase below 1e-9 is compared to 1e-12 absolute instead) */
          if (fabs(born) >= 1e-9)
            EXPECT_REL(d, born, 1e-3, "zza %g c %g E %g kappa %d: delta / "
                       "Born", zza, c, E, k);
          else
            cr_expect(fabs(d - born) <= 1e-12, "zza %g c %g E %g kappa %d: "
                      "delta %g Born %g", zza, c, E, k, d, born);
        }
}


/* ==================================================================
** Dirac-Coulomb phase differences.  For the point Coulomb field
** V = -Z alpha/r (Z alpha = -zza > 0 attracts) the phase of the regular
** solution relative to sin(x - l pi/2), apart from the common logarithm
** eta ln 2x, is (Rose 1961, "Relativistic Electron Theory", eq. for the
** Coulomb phase; from memory)
**   D_kappa = xi - arg Gamma(gamma + i eta) - pi gamma/2 + (l + 1) pi/2,
**   e^{2 i xi} = -(kappa - i Z alpha/p)/(gamma + i eta),
**   eta = Z alpha E/p, gamma = sqrt(kappa^2 - (Z alpha)^2).
** (It gives D = 0 mod pi at Z alpha = 0 for both signs of kappa, and
** |e^{2 i xi}| = 1: checked below.)  A repelling field (positrons) is
** the same with Z alpha -> -Z alpha.  A Yukawa field e^{-c r}/r of small
** c adds a kappa-independent phase plus terms of order c (the screening
** acts at r ~ 1/c >> l/p), so D_kappa - D_-1 of the screened field
** approaches the Coulomb one linearly in c; measured: off by 8.4e-5 at
** c = 2e-3 and 4.2e-5 at c = 1e-3 (kappa = 1).  Checks at E = 3 for
** |kappa| <= 3: c = 1e-3 within 1e-4, and the linear extrapolation
** 2 D(1e-3) - D(2e-3) within 1e-5 (measured 2e-7 .. 2.3e-6): the
** formula, recalled, is confirmed to about 1e-6.
*/
static double coulomb_phase (double za, double E, int kappa) {
  double p = sqrt(E * E - 1.0), eta = za * E / p, k = kappa;
  double g = sqrt(k * k - za * za);
  double complex e2xi = -(k - I * za / p) / (g + I * eta);
  gsl_sf_result lnr, arg;
  cr_assert(fabs(cabs(e2xi) - 1.0) < 1e-14, "|e^{2 i xi}| = %g", cabs(e2xi));
  gsl_sf_lngamma_complex_e(g, eta, &lnr, &arg);
  return 0.5 * carg(e2xi) - arg.val - 0.5 * BL_PI * g
         + (lof(kappa) + 1) * 0.5 * BL_PI;
}

Test(pwradial, coulomb_limit) {
  const int ks[] = {1, -2, 2, -3, 3};
  const double E = 3.0;
  size_t ik;
  int k, iz;
  for (k = -1; k <= 1; k += 2) {
    double z0 = coulomb_phase(1e-12, 2.0, k);
    cr_expect(fabs(dphase(z0, 0.0)) < 1e-10, "Coulomb phase at Z alpha -> 0"
              " kappa %d: %g", k, z0);
  }
  for (iz = -1; iz <= 1; iz += 2) {
    bl_pwpot v1, v2;
    double r = 1.0, P, Q, d1m, d2m, za = -iz * ZAU;
    yuk_pot(&v1, iz * ZAU, 2e-3, 1e-12);
    yuk_pot(&v2, iz * ZAU, 1e-3, 1e-12);
    cr_assert_eq(bl_pw_radial(&v1, E, -1, 1, &r, &P, &Q, &d1m), BL_SUCCESS);
    cr_assert_eq(bl_pw_radial(&v2, E, -1, 1, &r, &P, &Q, &d2m), BL_SUCCESS);
    for (ik = 0; ik < sizeof ks / sizeof ks[0]; ik++) {
      double d1, d2, want, x1, x2, xe;
      k = ks[ik];
      cr_assert_eq(bl_pw_radial(&v1, E, k, 1, &r, &P, &Q, &d1), BL_SUCCESS);
      cr_assert_eq(bl_pw_radial(&v2, E, k, 1, &r, &P, &Q, &d2), BL_SUCCESS);
      want = dphase(coulomb_phase(za, E, k), coulomb_phase(za, E, -1));
      x1 = dphase(d1, d1m);
      x2 = dphase(d2, d2m);
      xe = x2 + dphase(x2, x1);
      cr_log_info("zza %+.4f kappa %d: D_k - D_-1 screened c=2e-3 %.9f "
                  "c=1e-3 %.9f extrapolated %.9f Coulomb %.9f", iz * ZAU, k,
                  x1, x2, xe, want);
      cr_expect(fabs(dphase(x2, want)) <= 1e-4, "zza %g kappa %d: screened "
                "%.9f Coulomb %.9f", iz * ZAU, k, x2, want);
      cr_expect(fabs(dphase(xe, want)) <= 1e-5, "zza %g kappa %d: "
                "extrapolated %.9f Coulomb %.9f", iz * ZAU, k, xe, want);
    }
  }
}


/* ==================================================================
** Bad input: BL_EDOMAIN (BL_EMODEL for a bare Coulomb tail), a message
** naming the parameter, no crash.
*/
Test(pwradial, bad_input) {
  bl_pwpot v;
  bl_yukawa y = {1, {1.0}, {0.0}};
  double r[3] = {1.0, 2.0, 3.0}, P[3], Q[3], d, nan = NAN;
  char msg[256];
  au_pot(&v, -ZAU, 7.0, 1e-12);
  cr_expect_eq(bl_pw_radial(&v, 1.0, -1, 3, r, P, Q, &d), BL_EDOMAIN);
  cr_expect_eq(bl_pw_radial(&v, 0.5, -1, 3, r, P, Q, &d), BL_EDOMAIN);
  cr_expect_eq(bl_pw_radial(&v, nan, -1, 3, r, P, Q, &d), BL_EDOMAIN);
  cr_expect_eq(bl_pw_radial(&v, INFINITY, -1, 3, r, P, Q, &d), BL_EDOMAIN);
  cr_expect_eq(bl_pw_radial(&v, 3.0, 0, 3, r, P, Q, &d), BL_EDOMAIN);
  cr_expect_eq(bl_pw_radial(&v, 3.0, BL_PW_KAPPA_MAX + 1, 3, r, P, Q, &d),
               BL_EDOMAIN);
  cr_expect_eq(bl_pw_radial(&v, 3.0, -1, 0, r, P, Q, &d), BL_EDOMAIN);
  cr_expect_eq(bl_pw_radial(&v, 3.0, -1, -2, r, P, Q, &d), BL_EDOMAIN);
  cr_expect_eq(bl_pw_radial(NULL, 3.0, -1, 3, r, P, Q, &d), BL_EDOMAIN);
  cr_expect_eq(bl_pw_radial(&v, 3.0, -1, 3, NULL, P, Q, &d), BL_EDOMAIN);
  cr_expect_eq(bl_pw_radial(&v, 3.0, -1, 3, r, NULL, Q, &d), BL_EDOMAIN);
  cr_expect_eq(bl_pw_radial(&v, 3.0, -1, 3, r, P, NULL, &d), BL_EDOMAIN);
  cr_expect_eq(bl_pw_radial(&v, 3.0, -1, 3, r, P, Q, NULL), BL_EDOMAIN);
  r[1] = 1.0;
  cr_expect_eq(bl_pw_radial(&v, 3.0, -1, 3, r, P, Q, &d), BL_EDOMAIN);
  cr_expect_eq(bl_pw_radial_check(&v, 3.0, -1, 3, r, msg, sizeof msg),
               BL_EDOMAIN);
  cr_expect(strstr(msg, "r[1]") != NULL && strstr(msg, "increase") != NULL,
            "message: %s", msg);
  r[1] = nan;
  cr_expect_eq(bl_pw_radial(&v, 3.0, -1, 3, r, P, Q, &d), BL_EDOMAIN);
  r[1] = 2.0;
  r[0] = 0.0;
  cr_expect_eq(bl_pw_radial(&v, 3.0, -1, 3, r, P, Q, &d), BL_EDOMAIN);
  r[0] = 1.0;
  cr_expect_eq(bl_pw_radial_check(&v, 0.5, -1, 3, r, msg, sizeof msg),
               BL_EDOMAIN);
  cr_expect(strstr(msg, "E = 0.5") != NULL && strstr(msg, "(1, inf)")
            != NULL, "message: %s", msg);
  cr_expect_eq(bl_pw_radial_check(&v, 3.0, 0, 3, r, msg, sizeof msg),
               BL_EDOMAIN);
  cr_expect(strstr(msg, "kappa = 0") != NULL, "message: %s", msg);
  v.zza = nan;
  cr_expect_eq(bl_pw_radial(&v, 3.0, -1, 3, r, P, Q, &d), BL_EDOMAIN);
  au_pot(&v, -ZAU, 7.0, 1e-12);
  v.c[1] = -1.0;
  cr_expect_eq(bl_pw_radial(&v, 3.0, -1, 3, r, P, Q, &d), BL_EDOMAIN);
  au_pot(&v, -ZAU, 7.0, 1e-12);
  v.a[0] += 0.1;
  cr_expect_eq(bl_pw_radial(&v, 3.0, -1, 3, r, P, Q, &d), BL_EDOMAIN);
  au_pot(&v, -ZAU, 7.0, 1e-12);
  v.rc = 0.5 * v.R;
  cr_expect_eq(bl_pw_radial(&v, 3.0, -1, 3, r, P, Q, &d), BL_EDOMAIN);
  /* supercritical point nucleus at |kappa| = 1 */
  yuk_pot(&v, -1.2, 1.0, 1e-12);
  cr_expect_eq(bl_pw_radial_check(&v, 3.0, -1, 3, r, msg, sizeof msg),
               BL_EDOMAIN);
  cr_expect(strstr(msg, "kappa = -1") != NULL, "message: %s", msg);
  cr_expect_eq(bl_pw_radial(&v, 3.0, 2, 3, r, P, Q, &d), BL_SUCCESS);
  /* bl_pwpot_init */
  cr_expect_eq(bl_pwpot_init(&v, -ZAU, &y, ME, 0.0, 1e-12), BL_EMODEL);
  cr_expect_eq(bl_pwpot_check(-ZAU, &y, ME, 0.0, 1e-12, msg, sizeof msg),
               BL_EMODEL);
  cr_expect(strstr(msg, "b[0]") != NULL, "message: %s", msg);
  y.b[0] = 0.1;
  cr_expect_eq(bl_pwpot_init(NULL, -ZAU, &y, ME, 0.0, 1e-12), BL_EDOMAIN);
  cr_expect_eq(bl_pwpot_init(&v, -ZAU, NULL, ME, 0.0, 1e-12), BL_EDOMAIN);
  cr_expect_eq(bl_pwpot_init(&v, nan, &y, ME, 0.0, 1e-12), BL_EDOMAIN);
  cr_expect_eq(bl_pwpot_init(&v, -ZAU, &y, 0.0, 0.0, 1e-12), BL_EDOMAIN);
  cr_expect_eq(bl_pwpot_init(&v, -ZAU, &y, ME, -1.0, 1e-12), BL_EDOMAIN);
  cr_expect_eq(bl_pwpot_init(&v, -ZAU, &y, ME, 0.0, 0.0), BL_EDOMAIN);
  cr_expect_eq(bl_pwpot_init(&v, -ZAU, &y, ME, 0.0, 1.0), BL_EDOMAIN);
  cr_expect_eq(bl_pwpot_init(&v, -ZAU, &y, ME, 0.0, nan), BL_EDOMAIN);
  cr_expect_eq(bl_pwpot_check(-ZAU, &y, ME, 0.0, 2.0, msg, sizeof msg),
               BL_EDOMAIN);
  cr_expect(strstr(msg, "tol = 2") != NULL && strstr(msg, "(0, 1)") != NULL,
            "message: %s", msg);
  y.alpha[0] = 0.5;
  cr_expect_eq(bl_pwpot_init(&v, -ZAU, &y, ME, 0.0, 1e-12), BL_EDOMAIN);
  y.alpha[0] = 1.0;
  y.n = 0;
  cr_expect_eq(bl_pwpot_init(&v, -ZAU, &y, ME, 0.0, 1e-12), BL_EDOMAIN);
  y.n = BL_YUKAWA_MAX + 1;
  cr_expect_eq(bl_pwpot_init(&v, -ZAU, &y, ME, 0.0, 1e-12), BL_EDOMAIN);
}


/* ==================================================================
** The cut radius: tail(rc) = tol exactly (its rule, radial.c), rc >= R,
** rc scales like m for a muon (c_i = b_i/m), and the phase from beyond
** rc stays within the rule's bound.
*/
Test(pwradial, cut_radius) {
  bl_pwpot v, vm;
  double t, Ei;
  yuk_pot(&v, -ZAU, 0.05, 1e-10);
  /* |zza| E1(c rc) = tol */
  Ei = gsl_sf_expint_E1(0.05 * v.rc);
  EXPECT_REL(ZAU * Ei, 1e-10, 1e-8, "tail at rc");
  {
    const bl_model *mod = bl_model_find("thomas-fermi");
    double par[8];
    bl_yukawa y;
    bl_model_defaults(mod, par);
    mod->yukawa(79, par, &y);
    cr_assert_eq(bl_pwpot_init(&v, -ZAU, &y, ME, 7.0, 1e-12), 0);
    cr_assert_eq(bl_pwpot_init(&vm, -ZAU, &y, BL_MMU_MEV, 7.0, 1e-12), 0);
    t = vm.rc / v.rc;
    EXPECT_REL(t, BL_MMU_MEV / ME, 1e-9, "muon rc / electron rc");
    EXPECT_REL(vm.R, 7.0 * BL_MMU_MEV / BL_HBARC_MEVFM, 1e-14, "muon R");
  }
  /* the bound the rule promises (radial.c, bl_pwpot_init): the phase the
  ** potential beyond rc adds is at most (2E/p) tol; tol = 1e-7 against
  ** 1e-14, Au, both signs */
  {
    const double Es[] = {1.02, 3.0, 20.0};
    const int ks[] = {-1, 1, -5, 20};
    double r = 1.0, P, Q, worst = 0.0;
    size_t ie, ik;
    int iz;
    for (iz = -1; iz <= 1; iz += 2)
      for (ie = 0; ie < 3; ie++)
        for (ik = 0; ik < 4; ik++) {
          bl_pwpot v1, v2;
          double E = Es[ie], p = sqrt(E * E - 1.0), d1, d2, b;
          au_pot(&v1, iz * ZAU, 7.0, 1e-7);
          au_pot(&v2, iz * ZAU, 7.0, 1e-14);
          cr_assert_eq(bl_pw_radial(&v1, E, ks[ik], 1, &r, &P, &Q, &d1), 0);
          cr_assert_eq(bl_pw_radial(&v2, E, ks[ik], 1, &r, &P, &Q, &d2), 0);
          b = 2.0 * E / p * 1e-7;
          cr_expect(fabs(dphase(d1, d2)) <= b, "zza %g E %g kappa %d: phase "
                    "beyond rc %.3e > bound %.3e", iz * ZAU, E, ks[ik],
                    fabs(dphase(d1, d2)), b);
          worst = fmax(worst, fabs(dphase(d1, d2)) / b);
        }
    cr_log_info("phase beyond rc(tol = 1e-7): at most %.3f of (2E/p) tol",
                worst);
  }
}


/* ==================================================================
** Near the origin: for a point nucleus the regular solution is
** r^gamma (a0 + O(r)), (b0 + O(r)) with gamma = sqrt(kappa^2 - Z'^2),
** b0/a0 = Z'/(gamma - kappa) (Rose 1961, ch. 5, the Coulomb series; the
** leading terms follow from the equation of internal.h with V -> Z'/r).
** At r = 1e-6 and 2e-6 (r K ~ 1e-5): Q/P within 1e-4 of b0/a0 and
** P(2r)/P(r) within 1e-4 of 2^gamma.  Inside a uniform sphere (V(0) = V0)
** kappa < 0: Q/P = -(E - 1 - V0) r/(2|kappa| + 1), kappa > 0:
** P/Q = (E + 1 - V0) r/(2 kappa + 1) (the same equation, V regular),
** within 1e-3 at r = 1e-5 R.
*/
Test(pwradial, near_origin) {
  const int ks[] = {-1, 1, -2, 2, -5};
  size_t ik;
  for (ik = 0; ik < sizeof ks / sizeof ks[0]; ik++) {
    bl_pwpot v;
    int k = ks[ik];
    double r[2] = {1e-6, 2e-6}, P[2], Q[2], d, E = 3.0;
    double z = -ZAU, g = sqrt(k * k - z * z), ratio;
    yuk_pot(&v, z, 0.1, 1e-12);
    cr_assert_eq(bl_pw_radial(&v, E, k, 2, r, P, Q, &d), BL_SUCCESS);
    ratio = k < 0 ? Q[0] / P[0] : P[0] / Q[0];
    EXPECT_REL(ratio, k < 0 ? z / (g - k) : -z / (g + k), 1e-4,
               "point nucleus kappa %d: small component ratio at r = 1e-6",
               k);
    EXPECT_REL(P[1] / P[0], pow(2.0, g), 1e-4, "point nucleus kappa %d: "
               "P(2e-6)/P(1e-6) = 2^gamma", k);
    /* the first correction: V = Z'/r + V1 + O(r), V1 = -zza c here; at
    ** order r^gamma (g+1+kappa) a1 + Z' b1 = (E+1-V1) b0 and
    ** -Z' a1 + (g+1-kappa) b1 = -(E-1-V1) a0 (substituted into the
    ** equation of internal.h); at r = 1e-4 within 1e-6 (next order
    ** (r K)^2 ~ 2e-7) */
    {
      double a0 = k < 0 ? 1.0 : -z / (g + k), b0 = k < 0 ? z / (g - k) : 1.0;
      double V1 = -z * 0.1, D = 2.0 * g + 1.0, rr = 1e-4, a1, b1, Pr, Qr;
      a1 = ((E + 1.0 - V1) * b0 * (g + 1.0 - k) + z * (E - 1.0 - V1) * a0) / D;
      b1 = (-(g + 1.0 + k) * (E - 1.0 - V1) * a0 + z * (E + 1.0 - V1) * b0) / D;
      cr_assert_eq(bl_pw_radial(&v, E, k, 1, &rr, &Pr, &Qr, &d), BL_SUCCESS);
      EXPECT_REL(Qr / Pr, (b0 + b1 * rr) / (a0 + a1 * rr), 1e-6,
                 "point nucleus kappa %d: Q/P at r = 1e-4 with the first "
                 "correction", k);
    }
  }
  for (ik = 0; ik < sizeof ks / sizeof ks[0]; ik++) {
    bl_pwpot v;
    int k = ks[ik];
    double E = 3.0, r, P, Q, d, V0, want;
    au_pot(&v, -ZAU, 7.0, 1e-12);
    r = 1e-5 * v.R;
    V0 = v.zza * (1.5 / v.R - (v.a[0] * v.c[0] + v.a[1] * v.c[1]
                               + v.a[2] * v.c[2]));
    cr_assert_eq(bl_pw_radial(&v, E, k, 1, &r, &P, &Q, &d), BL_SUCCESS);
    want = k < 0 ? -(E - 1.0 - V0) * r / (1.0 - 2.0 * k)
                 : (E + 1.0 - V0) * r / (2.0 * k + 1.0);
    EXPECT_REL(k < 0 ? Q / P : P / Q, want, 1e-3, "uniform sphere kappa %d: "
               "small component ratio at r = 1e-5 R", k);
  }
}


/* ==================================================================
** High energy: without the mass terms the equation of internal.h,
** P' = -kappa P/r + (E - V) Q, Q' = kappa Q/r - (E - V) P, goes into
** itself under kappa -> -kappa, (P, Q) -> (Q, -P) (substitute), and
** l(-kappa) = lbar(kappa), so delta_kappa = delta_-kappa up to O(1/E).
** At E = 1e4 (Au, rc cut to 5 for speed, x up to 5e4; the start at
** r ~ 1e-11, where unscaled Taylor coefficients would overflow): within
** 1e-6 (measured 3.5e-9 at kappa = 1), finite P.
*/
Test(pwradial, high_energy_symmetry) {
  const int ks[] = {1, 7, 50};
  size_t ik;
  for (ik = 0; ik < sizeof ks / sizeof ks[0]; ik++) {
    bl_pwpot v;
    double r[3] = {1e-12, 1e-3, 4.0}, P[3], Q[3], d1, d2;
    int k = ks[ik], i;
    au_pot(&v, -ZAU, 7.0, 1e-12);
    v.rc = 5.0;
    cr_assert_eq(bl_pw_radial(&v, 1e4, k, 3, r, P, Q, &d1), BL_SUCCESS);
    for (i = 0; i < 3; i++)
      cr_expect(isfinite(P[i]) && isfinite(Q[i]));
    cr_assert_eq(bl_pw_radial(&v, 1e4, -k, 3, r, P, Q, &d2), BL_SUCCESS);
    cr_expect(fabs(dphase(d1, d2)) <= 1e-6, "E 1e4 kappa +-%d: delta %.12f "
              "%.12f", k, d1, d2);
  }
}


/* ==================================================================
** Beyond rc the solution is the free form of internal.h with the
** returned delta: P = cos d u_l - sin d w_l, Q = s p/(E+1) (cos d u_lbar
** - sin d w_lbar), here with GSL's Bessel functions.  radial.c fills
** those points either by its Riccati-Bessel recurrences or, when
** cheaper, by integrating the free equation on (kappa = -200, 500 with
** 400 points over 5 % of rc): both to 1e-11 absolute, plus a jump test
** (a point 1e-15 rc below rc against the one at rc: within 2e-11).
*/
Test(pwradial, beyond_rc) {
  const int ks[] = {-1, 3, -200, 500};
  size_t ik;
  enum { N = 401 };
  static double r[N], P[N], Q[N];
  for (ik = 0; ik < sizeof ks / sizeof ks[0]; ik++) {
    bl_pwpot v;
    double E = 3.0, p = sqrt(E * E - 1.0), d, cd, sd, sg;
    int k = ks[ik], l = lof(k), lb = lbarof(k), i;
    au_pot(&v, -ZAU, 7.0, 1e-12);
    r[0] = v.rc * (1.0 - 1e-15);    /* p (rc - r[0]) ~ 6e-12 */
    for (i = 1; i < N; i++)
      r[i] = v.rc * (1.0 + 0.05 * (i - 1.0) / (N - 2));
    cr_assert_eq(bl_pw_radial(&v, E, k, N, r, P, Q, &d), BL_SUCCESS);
    cd = cos(d);
    sd = sin(d);
    sg = k < 0 ? -1.0 : 1.0;
    cr_expect(fabs(P[0] - P[1]) <= 2e-11 && fabs(Q[0] - Q[1]) <= 2e-11,
              "kappa %d: P below rc %.15g, at rc %.15g; Q %.15g, %.15g", k,
              P[0], P[1], Q[0], Q[1]);
    for (i = 1; i < N; i++) {
      double x = p * r[i];
      double Pw = cd * rj(l, x) - sd * ry(l, x);
      double Qw = sg * p / (E + 1.0) * (cd * rj(lb, x) - sd * ry(lb, x));
      if (fabs(P[i] - Pw) > 1e-11 || fabs(Q[i] - Qw) > 1e-11) {
        cr_expect(0, "kappa %d r %.10g: P %.15g free form %.15g, Q %.15g "
                  "free form %.15g", k, r[i], P[i], Pw, Q[i], Qw);
        break;
      }
    }
  }
}


/* ==================================================================
** Health: 300 random cases (Thomas-Fermi, Hartree-Fock, exponential
** screening, Z = 1..98, electrons and muons, both charge signs and twice
** the charge, point or uniform nucleus, E - 1 = 1e-3..1e3, |kappa| =
** 1..2000, random grids reaching past rc; rc cut to at most 450 for
** speed): every call succeeds (or, for a point nucleus with
** |zza sum a| >= |kappa|, returns BL_EDOMAIN) with finite delta, P, Q
** and |P| <= 10 (the free u_l peaks at about 1.1 l^(1/6) near x = l).
*/
static double lcg (unsigned long long *s) {
  *s = *s * 6364136223846793005ULL + 1442695040888963407ULL;
  return (double)(*s >> 11) / 9007199254740992.0;
}

Test(pwradial, random_health) {
  const char *models[] = {"thomas-fermi", "hartree-fock", "exponential"};
  unsigned long long seed = 20261204ULL;
  enum { NMAX = 300 };
  static double r[NMAX], P[NMAX], Q[NMAX];
  int it;
  for (it = 0; it < 300; it++) {
    const bl_model *mod = bl_model_find(models[it % 3]);
    bl_yukawa y;
    bl_pwpot v;
    double par[8], m, zza, Rfm, E, d, rmax, s, sa;
    int Z = 1 + (int)(lcg(&seed) * 98), kappa, n, i, st;
    cr_assert(mod != NULL);
    bl_model_defaults(mod, par);
    cr_assert_eq(mod->yukawa(Z, par, &y), BL_SUCCESS);
    m = lcg(&seed) < 0.8 ? ME : BL_MMU_MEV;
    zza = (lcg(&seed) < 0.5 ? -1.0 : 1.0) * Z * BL_ALPHA
          * (lcg(&seed) < 0.2 ? 2.0 : 1.0);
    Rfm = lcg(&seed) < 0.3 ? 0.0 : 1.2 * pow(2.5 * Z, 1.0 / 3.0);
    cr_assert_eq(bl_pwpot_init(&v, zza, &y, m, Rfm,
                               pow(10.0, -6.0 - 8.0 * lcg(&seed))),
                 BL_SUCCESS);
    v.rc = fmax(v.R, fmin(v.rc, 300.0 * (0.5 + lcg(&seed))));
    E = 1.0 + pow(10.0, -3.0 + 6.0 * lcg(&seed));
    kappa = (lcg(&seed) < 0.5 ? -1 : 1) * (int)pow(10.0, 3.3 * lcg(&seed));
    n = 1 + (int)(lcg(&seed) * (NMAX - 1));
    rmax = v.rc * (0.1 + 3.0 * lcg(&seed));
    s = 1.0 + 3.0 * lcg(&seed);
    for (i = 0; i < n; i++)
      r[i] = rmax * pow((i + 1.0) / n, s);
    st = bl_pw_radial(&v, E, kappa, n, r, P, Q, &d);
    for (sa = 0.0, i = 0; i < y.n; i++)
      sa += y.alpha[i];
    if (v.R == 0.0 && fabs(zza * sa) >= abs(kappa)) {
      cr_expect_eq(st, BL_EDOMAIN, "case %d", it);
      continue;
    }
    cr_expect_eq(st, BL_SUCCESS, "case %d: %s Z %d m %g zza %g R %g rc %g "
                 "E %g kappa %d n %d", it, models[it % 3], Z, m, zza, v.R,
                 v.rc, E, kappa, n);
    if (st != BL_SUCCESS)
      continue;
    cr_expect(isfinite(d), "case %d: delta %g", it, d);
    for (i = 0; i < n; i++)
      if (!(isfinite(P[i]) && isfinite(Q[i]) && fabs(P[i]) <= 10.0)) {
        cr_expect(0, "case %d r %g: P %g Q %g", it, r[i], P[i], Q[i]);
        break;
      }
  }
}
