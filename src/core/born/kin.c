/*
** kin.c -- kinematics and the Born bracket with its azimuthal integral
** See Copyright Notice in LICENSE
**
** Units: projectile mass m = 1 (hbar = c = 1).  The frame has the photon
** momentum along z; the initial momentum p0 makes the angle theta0 with it,
** the final momentum p the angle theta, and phi is the azimuth between the
** (k, p0) and (k, p) planes.  Every difference that vanishes at high energy
** is written in a cancellation-free form (see DEVELOPERS.md, "Kinematics").
*/

#include <math.h>

#include "born/internal.h"


/*
** Momentum from kinetic energy: p = sqrt(t (t + 2)), never sqrt(E^2 - 1).
*/
static double momentum (double t) {
  return sqrt(t * (t + 2.0));
}


void bl_kin_set (bl_kin *kn, double t0, double k, double spin) {
  double t = t0 - k;
  kn->E0 = 1.0 + t0;
  kn->p0 = momentum(t0);
  kn->E = 1.0 + t;
  kn->p = momentum(t);
  kn->k = k;
  /* p0 - p - k = k [1/(E0+p0) + 1/(E+p)] / (p0 + p) */
  kn->delta = k * (1.0 / (kn->E0 + kn->p0) + 1.0 / (kn->E + kn->p))
              / (kn->p0 + kn->p);
  kn->hc0 = 1.0 / (kn->p0 * (kn->E0 + kn->p0));
  kn->hc = 1.0 / (kn->p * (kn->E + kn->p));
  kn->spin = spin;
}


/*
** With a = |p_perp| / (E - p cos theta) and a0 likewise (the moduli of the
** 2-vectors u and u0 of the bracket), and u.u0 = a a0 (1 - v):
**   4 |E0 u - E u0|^2    = 4 (E0 a - E a0)^2 + 8 E0 E a a0 v
**   |u - u0|^2           = (a - a0)^2 + 2 a a0 v
**   |p_perp - p0_perp|^2 = (p s - p0 s0)^2 + b v,        b = 2 p0 p s0 s
**   q^2                  = q_z^2 + (p0 s0 - p s)^2 + b v
** and E - p cos theta = p (h + hc), q_z = delta - p0 h0 + p h.  Near the
** ridge where p s = p0 s0 both q_z and p0 s0 - p s are small differences of
** large terms; there they are taken relative to the ridge point h*:
**   q_z = q_z(h*) + p (h - h*),  p0 s0 - p s = -p (h - h*)(2 - h - h*)/(s + s*).
*/
void bl_bracket_set (const bl_kin *kn, const bl_polar *g, bl_bracket *br) {
  double D0 = kn->p0 * (g->h0 + kn->hc0);
  double D = kn->p * (g->h + kn->hc);
  double pt0 = kn->p0 * g->s0, pt = kn->p * g->s;
  double a0 = pt0 / D0, a = pt / D;
  double qz, dt;
  if (g->ridge) {  /* measured from the ridge: no cancellation at tiny q */
    qz = g->qzs + kn->p * g->dh;
    dt = -kn->p * g->dh * (2.0 - g->h - g->hs) / (g->s + g->ss);
  }
  else {
    qz = kn->delta - kn->p0 * g->h0 + kn->p * g->h;
    dt = pt0 - pt;
  }
  double d0 = kn->E0 * a - kn->E * a0;
  br->b = 2.0 * pt0 * pt;
  br->Q0 = qz * qz + dt * dt;
  br->L0 = 4.0 * d0 * d0;
  br->L1 = 8.0 * kn->E0 * kn->E * a * a0;
  if (kn->spin > 0.25) {  /* spin 1/2: the Bethe-Heitler bracket */
    double c = 2.0 * kn->k * kn->k / (D * D0);
    double du = a - a0;
    br->L0 += c * dt * dt;
    br->L1 += c * br->b;
    br->M0 = du * du;
    br->M1 = 2.0 * a * a0;
  }
  else
    br->M0 = br->M1 = 0.0;
}


