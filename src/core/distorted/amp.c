/*
** amp.c -- the polarisation- and spin-summed Sommerfeld-Maue matrix
** element: the bracket B of the distorted-wave cross section
** See Copyright Notice in LICENSE
**
** The projectile (charge z, mass 1) in the point Coulomb field of charge
** Z is described by Sommerfeld-Maue (Furry) wave functions: for spin 1/2
**   psi = N e^{i p.r} [1 - (i / 2E) alpha.grad] F(i eta, 1, i(p r - p.r)) u
** (Sommerfeld & Maue 1935; Furry 1934), the initial one with outgoing,
** the final one with incoming spherical waves; for spin 0 the same
** without the operator in brackets (the Klein-Gordon equation with the
** V^2 term dropped, the order the Dirac case drops: DEVELOPERS.md,
** "Distorted waves").  eta = zeta E / p, zeta = -z Z alpha (> 0 when
** attracted), N = e^{pi eta/2} Gamma(1 - i eta).  Every integral of the
** matrix element follows from Nordsieck's integral (Nordsieck 1954)
**   I = int d^3r e^{-lambda r}/r e^{i q.r} F(a,1,i(k1 r - k1.r))
**                                          F(b,1,i(k2 r - k2.r))
**     = 2 pi alpha^{a+b-1} (alpha - beta)^{-a} (alpha - gamma)^{-b} V(x),
**   alpha = (q^2 + lambda^2)/2, beta = q.k1 + i lambda k1,
**   gamma = q.k2 + i lambda k2, delta = k1.k2 - k1 k2,
**   x = (beta gamma - alpha delta) / ((alpha - beta)(alpha - gamma)),
** with k1 = p0, a = i eta0, k2 = -p, b = i eta, q = p0 - p - k:
**   J0 = int e^{iq.r} F1 F2      = -dI/dlambda
**   J1 = int e^{iq.r} F2 grad F1 = -k1 grad_k1 I   (grad F1 = -(k1/r) dF1/dk1)
**   J2 = int e^{iq.r} F1 grad F2 = -k2 grad_k2 I,
** all at lambda -> 0, where alpha - beta = -k (E - p cos theta) and
** alpha - gamma = k (E0 - p0 cos theta0): the propagators of the Born
** amplitude.  Then, with S = p0 p_vec + p p0_vec and I = P V,
**   J0 = -i P (p0 Db + p Dg),  J1 = P (-p0 Db q + Dd S),
**   J2 = P (-p Dg q - Dd S),   (J1 + J2 = -i q J0),
**   Db = a V/(alpha-beta) + V' alpha (gamma-delta)/((alpha-beta)^2 (alpha-gamma)),
**   Dg = b V/(alpha-gamma) + V' alpha (beta-delta)/((alpha-beta)(alpha-gamma)^2),
**   Dd = -V' alpha / ((alpha-beta)(alpha-gamma)).
** P is a common factor of modulus e^{-pi eta0} / alpha: it drops out of
** the bracket but for |P|^2.  The amplitudes:
**   spin 0:    eps.A,  A = 2 (p0_vec J0 - i J1)
**   spin 1/2:  u_f^+ O u_0,  O = (alpha.eps) J0 + (i/2E)(alpha.J2)(alpha.eps)
**                               - (i/2E0)(alpha.eps)(alpha.J1),
** the terms second order in the correction operator dropped, as in
** Elwert & Haug (1969).  Summed over the photon's polarisations and the
** spins and scaled so that the first Born approximation is the bracket
** of src/core/born/kin.c (checked, tests/test_distorted.c), with
** S(eta) = 2 pi eta / (1 - e^{-2 pi eta}) (Sommerfeld factor):
**   B = (k/zeta)^2 S(eta0) S(eta) e^{2pi(|eta0| - eta0)} |V-part|^2
** (the last factor undoes the scaling of V, see hyp.c).
*/

#include <math.h>

#include "distorted/internal.h"


