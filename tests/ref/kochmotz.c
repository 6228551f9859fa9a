/*
** kochmotz.c -- closed-form reference cross sections for the tests only
** See Copyright Notice in LICENSE
**
** Transcribed from the papers' notation (see kochmotz.h for the units:
** energies in m c^2, results per Z^2 alpha r0^2 per unit k in m c^2).
** Koch & Motz write the prefactor as Z^2 r0^2 / 137; we take 1/137 = alpha.
*/
#include <math.h>

#include "kochmotz.h"

#define KM_PI 3.14159265358979323846


/*
** h(p) = (2 asinh(p) - 2 p sqrt(1 + p^2)) / p^3, i.e. (eps - 2 E p)/p^3
** with eps = ln((E+p)/(E-p)) = 2 asinh(p).  Both terms of the numerator are
** ~2p for small p and cancel to -4p^3/3; below p = 0.5 use the series
**   2 asinh p - 2 p sqrt(1+p^2) = -4 int_0^p s^2 (1+s^2)^(-1/2) ds
**                                = -4 sum_n binom(-1/2, n) p^(2n+3)/(2n+3).
** Above 0.5 the direct form loses at most a factor ~10.
*/
static double hfun (double p, double E) {
  if (p < 0.5) {
    double x = p * p, c = 1.0, xn = 1.0, s = 0.0;
    int n;
    for (n = 0; n < 80; n++) {
      double term = c * xn / (2 * n + 3);
      s += term;
      if (fabs(term) < 1e-18 * fabs(s)) break;
      c *= -(2.0 * n + 1) / (2.0 * n + 2);   /* binom(-1/2, n+1) */
      xn *= x;
    }
    return -4.0 * s;
  }
  return (2.0 * asinh(p) - 2.0 * p * E) / (p * p * p);
}


/*
** Koch & Motz (1959) formula 3BN (Bethe-Heitler 1934, Born approximation,
** unscreened point nucleus, arbitrary energies):
**
**  dsigma_k = (Z^2 r0^2/137) (dk/k) (p/p0) { 4/3 - 2 E0 E (p^2+p0^2)/(p^2 p0^2)
**     + eps0 E/p0^3 + eps E0/p^3 - eps eps0/(p0 p)
**     + L [ 8 E0 E/(3 p0 p) + k^2 (E0^2 E^2 + p0^2 p^2)/(p0^3 p^3)
**           + k/(2 p0 p) ( eps0 (E0 E + p0^2)/p0^3 - eps (E0 E + p^2)/p^3
**                          + 2 k E0 E/(p^2 p0^2) ) ] }
**
**  L = 2 ln[(E0 E + p0 p - 1)/k],  eps0 = ln[(E0+p0)/(E0-p0)],
**  eps = ln[(E+p)/(E-p)].
**
** Cancellation-aware evaluation (algebraically identical):
**  - p = sqrt(t (t+2)) from the kinetic energy t;
**  - eps = 2 asinh(p), since (E+p)/(E-p) = (E+p)^2;
**  - E0 E + p0 p - 1 = t0 + t + t0 t + p0 p;
**  - the pairs  -2 E0 E/p0^2 + eps0 E/p0^3 = E h(p0)  and
**    -2 E0 E/p^2 + eps E0/p^3 = E0 h(p), with h above (these cancel to
**    O(1) from O(1/p^2) in the non-relativistic limit).
*/
double km_3bn (double t0, double k) {
  double t = t0 - k;
  double E0 = 1.0 + t0, E = 1.0 + t;
  double p0 = sqrt(t0 * (t0 + 2.0)), p = sqrt(t * (t + 2.0));
  double eps0 = 2.0 * asinh(p0), eps = 2.0 * asinh(p);
  double L = 2.0 * log((t0 + t + t0 * t + p0 * p) / k);
  double p03 = p0 * p0 * p0, p3 = p * p * p;
  double EE = E0 * E;
  double br, lb;
  br = 4.0 / 3.0 + E * hfun(p0, E0) + E0 * hfun(p, E) - eps * eps0 / (p0 * p);
  lb = 8.0 * EE / (3.0 * p0 * p)
     + k * k * (EE * EE + p0 * p0 * p * p) / (p03 * p3)
     + k / (2.0 * p0 * p) * (eps0 * (EE + p0 * p0) / p03
                             - eps * (EE + p * p) / p3
                             + 2.0 * k * EE / (p * p * p0 * p0));
  return (p / p0) / k * (br + L * lb);
}


