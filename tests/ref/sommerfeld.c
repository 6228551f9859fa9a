/*
** sommerfeld.c -- Sommerfeld's exact non-relativistic dsigma/dk and the
** complex Gauss hypergeometric function; for the tests only
** See Copyright Notice in LICENSE
**
** See sommerfeld.h for the contracts and the sources.
**
** The formula (Sommerfeld 1931; as quoted by Koch & Motz 1959 near formula
** 3BN(a), and by Berestetskii, Lifshitz & Pitaevskii, section 92), written
** there for an electron with momenta in m_e c and energies in m_e c^2:
**
**   k dsigma/dk = (16/3) Z^2 alpha r_e^2 (1/p0^2) pi^2 [x d|F|^2/dx]
**                 / [(e^(2 pi nu0) - 1)(1 - e^(-2 pi nu))],
**   F(x) = 2F1(i nu0, i nu; 1; x),  x = -4 p0 p/(p0 - p)^2 < 0,
**   x dF/dx = x (i nu0)(i nu) 2F1(1 + i nu0, 1 + i nu; 2; x),
**   nu0 = Z alpha/beta0, nu = Z alpha/beta (attracted; both change sign for
**   a repelled projectile).
**
** Mass m and charge z (derived, not assumed).  With hbar = c = m = 1 the
** Schroedinger equation of the projectile is (p^2/2 + zZ alpha/r) psi =
** E psi and its dipole coupling to the photon is z e p (so z^2 alpha in the
** rate): the only parameters are zZ alpha (in the wave functions: through
** nu0 = -zZ alpha/beta0, nu = -zZ alpha/beta) and z^2 alpha (the emission).
** The electron formula is, in units of (hbar/m_e c)^2 per m_e c^2,
** alpha (Z alpha)^2 (16/3) g(nu0, nu) ln(..)/(k p0^2) with the Gaunt factor
** g a function of nu0 and nu alone; the general projectile therefore gives
** z^2 alpha (zZ alpha)^2 (16/3) g ln(..)/(k p0^2) in units of (hbar/m c)^2
** per m c^2, i.e. Z^2 alpha r_e^2 -> z^4 Z^2 alpha r0^2, r0 = alpha hbar/(m c)
** (r_e -> z^2 r0 with the photon coupling absorbed), momenta in m c, k in
** m c^2 and dsigma/dk per MeV = (per m c^2)/(m c^2 in MeV).  Checked by the
** zZ alpha -> 0 limit (test_corrections.c, suite sommerfeld: the ratio to
** z^4 x 3BN(a) of a fractional charge z is 1 to 1e-6) and against the
** library's Born cross section, which scales as z^4 Z^2 alpha r0^2 on its
** own (a muon at the electron's velocity gives the electron's ratio).
**
** Evaluation.  Pfaff's transformation (AS 15.3.4) with w = x/(x - 1) =
** 4 p0 p/(p0 + p)^2 in [0, 1) and 1 - w = ((p0 - p)/(p0 + p))^2 gives
**   F   = (1 - x)^(-i nu0) G,   G = 2F1(i nu0, 1 - i nu; 1; w),
**   x F1 = -w (1 - x)^(-i nu0) H,   H = 2F1(1 + i nu0, 1 - i nu; 2; w),
** so (|(1 - x)^(-i nu0)| = 1)
**   x d|F|^2/dx = 2 Re[F* x dF/dx] = 2 nu0 nu w Re[G* H]:
** nothing of the phase is needed and 1 - w is taken from p0 - p without
** cancellation.  Each 2F1 on [0, 1): som_hyp2f1_unit (the header says how).
*/
#include <math.h>
#include <complex.h>

#include <gsl/gsl_errno.h>
#include <gsl/gsl_sf_gamma.h>

#include "sommerfeld.h"

#define SOM_PI     3.14159265358979323846
/* CODATA 2018: alpha, hbar c (MeV fm), m_e c^2 (MeV); 1 mb = 0.1 fm^2 */
#define SOM_ALPHA  (1.0 / 137.035999084)
#define SOM_HBARC  197.3269804
#define SOM_FM2_MB 10.0

#define SOM_EPS    1e-17     /* series end: terms below this of the sum */
#define SOM_COND   16.0      /* largest cancellation accepted in one step */
#define SOM_NUMAX  100.0     /* e^(2 pi nu0) stays finite up to here */