/*
** Azimuthal building blocks, phi in [0, pi], v = 1 - cos(phi), d = m + b v
** with m > 0, b >= 0, R = sqrt(m (m + 2b)), P = m + 2b + R:
**   G0(m)   = int dphi / d          = pi / R
**   G1(m)   = int v dphi / d        = 2 pi / P
**   Y0(i,j) = int dphi / (d_i d_j)   = pi (m_i + m_j + 2b) / (R_i R_j (R_i + R_j))
**   Y1(i,j) = int v dphi / (d_i d_j) = 2 pi [1 + (m_i + m_j + 2b)/(R_i + R_j)]
**                                       / (P_i P_j)
** The pair forms are divided differences of G0, G1 rewritten without any
** subtraction, so they hold for i = j and for m_i close to m_j alike.
** With x w_i w_j = w_j - pole_i w_i w_j (w_i = 1/(pole_i + x)) the term
** -x (M0 + M1 v) of the bracket needs only G0 and G1: no v^2 integral, whose
** closed form cancels badly when m << b.  Taking i as the smaller pole keeps
** that subtraction mild (it cancels only where x << pole_i).
** Single poles: int B w_i dphi = L0 G0 + L1 G1 - M0 X0 - M1 X1 with
**   X0 = int x w_i dphi   = pi (R - pole) / R,
**   X1 = int v x w_i dphi = pi (P - 2 pole) / P = pi (Q0 + 2b + R - pole) / P,
** and R - pole = (2 pole (Q0 + b) + Q0 (Q0 + 2b)) / (R + pole): no
** subtraction, so a far pole (a nucleus seen from atomic distances, pole
** >> q^2) costs no digits.  Writing x w_i = 1 - pole_i w_i instead loses
** them all: 1e-6 noise at T = 100 GeV.
*/
/*
** Cost (issue 14): per pole one sqrt and one division, 1/(R P), from which
** 1/R and 1/P follow by products (vectorized); the pole factors of the
** pair terms, (L0 + pole M0)/R and 2 (L1 + pole M1)/P, are taken there
** once per pole rather than once per term; the sums run in two
** accumulators.  1.13-1.20x the calls per second of the form before
** (make bench, "kernel"); values change by rounding only, which the
** closed form amplifies where it cancels (up to 5e-7 relative at the
** largest angles, far below every tolerance: make error-sweep unchanged).
*/
double bl_bracket_azimuth (const bl_bracket *br, int npole,
                           const double *pole, const double *single,
                           int nterm, const bl_term *term) {
  double m[BL_POLE_MAX], R[BL_POLE_MAX], iR[BL_POLE_MAX], iP[BL_POLE_MAX];
  double g[BL_POLE_MAX], F[BL_POLE_MAX], G[BL_POLE_MAX];
  const double b = br->b, b2 = 2.0 * br->b, Q0 = br->Q0;
  const double L0 = br->L0, L1 = br->L1, M0 = br->M0, M1 = br->M1;
  double s0 = 0.0, s1 = 0.0;
  int i, t;
  for (i = 0; i < npole; i++) {   /* one sqrt, one division: vectorized */
    double mi = pole[i] + Q0, Ri = sqrt(mi * (mi + b2));
    double Pi = mi + b2 + Ri, inv = 1.0 / (Ri * Pi);
    double iRi = Pi * inv, iPi = Ri * inv;
    m[i] = mi;
    R[i] = Ri;
    iR[i] = iRi;
    iP[i] = iPi;
    g[i] = M0 * iRi + 2.0 * M1 * iPi;   /* (M0 G0 + M1 G1)/pi */
    F[i] = (L0 + pole[i] * M0) * iRi;
    G[i] = 2.0 * (L1 + pole[i] * M1) * iPi;
  }
  for (i = 0; i < npole; i++)
    if (single[i] != 0.0) {
      /* R - pole and P - 2 pole without cancellation (pole >> Q0 + b) */
      double rp = (2.0 * pole[i] * (Q0 + b) + Q0 * (Q0 + b2))
                  / (R[i] + pole[i]);
      s0 += single[i] * ((L0 - M0 * rp) * iR[i]
                         + (2.0 * L1 - M1 * (Q0 + b2 + rp)) * iP[i]);
    }
  /* cppcheck cannot know that term indices are < npole (the contract of
  ** bl_term): every m, R, iR, iP, F, G, g read below was set above */
  for (t = 0; t < nterm; t++) {   /* one division a term, none for squares */
    int ti = term[t].i, tj = term[t].j;
    // cppcheck-suppress uninitvar ; indices < npole, see above
    double irr = ti == tj ? 0.5 * iR[ti] : 1.0 / (R[ti] + R[tj]);
    // cppcheck-suppress uninitvar ; indices < npole, see above
    double sr = (m[ti] + m[tj] + b2) * irr;   /* Y0 = sr/(R_i R_j) */
    // cppcheck-suppress uninitvar ; indices < npole, see above
    double y0 = sr * F[ti] * iR[tj];
    // cppcheck-suppress uninitvar ; indices < npole, see above
    double y1 = (1.0 + sr) * G[ti] * iP[tj];
    // cppcheck-suppress uninitvar ; indices < npole, see above
    double v = term[t].c * (y0 + y1 - g[tj]);
    if (t & 1)
      s1 += v;
    else
      s0 += v;
  }
  return BL_PI * (s0 + s1);
}