/*
** Koch & Motz (1959) formula 3BN(a), non-relativistic limit of 3BN:
**   dsigma_k = (16/3) (Z^2 r0^2/137) (dk/k) (1/p0^2) ln[(p0 + p)/(p0 - p)]
** with ln[(p0+p)/(p0-p)] = 2 atanh(p/p0).
*/
double km_3bn_nr (double t0, double k) {
  double t = t0 - k;
  double p0 = sqrt(t0 * (t0 + 2.0)), p = sqrt(t * (t + 2.0));
  return 16.0 / 3.0 / k / (p0 * p0) * 2.0 * atanh(p / p0);
}


/*
** Koch & Motz (1959) formula 3BN(b), extreme-relativistic limit of 3BN
** (no screening):
**   dsigma_k = 4 (Z^2 r0^2/137) (dk/k) [1 + (E/E0)^2 - (2/3)(E/E0)]
**              [ln(2 E0 E/k) - 1/2]
*/
double km_3bn_er (double t0, double k) {
  double E0 = 1.0 + t0, E = 1.0 + t0 - k, v = E / E0;
  return 4.0 / k * (1.0 + v * v - 2.0 / 3.0 * v)
         * (log(2.0 * E0 * E / k) - 0.5);
}


/*
** The second bracket of 3BS(e):
**   f(b) = (2/b^2) ln(1+b^2) + 4 (2-b^2)/(3 b^3) atan(b) - 8/(3 b^2) + 2/9.
** Its terms are O(1/b^2) and cancel to f = -b^2/45 + O(b^4) as b -> 0.  For
** b < 0.5 use the series in x = b^2 obtained from ln(1+x)/x and atan(b)/b:
**   f = sum_{m>=1} (-1)^m [2/(m+1) - (4/3)(2/(2m+3) + 1/(2m+1))] x^m.
*/
static double schiff_f (double b) {
  if (b < 0.5) {
    double x = b * b, xm = x, s = 0.0;
    int m;
    for (m = 1; m < 80; m++) {
      double c = 2.0 / (m + 1) - 4.0 / 3.0 * (2.0 / (2 * m + 3) + 1.0 / (2 * m + 1));
      double term = ((m & 1) ? -c : c) * xm;
      s += term;
      if (fabs(term) < 1e-18 * fabs(s)) break;
      xm *= x;
    }
    return s;
  }
  return 2.0 / (b * b) * log1p(b * b)
         + 4.0 * (2.0 - b * b) / (3.0 * b * b * b) * atan(b)
         - 8.0 / (3.0 * b * b) + 2.0 / 9.0;
}


/*
** Koch & Motz (1959) formula 3BS(e) = Schiff (1951), exponential screening
** V ~ (Z e/r) exp(-r/a), high-energy small-angle Born approximation:
**
**  dsigma_k = (2 Z^2 r0^2/137) (dk/k) {
**     (1 + (E/E0)^2 - (2/3)(E/E0)) [ln M(0) + 1 - (2/b) atan b]
**   + (E/E0) [ (2/b^2) ln(1+b^2) + 4 (2-b^2)/(3 b^3) atan b - 8/(3 b^2) + 2/9 ] }
**
**  b = 2 E0 E Z^(1/3)/(111 k),  1/M(0) = (k/(2 E0 E))^2 + (Z^(1/3)/111)^2.
**
** Here the screening radius is a parameter: 111 Z^(-1/3) -> a (units of
** hbar/(m c)), so b = 2 E0 E/(k a) and 1/M(0) = (k/(2 E0 E))^2 (1 + b^2),
** i.e. ln M(0) = 2 ln(2 E0 E/k) - log1p(b^2).
**
** Note on the transcription: the term printed in the brief as "-8/3" must be
** -8/(3 b^2).  Only then does the bracket vanish as b -> 0 (no screening),
** which turns the formula into 3BN(b), and tend to 2/9 for b -> infinity,
** which gives the familiar complete-screening form
** 4 {(1 + v^2 - 2v/3) ln(183 Z^(-1/3)) + v/9}  (ln 111 + 1/2 = ln 183).
** Both limits are checked in tests/test_born.c (suite refs).
*/
double km_3bse (double t0, double k, double a) {
  double E0 = 1.0 + t0, E = 1.0 + t0 - k, v = E / E0;
  double r = 2.0 * E0 * E / k;
  double b = isinf(a) ? 0.0 : r / a;
  double lnM = 2.0 * log(r) - log1p(b * b);
  double atb = (b > 0.0) ? atan(b) / b : 1.0;   /* atan(b)/b */
  double t1 = (1.0 + v * v - 2.0 / 3.0 * v) * (lnM + 1.0 - 2.0 * atb);
  double t2 = v * schiff_f(b);
  return 2.0 / k * (t1 + t2);
}