/*
** Maclaurin series: t_n = (a)_n (b)_n/((c)_n n!) x^n, and the derivative
** terms u_n = (n + 1) t_(n+1)/x = t_n (a + n)(b + n)/(c + n).  The series
** ends when the next terms are below SOM_EPS of the sums and the term ratio
** is below 0.9 (the tail is then at most 10 times the last term).
*/
double som_hyp2f1_maclaurin (double complex a, double complex b,
                             double complex c, double x,
                             double complex *f, double complex *df) {
  double complex t = 1.0, s = 1.0, ds = 0.0;
  double tmax = 1.0, umax = 0.0;
  int n;
  if (!(fabs(x) < 1.0))
    return -1.0;
  for (n = 0; n < 100000; n++) {
    double complex r = (a + n) * (b + n) / (c + n);
    double complex u = t * r, tn = u * x / (n + 1);
    double au = cabs(u), at = cabs(tn);
    ds += u;
    s += tn;
    if (au > umax) umax = au;
    if (at > tmax) tmax = at;
    t = tn;
    if (n >= 1 && at <= SOM_EPS * cabs(s) && au <= SOM_EPS * cabs(ds)
        && cabs(r) * fabs(x) / (n + 1) < 0.9) {
      double sc = cabs(s) + cabs(ds * x);
      *f = s;
      *df = ds;
      if (sc == 0.0)
        return -1.0;
      return fmax(tmax, umax * fabs(x)) / sc;
    }
    if (x == 0.0 && n >= 1) {
      *f = s;
      *df = ds;
      return 1.0;
    }
  }
  return -1.0;
}


/*
** One Taylor step of the hypergeometric equation (AS 15.5.1)
**   w (1 - w) F'' + [c - (a + b + 1) w] F' - a b F = 0
** from s (us = 1 - s) with F, F' to s + h.  With F = sum c_n (w - s)^n and
** e_n = c_n h^n:
**   e_(n+2) = [(n + a)(n + b) h^2 e_n
**              - (n + 1) ((1 - 2s) n + c - (a + b + 1) s) h e_(n+1)]
**             / (s (1 - s) (n + 1)(n + 2)),
** F(s + h) = sum e_n, h F'(s + h) = sum n e_n.  Converges for
** h < min(s, 1 - s); returns the cancellation ratio (max term over
** |F| + |h F'|), or -1 if the series does not end.
*/
static double taylor_step (double complex a, double complex b,
                           double complex c, double s, double us, double h,
                           double complex F, double complex dF,
                           double complex *Fn, double complex *dFn) {
  double A = s * us, B1 = us - s;
  double complex C0 = c - (a + b + 1.0) * s;
  double complex e0 = F, e1 = dF * h, sum = e0 + e1, dsum = e1;
  double emax = fmax(cabs(e0), cabs(e1));
  int n;
  for (n = 0; n < 5000; n++) {
    double complex e2 = ((n + a) * (b + n) * (h * h) * e0
                         - (n + 1.0) * (B1 * n + C0) * h * e1)
                        / (A * (n + 1.0) * (n + 2.0));
    double ae2 = cabs(e2) * (n + 2);
    sum += e2;
    dsum += (n + 2.0) * e2;
    if (ae2 > emax) emax = ae2;
    if (n >= 2 && ae2 <= SOM_EPS * (cabs(sum) + cabs(dsum))
        && cabs(e1) * (n + 1) <= SOM_EPS * (cabs(sum) + cabs(dsum))) {
      double sc = cabs(sum) + cabs(dsum);
      if (sc == 0.0 || !isfinite(sc))
        return -1.0;
      *Fn = sum;
      *dFn = dsum / h;
      return emax / sc;
    }
    e0 = e1;
    e1 = e2;
  }
  return -1.0;
}


int som_hyp2f1_unit (double complex a, double complex b, double complex c,
                     double w, double omw, double complex *f,
                     double complex *df) {
  double complex F, dF;
  double ws, s, us, hprev = INFINITY;
  int i, steps;
  if (!(w >= 0.0 && w < 1.0 && omw > 0.0 && omw <= 1.0))
    return -1;
  /* starting point: the Maclaurin series where it does not cancel */
  ws = fmin(w, 0.5);
  for (i = 0; ; i++) {
    double cond = som_hyp2f1_maclaurin(a, b, c, ws, &F, &dF);
    if (cond < 0.0)
      return -1;
    if (cond <= SOM_COND || i >= 200)
      break;
    ws *= 0.5;
  }
  s = ws;
  us = 1.0 - ws;
  for (steps = 0; ; steps++) {
    /* distance left, from the side where it keeps its digits */
    double rem = (w <= 0.5) ? w - s : us - omw, h;
    double complex Fn = 0.0, dFn = 0.0;
    if (!(rem > 0.0))
      break;
    if (steps > 1000000)
      return -1;
    h = fmin(rem, fmin(0.5 * fmin(s, us), 2.0 * hprev));
    for (i = 0; i < 200; i++) {
      double cond = taylor_step(a, b, c, s, us, h, F, dF, &Fn, &dFn);
      if (cond >= 0.0 && cond <= SOM_COND)
        break;
      h *= 0.5;
    }
    if (i == 200)
      return -1;
    F = Fn;
    dF = dFn;
    hprev = h;
    if (h == rem) {
      s = w;
      us = omw;
    } else {
      s += h;
      us -= h;
    }
  }
  *f = F;
  *df = dF;
  return (isfinite(creal(F)) && isfinite(cimag(F))) ? 0 : -1;
}