/* ln of 2 pi eta / (1 - exp(-2 pi eta)), either sign, no overflow. */
static double ln_sommerfeld (double eta) {
  double a = 2.0 * BL_PI * fabs(eta);
  if (a == 0.0)
    return 0.0;
  if (eta > 0.0)
    return log(a) - log(-expm1(-a));
  return log(a) - a - log(-expm1(-a));
}


double bl_dw_lnscale (const bl_kin *kn, double zeta) {
  double eta0 = zeta * kn->E0 / kn->p0, eta = zeta * kn->E / kn->p;
  return 2.0 * log(kn->k / fabs(zeta)) + ln_sommerfeld(eta0)
         + ln_sommerfeld(eta) + 2.0 * BL_PI * (fabs(eta0) - eta0);
}


/*
** The spin sum of the Dirac amplitude u_f^+ O u_0 for one photon
** polarisation.  O = [[A, C], [C, A]] in 2x2 blocks (A from the correction
** operators, C = J0 sigma.eps) and the spin projectors
** M = [[E + 1, sigma.p], [sigma.p, E - 1]]; the block rotation
** (tau_x + tau_z)/sqrt 2, which keeps the trace, makes O block-diagonal,
** diag(A + C, A - C), and M = [[E + sigma.p, 1], [1, E - sigma.p]]:
**
**   Tr[O M0 O^+ Mf] = Tr[P L0 P^+ L] + Tr[N R0 N^+ R] + 2 Re Tr[P N^+],
**
** P = A + C, N = A - C, L = E + sigma.p, R = E - sigma.p (and L0, R0).
** With A = s + sigma.v and C = sigma.c the last term is
** 4 (|s|^2 + |v|^2 - |c|^2).  (The 4x4 product of 2x2 blocks it replaces
** cost ten times as much: tests/test_distorted.c checks the bracket
** against the Born one and Sommerfeld's formula.)
*/

/* Tr[P L0 P^+ L] for P = s + sigma.w, L0 = e0 + sg sigma.p0 with
** p0_y = 0 (real: the initial momentum lies in the x-z plane) and
** L = e + sg sigma.p. */
static double side_trace (double complex s, const double complex w[3],
                          double e0, const double p0[3], double e,
                          const double p[3], double sg) {
  double complex P11 = s + w[2], P12 = w[0] - I * w[1];
  double complex P21 = w[0] + I * w[1], P22 = s - w[2];
  double a0 = e0 + sg * p0[2], d0 = e0 - sg * p0[2], b0 = sg * p0[0];
  double a = e + sg * p[2], d = e - sg * p[2];
  double complex be = sg * (p[0] - I * p[1]);
  /* X = P L0, then the Hermitian Y = X P^+ */
  double complex X11 = P11 * a0 + P12 * b0, X12 = P11 * b0 + P12 * d0;
  double complex X21 = P21 * a0 + P22 * b0, X22 = P21 * b0 + P22 * d0;
  double y11 = creal(X11 * conj(P11) + X12 * conj(P12));
  double y22 = creal(X21 * conj(P21) + X22 * conj(P22));
  double complex Y21 = X21 * conj(P11) + X22 * conj(P12);
  return y11 * a + y22 * d + 2.0 * creal(Y21 * be);
}


static double cabs2 (double complex z) {
  return creal(z) * creal(z) + cimag(z) * cimag(z);
}