/*
** Schiff's screening radius a = 111 Z^(-1/3) hbar/(m_e c) in units of
** hbar/(m c): the atomic length is fixed, the unit shrinks by m_e/m.
*/
double km_schiff_radius (int Z, double m_over_me) {
  return 111.0 * pow((double) Z, -1.0 / 3.0) * m_over_me;
}


/* Three-vector helpers for km_low. */
static double dot3 (const double *a, const double *b) {
  return a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
}


/*
** Low (1958) soft-photon theorem, first Born approximation in both the
** elastic and the radiative process, summed over photon polarisations:
**
**   d3sigma/(dk dOmega_k dOmega_p) -> dsigma_el/dOmega_p
**        * (alpha/(4 pi^2 k)) | p_perp/(E - p cos th) - p0_perp/(E0 - p0 cos th0) |^2
**
** (perp: components orthogonal to the photon direction; th, th0: angles of
** p, p0 with the photon).  Elastic Born cross sections (hbar = c = m = 1,
** so alpha^2 -> r0^2 in units of (hbar/mc)^2):
**   spin 0 (Rutherford, Klein-Gordon):   4 Z^2 alpha^2 E^2 / q^4
**   spin 1/2 (Mott):                      Z^2 alpha^2 (4 E^2 - q^2) / q^4
** Divided by Z^2 alpha r0^2 this gives the value returned:
**   el * |w|^2 / (4 pi^2 k),  el = 4E^2/q^4 or (4E^2 - q^2)/q^4.
** In mb/(MeV sr^2): multiply by z^4 Z^2 alpha r0^2[mb] / m[MeV] (the 1/k of
** the formula carries the per-unit-energy dimension).
**
** E - p cos th = 1/(E + p) + 2 p sin^2(th/2) (no cancellation at small
** angles); sin^2(th/2) = |p_hat - k_hat|^2 / 4.
*/
double km_low (double spin, double t0, double k, double theta_k,
               double theta_p, double phi) {
  double t = t0 - k;
  double E0 = 1.0 + t0, E = 1.0 + t;
  double p0 = sqrt(t0 * (t0 + 2.0)), p = sqrt(t * (t + 2.0));
  double kh[3] = { sin(theta_k), 0.0, cos(theta_k) };
  double ph[3] = { sin(theta_p) * cos(phi), sin(theta_p) * sin(phi),
                   cos(theta_p) };
  double zh[3] = { 0.0, 0.0, 1.0 };
  double d[3], q[3], w[3];
  double s2k = sin(0.5 * theta_k), s2, den, den0, cpk, q2, el;
  int i;
  /* photon angle from the beam: th0 = theta_k */
  den0 = 1.0 / (E0 + p0) + 2.0 * p0 * s2k * s2k;
  for (i = 0; i < 3; i++) d[i] = ph[i] - kh[i];
  s2 = 0.25 * dot3(d, d);
  den = 1.0 / (E + p) + 2.0 * p * s2;
  cpk = dot3(ph, kh);
  for (i = 0; i < 3; i++) {
    double pperp = p * (ph[i] - cpk * kh[i]);
    double p0perp = p0 * (zh[i] - kh[2] * kh[i]);
    w[i] = pperp / den - p0perp / den0;
    q[i] = p0 * zh[i] - p * ph[i] - k * kh[i];
  }
  q2 = dot3(q, q);
  if (spin == 0.0)
    el = 4.0 * E0 * E0 / (q2 * q2);
  else
    el = (4.0 * E0 * E0 - q2) / (q2 * q2);
  return el * dot3(w, w) / (4.0 * KM_PI * KM_PI * k);
}