/* Pfaff (AS 15.3.4) with w, 1 - w and ln(1 - x) given. */
static int pfaff (double complex a, double complex b, double complex c,
                  double w, double omw, double l1mx, double complex *f) {
  double complex G, dG;
  if (som_hyp2f1_unit(a, c - b, c, w, omw, &G, &dG) != 0)
    return -1;
  *f = cexp(-a * l1mx) * G;
  return 0;
}


int som_hyp2f1_neg (double complex a, double complex b, double complex c,
                    double x, double complex *f) {
  if (!(x <= 0.0))
    return -1;
  if (isinf(x))
    return -1;
  return pfaff(a, b, c, -x / (1.0 - x), 1.0 / (1.0 - x), log1p(-x), f);
}


/* ln Gamma(z) for complex z from GSL; -1 at a pole */
static int lngamma (double complex z, double complex *lg) {
  gsl_sf_result lnr, arg;
  if (gsl_sf_lngamma_complex_e(creal(z), cimag(z), &lnr, &arg) != GSL_SUCCESS)
    return -1;
  *lg = lnr.val + I * arg.val;
  return 0;
}


/*
** AS 15.3.6:
**   F(a,b;c;w) = G(c)G(c-a-b)/(G(c-a)G(c-b)) F(a, b; a+b-c+1; 1-w)
**     + (1-w)^(c-a-b) G(c)G(a+b-c)/(G(a)G(b)) F(c-a, c-b; c-a-b+1; 1-w).
*/
double som_hyp2f1_conn (double complex a, double complex b,
                        double complex c, double w, double omw,
                        double complex *f) {
  double complex g[7], F1, F2, d, t1, t2;
  double c1, c2;
  if (!(w > 0.0 && w < 1.0 && omw > 0.0 && omw < 1.0))
    return -1.0;
  if (lngamma(c, &g[0]) || lngamma(c - a - b, &g[1]) || lngamma(c - a, &g[2])
      || lngamma(c - b, &g[3]) || lngamma(a + b - c, &g[4])
      || lngamma(a, &g[5]) || lngamma(b, &g[6]))
    return -1.0;
  c1 = som_hyp2f1_maclaurin(a, b, a + b - c + 1.0, omw, &F1, &d);
  c2 = som_hyp2f1_maclaurin(c - a, c - b, c - a - b + 1.0, omw, &F2, &d);
  if (c1 < 0.0 || c2 < 0.0)
    return -1.0;
  t1 = cexp(g[0] + g[1] - g[2] - g[3]) * F1;
  t2 = cexp((c - a - b) * log(omw) + g[0] + g[4] - g[5] - g[6]) * F2;
  *f = t1 + t2;
  if (cabs(*f) == 0.0)
    return -1.0;
  return fmax(c1, c2) * (cabs(t1) + cabs(t2)) / cabs(*f);
}


int som_F (double nu0, double nu, double x, double complex *f) {
  return som_hyp2f1_neg(I * nu0, I * nu, 1.0, x, f);
}


int som_F1 (double nu0, double nu, double x, double complex *f) {
  return som_hyp2f1_neg(1.0 + I * nu0, 1.0 + I * nu, 2.0, x, f);
}


/* ---- kinematics and the cross section ----------------------------------- */

typedef struct {
  double p0, p, dp, sp;    /* momenta (units m c), p0 - p, p0 + p */
  double k;                /* photon energy, units m c^2 */
  double nu0, nu;          /* -zZ alpha/beta0, -zZ alpha/beta */
  double pref;             /* (16/3) z^4 Z^2 alpha r0^2 / (m c^2), mb/MeV */
} som_kin;