/* The sum over both linear polarisations (x, y) of the spin-summed
** |u_f^+ O u_0|^2, O = (alpha.eps) J0 + (i/2E)(alpha.J2)(alpha.eps)
** - (i/2E0)(alpha.eps)(alpha.J1). */
static double dirac_sum (const bl_kin *kn, double complex j0,
                         const double complex j1[3],
                         const double complex j2[3], const double P0[3],
                         const double P[3]) {
  double h = 0.5 / kn->E, h0 = 0.5 / kn->E0, sum = 0.0;
  int e;
  for (e = 0; e < 2; e++) {
    /* (sigma.a)(sigma.b) = a.b + i sigma.(a x b); eps = x or y:
    ** A = s + sigma.v, s = i (J2.eps h - J1.eps h0),
    ** v = -(J2 x eps) h + (eps x J1) h0 */
    double complex s, v[3], wp[3], wm[3];
    int i;
    if (e == 0) {
      s = I * (j2[0] * h - j1[0] * h0);
      v[0] = 0.0;
      v[1] = -j2[2] * h - j1[2] * h0;
      v[2] = j2[1] * h + j1[1] * h0;
    }
    else {
      s = I * (j2[1] * h - j1[1] * h0);
      v[0] = j2[2] * h + j1[2] * h0;
      v[1] = 0.0;
      v[2] = -j2[0] * h - j1[0] * h0;
    }
    for (i = 0; i < 3; i++)
      wp[i] = wm[i] = v[i];
    wp[e] += j0;
    wm[e] -= j0;
    sum += side_trace(s, wp, kn->E0, P0, kn->E, P, 1.0)
           + side_trace(s, wm, kn->E0, P0, kn->E, P, -1.0)
           + 4.0 * (cabs2(s) + cabs2(v[0]) + cabs2(v[1]) + cabs2(v[2])
                    - cabs2(j0));
  }
  return sum;
}


/* The vectors of one geometry in the photon frame (k along z), q and the
** invariants of Nordsieck's integral at lambda = 0. */
typedef struct geom {
  double P0[3], P[3], q[3], q2, al, amb, amg, omx;
} geom;

static void geom_set (const bl_kin *kn, const bl_polar *g, double v,
                      geom *o) {
  double p0 = kn->p0, p = kn->p, k = kn->k;
  double cphi = 1.0 - v, sphi = sqrt(fmax(v * (2.0 - v), 0.0));
  o->P0[0] = p0 * g->s0;  o->P0[1] = 0.0;  o->P0[2] = p0 * (1.0 - g->h0);
  o->P[0] = p * g->s * cphi;  o->P[1] = p * g->s * sphi;
  o->P[2] = p * (1.0 - g->h);
  if (g->ridge) {  /* measured from the ridge (as in born/kin.c) */
    o->q[2] = g->qzs + p * g->dh;
    o->q[0] = -p * g->dh * (2.0 - g->h - g->hs) / (g->s + g->ss)
              + p * g->s * v;
  }
  else {
    o->q[2] = kn->delta - p0 * g->h0 + p * g->h;
    o->q[0] = (o->P0[0] - p * g->s) + p * g->s * v;
  }
  o->q[1] = -o->P[1];
  o->q2 = o->q[0] * o->q[0] + o->q[1] * o->q[1] + o->q[2] * o->q[2];
  o->al = 0.5 * o->q2;
  o->amb = -k * p * (g->h + kn->hc);          /* alpha - beta < 0 */
  o->amg = k * p0 * (g->h0 + kn->hc0);        /* alpha - gamma > 0 */
  /* 1 - x = alpha (alpha - beta - gamma + delta)/((alpha-beta)(alpha-gamma))
  ** with alpha - beta - gamma + delta = -(p0 + p - k)(p0 + p + k)/2 */
  o->omx = o->q2 * (kn->delta + 2.0 * p) * (p0 + p + k)
           / (-4.0 * o->amb * o->amg);
}


double bl_dw_u (const bl_kin *kn, const bl_polar *g, double v, double *q2) {
  geom o;
  geom_set(kn, g, v, &o);
  *q2 = o.q2;
  return log(o.omx);
}


