/*
** ebref.c -- independent references for electron-target bremsstrahlung
** (see ebref.h)
** See Copyright Notice in LICENSE
*/

#include <complex.h>
#include <math.h>
#include <string.h>

#include "ebref.h"

#define ALPHA (1.0 / 137.035999084)   /* CODATA 2018 */
#define PI 3.14159265358979323846

/* the trace route in long double (ebref_tr.h) */
typedef long double real;
typedef long double complex cld;
#define TR_CONJ conjl
#define TR_CREAL creall
#define TR_PI 3.141592653589793238462643383279502884L
#define TR_ALPHA (1.0L / 137.035999084L)
#define TR_MSQ trace_msq
#include "ebref_tr.h"

static double mdot (const double a[4], const double b[4]) {
  return a[0] * b[0] - a[1] * b[1] - a[2] * b[2] - a[3] * b[3];
}

double ebref_msq (int kind, double m, double z, int spin2,
                  const double p[5][4]) {
  real q[5][4];
  int i, j;
  for (i = 0; i < 5; i++)
    for (j = 0; j < 4; j++)
      q[i][j] = p[i][j];
  return (double) trace_msq(kind, m, z, spin2, (const real (*)[4])q);
}

/* ---- elastic closed forms ------------------------------------------- */

/* Moller, spin-summed |M|^2 / 4 with m_e = 1, e^4 included:
** 2 e^4 { [(s-2)^2 + (u-2)^2 + 4t] / t^2 + [(s-2)^2 + (t-2)^2 + 4u] / u^2
**         + 2 (s-2)(s-6) / (t u) } */
static double moller_m2 (double s, double t, double u) {
  double e4 = pow(4.0 * PI * ALPHA, 2);
  return 2.0 * e4 * (((s - 2) * (s - 2) + (u - 2) * (u - 2) + 4 * t) / (t * t)
                     + ((s - 2) * (s - 2) + (t - 2) * (t - 2) + 4 * u) / (u * u)
                     + 2.0 * (s - 2) * (s - 6) / (t * u));
}

double ebref_moller (double s, double t) {
  double u = 4.0 - s - t;
  return moller_m2(s, t, u) / (64.0 * PI * PI * s);
}

double ebref_bhabha (double s, double t) {
  double u = 4.0 - s - t;
  return moller_m2(u, t, s) / (64.0 * PI * PI * s);
}

/* (8 z^2 e^4 / t^2) [(p1.p2)(p3.p4) + (p1.p4)(p2.p3) - m^2 (p2.p4)
** - (p1.p3) + 2 m^2], the invariants p1.p2 = p3.p4 = (s - m^2 - 1)/2,
** p1.p4 = p2.p3 = (m^2 + 1 - u)/2, p1.p3 = m^2 - t/2, p2.p4 = 1 - t/2 */
double ebref_dirac (double m, double z, double s, double t) {
  double m2 = m * m, u = 2.0 * m2 + 2.0 - s - t, e4 = pow(4.0 * PI * ALPHA, 2);
  double a = 0.5 * (s - m2 - 1.0), b = 0.5 * (m2 + 1.0 - u);
  double v = 8.0 * z * z * e4 / (t * t)
             * (a * a + b * b - m2 * (1.0 - 0.5 * t) - (m2 - 0.5 * t)
                + 2.0 * m2);
  return v / (64.0 * PI * PI * s);
}

/* (2 z^2 e^4 / t^2) [2 (P.p2)(P.p4) - P^2 (p2.p4 - 1)], P = p1 + p3:
** P.p2 = P.p4 = (s - m^2 - 1) + (t - ... ) written from p1.p2 + p3.p2 */
double ebref_scalar (double m, double z, double s, double t) {
  double m2 = m * m, u = 2.0 * m2 + 2.0 - s - t, e4 = pow(4.0 * PI * ALPHA, 2);
  double p12 = 0.5 * (s - m2 - 1.0), p32 = 0.5 * (m2 + 1.0 - u);
  double Pp2 = p12 + p32;          /* P.p4 = p1.p4 + p3.p4 = the same */
  double P2 = 4.0 * m2 - t;
  double v = 2.0 * z * z * e4 / (t * t) * (2.0 * Pp2 * Pp2 + P2 * 0.5 * t);
  return v / (64.0 * PI * PI * s);
}

double ebref_soft (double z, const double p[5][4]) {
  static const double eta[4] = {-1, -1, 1, 1};
  double Q[4], J[4] = {0, 0, 0, 0};
  int i, mu;
  Q[0] = z; Q[1] = -1; Q[2] = z; Q[3] = -1;
  for (i = 0; i < 4; i++) {
    double pk = mdot(p[i], p[4]);
    for (mu = 0; mu < 4; mu++)
      J[mu] += eta[i] * Q[i] * p[i][mu] / pk;
  }
  return -mdot(J, J);
}
