/*
** ebquad.c -- the trace route of ebref.c in __float128, with its own
** kinematics (see ebquad.h); tests only
** See Copyright Notice in LICENSE
**
** Why: at high energy the gauge cancellations of the amplitudes at small
** momentum transfers need the final momenta to conserve four-momentum to
** far better than double rounding.  Here the point is built from its
** parameters and the traces are taken in quadruple precision (113-bit
** mantissa, GCC's and clang's software __float128; no libquadmath: the
** square root is Newton's), so the reference keeps ~ 30 digits where the
** double evaluation keeps fewer.
*/

#include <complex.h>
#include <math.h>
#include <string.h>

#include "ebquad.h"

typedef __float128 real;
#ifdef __clang__
typedef _Complex __float128 cld;
#else
typedef _Complex float __attribute__((mode(TC))) cld;
#endif

static cld qconj (cld z) {
  return __real__ z - I * __imag__ z;
}

#define TR_CONJ qconj
#define TR_CREAL __real__
/* pi as the sum of its double and the double of the remainder */
#define TR_PI ((real) 3.141592653589793 + (real) 1.2246467991473532e-16)
#define TR_ALPHA ((real)1 / ((real)137 + (real)35999084 / (real)1e9))
#define TR_MSQ quad_msq
#include "ebref_tr.h"

/* sqrt by Newton's iteration from the double estimate (two steps give
** the full 113 bits) */
static real qsqrt (real x) {
  real y;
  int i;
  if (!(x > 0))
    return 0;
  y = sqrt((double) x);
  for (i = 0; i < 3; i++)
    y = 0.5 * (y + x / y);
  return y;
}

int ebquad_point (int kind, double m, double z, int spin2, double t0,
                  double k, double hk, double hs, double hs2, double phi,
                  int frame,
                  double *msq, double mom[5][4]) {
  real M = m, e0, p0, ck, sk, P[4], Pn, W2, W, ps, e3s, e4s, ez[3], ex[3];
  real ey[3], n[3], ss, cz, kv[4], p[5][4], g, gb, dz, cf, sf, nx;
  int i, j;
  e0 = (real) t0 + M;
  p0 = qsqrt((real) t0 * ((real) t0 + 2 * M));
  ck = 1 - (real) hk;
  sk = qsqrt((real) hk * (2 - (real) hk));
  kv[0] = k; kv[1] = (real) k * sk; kv[2] = 0; kv[3] = (real) k * ck;
  P[0] = e0 + 1 - kv[0];
  P[1] = -kv[1];
  P[2] = 0;
  P[3] = p0 - kv[3];
  Pn = qsqrt(P[1] * P[1] + P[3] * P[3]);
  W2 = (P[0] - Pn) * (P[0] + Pn);
  if (!(W2 > (M + 1) * (M + 1)))
    return -1;
  W = qsqrt(W2);
  ps = qsqrt((W2 - (M + 1) * (M + 1)) * (W2 - (M - 1) * (M - 1))) / (2 * W);
  e3s = (W2 + M * M - 1) / (2 * W);
  e4s = (W2 - M * M + 1) / (2 * W);
  ez[0] = P[1] / Pn; ez[1] = 0; ez[2] = P[3] / Pn;
  /* ex: the part of the photon direction across ez, towards the photon */
  dz = sk * ez[0] + ck * ez[2];
  ex[0] = sk - dz * ez[0]; ex[1] = 0; ex[2] = ck - dz * ez[2];
  nx = qsqrt(ex[0] * ex[0] + ex[2] * ex[2]);
  if (nx > 0) {
    ex[0] /= nx; ex[2] /= nx;
  } else {
    ex[0] = ez[2]; ex[2] = -ez[0];
  }
  ey[0] = ez[1] * ex[2] - ez[2] * ex[1];
  ey[1] = ez[2] * ex[0] - ez[0] * ex[2];
  ey[2] = ez[0] * ex[1] - ez[1] * ex[0];
  /* cos theta_s = 1 - hs near the pole hs = 0, hs2 - 1 near hs = 2 */
  cz = hs <= 1.0 ? 1 - (real) hs : (real) hs2 - 1;
  ss = qsqrt((1 - cz) * (1 + cz));
  cf = cos(phi); sf = sin(phi);
  /* cos and sin of phi in double, as the core takes them: the direction
  ** is a unit vector to 1e-16, the same test point for both */
  for (i = 0; i < 3; i++)
    n[i] = ss * (cf * ex[i] + sf * ey[i]) + cz * ez[i];
  g = P[0] / W;
  gb = Pn / W;
  memset(p, 0, sizeof p);
  p[0][0] = e0; p[0][3] = p0;
  p[1][0] = 1;
  for (i = 0; i < 4; i++)
    p[4][i] = kv[i];
  if (frame == 0) {
    /* the pair's momenta boosted to the lab along ez */
    real nz = n[0] * ez[0] + n[1] * ez[1] + n[2] * ez[2];
    real v3 = ps * nz, v4 = -ps * nz;
    p[2][0] = g * e3s + gb * v3;
    p[3][0] = g * e4s + gb * v4;
    for (i = 0; i < 3; i++) {
      p[2][i + 1] = ps * n[i] + ((g - 1) * v3 + gb * e3s) * ez[i];
      p[3][i + 1] = -ps * n[i] + ((g - 1) * v4 + gb * e4s) * ez[i];
    }
  } else {
    /* every momentum boosted into the pair frame */
    real in[3][4], *src[3];
    src[0] = p[0]; src[1] = p[1]; src[2] = p[4];
    for (j = 0; j < 3; j++) {
      real vz = src[j][1] * ez[0] + src[j][2] * ez[1] + src[j][3] * ez[2];
      in[j][0] = g * src[j][0] - gb * vz;
      for (i = 0; i < 3; i++)
        in[j][i + 1] = src[j][i + 1] + ((g - 1) * vz - gb * src[j][0]) * ez[i];
    }
    for (i = 0; i < 4; i++) {
      p[0][i] = in[0][i];
      p[1][i] = in[1][i];
      p[4][i] = in[2][i];
    }
    p[2][0] = e3s; p[3][0] = e4s;
    for (i = 0; i < 3; i++) {
      p[2][i + 1] = ps * n[i];
      p[3][i + 1] = -ps * n[i];
    }
  }
  if (mom != NULL)
    for (i = 0; i < 5; i++)
      for (j = 0; j < 4; j++)
        mom[i][j] = (double) p[i][j];
  *msq = (double) quad_msq(kind, M, (real) z, spin2, (const real (*)[4])p);
  return 0;
}