/* The same vectors as geom_set, the parts that do not depend on phi. */
void bl_dw_polar_set (const bl_dwk *d, const bl_polar *g, bl_dwpolar *o) {
  const bl_kin *kn = &d->kn;
  double p0 = kn->p0, p = kn->p, k = kn->k, amb, amg, gmd, bmd;
  o->P0x = p0 * g->s0;
  o->P0z = p0 * (1.0 - g->h0);
  o->ps = p * g->s;
  o->Pz = p * (1.0 - g->h);
  if (g->ridge) {  /* measured from the ridge (as in born/kin.c) */
    o->qz = g->qzs + p * g->dh;
    o->qx0 = -p * g->dh * (2.0 - g->h - g->hs) / (g->s + g->ss);
  }
  else {
    o->qz = kn->delta - p0 * g->h0 + p * g->h;
    o->qx0 = o->P0x - o->ps;
  }
  amb = -k * p * (g->h + kn->hc);          /* alpha - beta < 0 */
  amg = k * p0 * (g->h0 + kn->hc0);        /* alpha - gamma > 0 */
  gmd = p * (p + k * (1.0 - g->h) + p0);   /* gamma - delta */
  bmd = p0 * (p0 + p - k * (1.0 - g->h0)); /* beta - delta */
  /* 1 - x = alpha (alpha - beta - gamma + delta)/((alpha-beta)(alpha-gamma))
  ** with alpha - beta - gamma + delta = -(p0 + p - k)(p0 + p + k)/2 */
  o->omxc = (kn->delta + 2.0 * p) * (p0 + p + k) / (-4.0 * amb * amg);
  /* Db = i cb1 V + cb2 alpha V', Dg = i cg1 V + cg2 alpha V',
  ** Dd = cd alpha V' (amp.c's head) */
  o->cb1 = cimag(d->hyp.a) / amb;   /* a = i eta0, b = i eta */
  o->cg1 = cimag(d->hyp.b) / amg;
  o->cb2 = gmd / (amb * amb * amg);
  o->cg2 = bmd / (amb * amg * amg);
  o->cd = -1.0 / (amb * amg);
}


int bl_dw_bracket_at (const bl_dwk *d, const bl_dwpolar *o, double v,
                      double sphi, double *B, double *q2out) {
  const bl_kin *kn = &d->kn;
  double p0 = kn->p0, p = kn->p;
  double P0[3], P[3], q[3], Sv[3], q2, al, omx;
  double complex V, Vx, Db, Dg, Dd, j0, j1[3], j2[3];
  int i;
  P0[0] = o->P0x;  P0[1] = 0.0;  P0[2] = o->P0z;
  P[0] = o->ps * (1.0 - v);  P[1] = o->ps * sphi;  P[2] = o->Pz;
  q[0] = o->qx0 + o->ps * v;  q[1] = -P[1];  q[2] = o->qz;
  q2 = q[0] * q[0] + q[1] * q[1] + q[2] * q[2];
  *q2out = q2;
  al = 0.5 * q2;
  omx = q2 * o->omxc;
  if (bl_dwhyp_eval(&d->hyp, 1.0 - omx, log(omx), &V, &Vx) != 0)
    return BL_EDOMAIN;
  Db = o->cb1 * (I * V) + (o->cb2 * al) * Vx;
  Dg = o->cg1 * (I * V) + (o->cg2 * al) * Vx;
  Dd = (o->cd * al) * Vx;
  for (i = 0; i < 3; i++)
    Sv[i] = p0 * P[i] + p * P0[i];
  j0 = -I * (p0 * Db + p * Dg);
  for (i = 0; i < 3; i++) {
    j1[i] = -p0 * Db * q[i] + Dd * Sv[i];
    j2[i] = -p * Dg * q[i] - Dd * Sv[i];
  }
  if (kn->spin < 0.25) {  /* A = 2 (p0_vec J0 - i J1), x and y components */
    double complex Ax = 2.0 * (P0[0] * j0 - I * j1[0]);
    double complex Ay = 2.0 * (P0[1] * j0 - I * j1[1]);
    *B = creal(Ax * conj(Ax) + Ay * conj(Ay));
  }
  else
    *B = 0.5 * dirac_sum(kn, j0, j1, j2, P0, P);
  *B *= d->scale;
  return isfinite(*B) ? BL_SUCCESS : BL_ENONFINITE;
}


int bl_dw_bracket (const bl_dwk *d, const bl_polar *g, double v,
                   double *B, double *q2out) {
  bl_dwpolar o;
  bl_dw_polar_set(d, g, &o);
  return bl_dw_bracket_at(d, &o, v, sqrt(fmax(v * (2.0 - v), 0.0)), B,
                          q2out);
}
