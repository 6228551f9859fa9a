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


/* 2x2 complex matrices, row-major.  (Fields are assigned one by one:
** gcc's analyzer misreads complex values in aggregate initialisers.) */
typedef struct m2 { double complex a, b, c, d; } m2;

static m2 mset (double complex a, double complex b, double complex c,
                double complex d) {
  m2 r;
  r.a = a;
  r.b = b;
  r.c = c;
  r.d = d;
  return r;
}

static m2 mmul (m2 x, m2 y) {
  return mset(x.a * y.a + x.b * y.c, x.a * y.b + x.b * y.d,
              x.c * y.a + x.d * y.c, x.c * y.b + x.d * y.d);
}

static m2 madd (m2 x, m2 y) {
  return mset(x.a + y.a, x.b + y.b, x.c + y.c, x.d + y.d);
}

static m2 mscale (m2 x, double complex s) {
  return mset(s * x.a, s * x.b, s * x.c, s * x.d);
}

static m2 mdag (m2 x) {
  return mset(conj(x.a), conj(x.c), conj(x.b), conj(x.d));
}

static double complex mtr (m2 x) { return x.a + x.d; }

/* sigma.v for a complex 3-vector */
static m2 sdot (double complex x, double complex y, double complex z) {
  return mset(z, x - I * y, x + I * y, -z);
}

/*
** Tr[O M0 O^+ Mf] for O = [[Ev, Od], [Od, Ev]] (blocks of 2x2) and
** M = [[E+1, s.p], [s.p, E-1]]: the spin sum of the Dirac amplitude.
*/
static double dirac_trace (m2 Ev, m2 Od, double E0, m2 sp0, double E, m2 sp) {
  /* X = O M0 (the diagonal blocks of M0 are multiples of 1) */
  m2 X00 = madd(mscale(Ev, E0 + 1.0), mmul(Od, sp0));
  m2 X01 = madd(mmul(Ev, sp0), mscale(Od, E0 - 1.0));
  m2 X10 = madd(mscale(Od, E0 + 1.0), mmul(Ev, sp0));
  m2 X11 = madd(mmul(Od, sp0), mscale(Ev, E0 - 1.0));
  /* Y = O^+ Mf */
  m2 Evd = mdag(Ev), Odd = mdag(Od);
  m2 Y00 = madd(mscale(Evd, E + 1.0), mmul(Odd, sp));
  m2 Y01 = madd(mmul(Evd, sp), mscale(Odd, E - 1.0));
  m2 Y10 = madd(mscale(Odd, E + 1.0), mmul(Evd, sp));
  m2 Y11 = madd(mmul(Odd, sp), mscale(Evd, E - 1.0));
  return creal(mtr(mmul(X00, Y00)) + mtr(mmul(X01, Y10))
               + mtr(mmul(X10, Y01)) + mtr(mmul(X11, Y11)));
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


int bl_dw_bracket (const bl_dwk *d, const bl_polar *g, double v,
                   double *B, double *q2out) {
  const bl_kin *kn = &d->kn;
  double p0 = kn->p0, p = kn->p, k = kn->k;
  double Sv[3], gmd, bmd, al, amb, amg;
  const double *P0, *P, *q;
  double complex V, Vx, Db, Dg, Dd, j0, j1[3], j2[3];
  geom o;
  int i;
  geom_set(kn, g, v, &o);
  P0 = o.P0;  P = o.P;  q = o.q;
  al = o.al;  amb = o.amb;  amg = o.amg;
  *q2out = o.q2;
  gmd = p * (p + k * (1.0 - g->h) + p0);   /* gamma - delta */
  bmd = p0 * (p0 + p - k * (1.0 - g->h0)); /* beta - delta */
  if (bl_dwhyp_eval(&d->hyp, 1.0 - o.omx, log(o.omx), &V, &Vx) != 0)
    return BL_EDOMAIN;
  Db = d->hyp.a * V / amb + Vx * al * gmd / (amb * amb * amg);
  Dg = d->hyp.b * V / amg + Vx * al * bmd / (amb * amg * amg);
  Dd = -Vx * al / (amb * amg);
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
  else {
    m2 s1 = sdot(j1[0], j1[1], j1[2]), s2 = sdot(j2[0], j2[1], j2[2]);
    m2 sp0 = sdot(P0[0], P0[1], P0[2]), sp = sdot(P[0], P[1], P[2]);
    double sum = 0.0;
    int e;
    for (e = 0; e < 2; e++) {   /* linear polarisations along x and y */
      m2 se = e == 0 ? sdot(1.0, 0.0, 0.0) : sdot(0.0, 1.0, 0.0);
      m2 Od = mscale(se, j0);
      m2 Ev = madd(mscale(mmul(s2, se), I / (2.0 * kn->E)),
                   mscale(mmul(se, s1), -I / (2.0 * kn->E0)));
      sum += dirac_trace(Ev, Od, kn->E0, sp0, kn->E, sp);
    }
    *B = 0.5 * sum;
  }
  *B *= exp(d->lnscale);
  return isfinite(*B) ? BL_SUCCESS : BL_ENONFINITE;
}