/* p0 - p without cancellation: p0^2 - p^2 = k (t0 + t + 2) (relativistic)
** or 2 k (non-relativistic), over p0 + p. */
static int kin (double z, double Z, double m, double T, double k, int conv,
                som_kin *s) {
  double t0, t, b0, b, za, r0;
  if (!(m > 0.0 && T > 0.0 && k > 0.0 && k < T && Z > 0.0 && z != 0.0
        && isfinite(z) && isfinite(Z) && isfinite(m) && isfinite(T))
      || (conv != SOM_P_REL && conv != SOM_P_NR))
    return -1;
  t0 = T / m;
  t = (T - k) / m;
  s->k = k / m;
  if (conv == SOM_P_REL) {
    s->p0 = sqrt(t0 * (t0 + 2.0));
    s->p = sqrt(t * (t + 2.0));
    b0 = s->p0 / (1.0 + t0);
    b = s->p / (1.0 + t);
    s->sp = s->p0 + s->p;
    s->dp = s->k * (t0 + t + 2.0) / s->sp;
  } else {
    s->p0 = sqrt(2.0 * t0);
    s->p = sqrt(2.0 * t);
    b0 = s->p0;
    b = s->p;
    s->sp = s->p0 + s->p;
    s->dp = 2.0 * s->k / s->sp;
  }
  if (!(s->p > 0.0))
    return -1;
  za = -z * Z * SOM_ALPHA;
  s->nu0 = za / b0;
  s->nu = za / b;
  r0 = SOM_ALPHA * SOM_HBARC / m;    /* fm */
  s->pref = 16.0 / 3.0 * pow(z, 4) * Z * Z * SOM_ALPHA * r0 * r0 * SOM_FM2_MB
            / m;
  return 0;
}


int som_nu (double z, double Z, double m_mev, double t_mev, double k_mev,
            int conv, double *nu0, double *nu) {
  som_kin s;
  if (kin(z, Z, m_mev, t_mev, k_mev, conv, &s) != 0)
    return -1;
  *nu0 = s.nu0;
  *nu = s.nu;
  return 0;
}


/* ln|e^y - 1| without overflow */
static double lexpm1 (double y) {
  return (y > 0.0) ? y + log(-expm1(-y)) : log(-expm1(y));
}


double som_born_nr (double z, double Z, double m_mev, double t_mev,
                    double k_mev, int conv) {
  som_kin s;
  if (kin(z, Z, m_mev, t_mev, k_mev, conv, &s) != 0)
    return NAN;
  /* ln((p0 + p)/(p0 - p)) */
  return s.pref / (s.k * s.p0 * s.p0) * log(s.sp / s.dp);
}


double som_dsdk_conv (double z, double Z, double m_mev, double t_mev,
                      double k_mev, int conv) {
  som_kin s;
  double complex a, b, G, H, d;
  double w, omw, X, lD, r;
  if (kin(z, Z, m_mev, t_mev, k_mev, conv, &s) != 0)
    return NAN;
  if (!(fabs(s.nu0) <= SOM_NUMAX) || !isfinite(s.nu))
    return NAN;
  w = 4.0 * s.p0 * s.p / (s.sp * s.sp);
  r = s.dp / s.sp;
  omw = r * r;
  a = I * s.nu0;
  b = I * s.nu;
  if (som_hyp2f1_unit(a, 1.0 - b, 1.0, w, omw, &G, &d) != 0
      || som_hyp2f1_unit(1.0 + a, 1.0 - b, 2.0, w, omw, &H, &d) != 0)
    return NAN;
  /* x d|F|^2/dx = 2 nu0 nu w Re[G* H] */
  X = 2.0 * s.nu0 * s.nu * w * creal(conj(G) * H);
  /* ln of (e^(2 pi nu0) - 1)(1 - e^(-2 pi nu)); both factors have the
  ** sign of nu0 (= the sign of nu), so the product is positive */
  lD = lexpm1(2.0 * SOM_PI * s.nu0) + lexpm1(-2.0 * SOM_PI * s.nu);
  return s.pref / (s.k * s.p0 * s.p0) * SOM_PI * SOM_PI * X * exp(-lD);
}


double som_dsdk (double z, double Z, double m_mev, double t_mev,
                 double k_mev) {
  return som_dsdk_conv(z, Z, m_mev, t_mev, k_mev, SOM_P_REL);
}


double som_kramers (double z, double Z, double m_mev, double t_mev,
                    double k_mev, int conv) {
  som_kin s;
  if (kin(z, Z, m_mev, t_mev, k_mev, conv, &s) != 0)
    return NAN;
  return s.pref / (s.k * s.p0 * s.p0) * SOM_PI / sqrt(3.0);
}


double som_gaunt (double z, double Z, double m_mev, double t_mev,
                  double k_mev, int conv) {
  return som_dsdk_conv(z, Z, m_mev, t_mev, k_mev, conv)
         / som_kramers(z, Z, m_mev, t_mev, k_mev, conv);
}