double bl_target_w (double x, int npole, const double *pole,
                    const double *single, int nterm, const bl_term *term) {
  double w[BL_POLE_MAX], W = 0.0;
  int i, t;
  for (i = 0; i < npole; i++) {
    w[i] = 1.0 / (pole[i] + x);
    W += single[i] * w[i];
  }
  for (t = 0; t < nterm; t++)   /* term indices are < npole (bl_term) */
    // cppcheck-suppress uninitvar ; every w[i], i < npole, is set above
    W += term[t].c * w[term[t].i] * w[term[t].j];
  return W;
}


double bl_bracket_point (const bl_bracket *br, double v, int npole,
                         const double *pole, const double *single, int nterm,
                         const bl_term *term) {
  double x = br->Q0 + br->b * v;
  return (br->L0 + br->L1 * v - x * (br->M0 + br->M1 * v))
         * bl_target_w(x, npole, pole, single, nterm, term);
}


int bl_kin_case (const bl_case *c, double k, bl_kin *kn) {
  if (!isfinite(k) || k <= 0.0 || k >= c->T)
    return BL_EDOMAIN;
  bl_kin_set(kn, c->t0, k / c->particle.mass, c->particle.spin);
  if (!(kn->p > 0.0))
    return BL_EDOMAIN;
  return BL_SUCCESS;
}


/*
** Beam-frame angles (photon theta_k, particle theta_p, azimuth phi between
** them around the beam) to the photon frame: with e1 = unit p0_perp and
** e2 = k x e1, the final direction has perpendicular components
**   X = sin(theta_k - theta_p) + 2 cos(theta_k) sin(theta_p) sin^2(phi/2),
**   Y = -sin(theta_p) sin(phi),
** and h = 1 - cos(theta) = 2 sin^2((theta_k - theta_p)/2)
**                         + 2 sin(theta_k) sin(theta_p) sin^2(phi/2);
** v = 1 - cos(phi_k) without cancellation.
*/
void bl_polar_beam (double theta_k, double theta_p, double phi, bl_polar *g,
                    double *v) {
  double sd = sin(0.5 * (theta_k - theta_p)), sp = sin(0.5 * phi);
  double X, Y, rho;
  g->ridge = 0;
  g->h0 = 2.0 * sin(0.5 * theta_k) * sin(0.5 * theta_k);
  g->s0 = sin(theta_k);
  g->h = 2.0 * sd * sd + 2.0 * g->s0 * sin(theta_p) * sp * sp;
  X = sin(theta_k - theta_p) + 2.0 * cos(theta_k) * sin(theta_p) * sp * sp;
  Y = -sin(theta_p) * sin(phi);
  rho = hypot(X, Y);
  g->s = rho;
  if (rho == 0.0)
    *v = 0.0;
  else if (X > 0.0)
    *v = Y * Y / (rho * (rho + X));
  else
    *v = (rho - X) / rho;
}
