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
#include <stdint.h>
#include <string.h>

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
** Cost (issue 14).  What depends only on the case and the photon energy is
** sorted once, in bl_wpoles_set: the pairs i < j apart, and per pole the
** coefficients of its single term, of its square and of the -g_j parts of
** every term whose larger pole it is (their sum, "second").  A call then
** makes per pole one sqrt and one division, 1/(R P (R + pole)), from which
** 1/R, 1/P and R - pole follow by products; single, square and -g parts of
** a pole are one value of that loop (vectorized; a single pole has no
** division of its own any more, a square none either).  Each pair i < j
** makes one division, 1/(R_i + R_j), in a loop without a carried
** dependency, and the sums run in four accumulators.  (Dividing the
** gathered sums in a vector loop of their own was slower: the vector loads
** of scalar stores stall.)  R P (R + pole) stays a normal double within
** the case limits: Q0 <= R <= Q0 + pole + b, Q0 >= delta^2 > 1e-40 up to
** rounding (T/m <= 1e15) and R < 1e32.  With 13 poles (Hartree-Fock, the
** electrons, the uniform nucleus) 450 instructions a call under AVX2, 1,107
** before (callgrind); values change by rounding only, which the closed
** form amplifies where it cancels: up to 1e-6 relative at the largest
** angles, as before (against a 1e-13 numerical azimuth), far below every
** tolerance (make error-sweep: the same figures and calls on every point).
** The Born integrals now call the panel form, bl_bracket_azimuth_n below
** (the nodes in lanes, the same arithmetic per node); this one-node form
** is its reference (tests lanes::*) and the kernel of bench_kernel's
** earlier trees.
*/
/* Poles are padded to whole steps of this many (SSE2: two doubles; a
** step of four, for AVX2, made the SSE2 loop 10 % slower and the AVX2 one
** no faster). */
#define AZ_STEP 2
/* Below this many poles the scalar loop, without the set-up of the
** vector one (exponential screening: one pole, Thomas-Fermi three). */
#define FEW_POLES 4

void bl_wpoles_set (bl_wpoles *w, int npole, const double *pole,
                    const double *single, int nterm, const bl_term *term) {
  short at[BL_POLE_MAX][BL_POLE_MAX];   /* pair (i, j) -> its index + 1 */
  int i, j, t;
  w->npole = npole;
  w->npair = 0;
  for (i = 0; i < npole; i++) {
    w->pole[i] = pole[i];
    w->single[i] = single[i];
    w->square[i] = w->second[i] = 0.0;
    for (j = 0; j < npole; j++)
      at[i][j] = 0;
  }
  for (t = 0; t < nterm; t++) {
    int ti = term[t].i, tj = term[t].j;
    w->second[tj] += term[t].c;   /* the -g_j part of every term */
    if (ti == tj)
      w->square[ti] += term[t].c;
    else if (at[ti][tj] > 0)      /* a repeated pair: one term */
      w->pc[at[ti][tj] - 1] += term[t].c;
    else {
      w->pi[w->npair] = ti;
      w->pj[w->npair] = tj;
      w->pc[w->npair] = term[t].c;
      at[ti][tj] = (short)++w->npair;
    }
  }
  /* the vector loop in whole steps: padding poles (a copy of the last
  ** one, so finite wherever it is) with no coefficient, in no pair; a few
  ** poles take the scalar loop as they are */
  while (npole >= FEW_POLES && w->npole < BL_POLE_MAX
         && w->npole % AZ_STEP != 0) {
    w->pole[w->npole] = pole[npole - 1];
    w->single[w->npole] = w->square[w->npole] = w->second[w->npole] = 0.0;
    w->npole++;
  }
}


/* x[0] + ... + x[n-1] in four accumulators. */
static double sum4 (const double *x, int n) {
  double s0 = 0.0, s1 = 0.0, s2 = 0.0, s3 = 0.0;
  int i;
  for (i = 0; i + 4 <= n; i += 4) {
    s0 += x[i];
    s1 += x[i + 1];
    s2 += x[i + 2];
    s3 += x[i + 3];
  }
  for (; i < n; i++)
    s0 += x[i];
  return (s0 + s1) + (s2 + s3);
}


/* What a call knows of the bracket, and what its poles leave to the
** pairs. */
typedef struct azc {
  double b, b2, Q0, Qb, Qb2, QQ, L0, L12, M0, M1, M12;
} azc;
typedef struct azp {
  double m[BL_POLE_MAX], R[BL_POLE_MAX], iR[BL_POLE_MAX], iP[BL_POLE_MAX];
  double F[BL_POLE_MAX], G[BL_POLE_MAX];
} azp;


/*
** Pole i: its single, its square and the -g part of every term whose
** larger pole it is, as one value; keeps in a what the pairs need.  One
** sqrt and one division, 1/(R P (R + pole)).
*/
static inline double pole_value (const azc *k, const bl_wpoles *w, int i,
                                 azp *a) {
  double p = w->pole[i], mi = p + k->Q0, Ri = sqrt(mi * (mi + k->b2));
  double Pi = mi + k->b2 + Ri, S = Ri + p;
  double inv = 1.0 / (Ri * Pi * S), iRi = Pi * S * inv, iPi = Ri * S * inv;
  /* R - pole without cancellation (pole >> Q0 + b): R^2 - pole^2 over
  ** R + pole */
  double rp = (2.0 * p * k->Qb + k->QQ) * (Ri * Pi * inv);
  double Fi = (k->L0 + p * k->M0) * iRi, Gi = (k->L12 + p * k->M12) * iPi;
  double sr = (mi + k->b) * iRi;              /* the square's Y0 R^2 */
  double sq = w->square[i], se = w->single[i], sc = w->second[i];
  a->m[i] = mi;
  a->R[i] = Ri;
  a->iR[i] = iRi;
  a->iP[i] = iPi;
  a->F[i] = Fi;
  a->G[i] = Gi;
  /* single: (L0 - M0 rp)/R + (2 L1 - M1 (Q0 + 2b + rp))/P; square:
  ** Y0 F + Y1 G; every term whose larger pole this is: -(M0/R + 2 M1/P) */
  return (se * (k->L0 - k->M0 * rp) + sq * sr * Fi - sc * k->M0) * iRi
         + (se * (k->L12 - k->M1 * (k->Qb2 + rp)) + sq * (1.0 + sr) * Gi
            - sc * k->M12) * iPi;
}


/* Pair t (i < j): Y0 F_i/R_j + Y1 G_i/P_j with its coefficient, given
** ir = 1/(R_i + R_j).  Pair indices are < npole (bl_wpoles), so every a->
** value read here was set by pole_value. */
static inline double pair_value (const azc *k, const bl_wpoles *w, int t,
                                 const azp *a, double ir) {
  int ti = w->pi[t], tj = w->pj[t];
  double sr = (a->m[ti] + a->m[tj] + k->b2) * ir;
  return w->pc[t] * (sr * a->F[ti] * a->iR[tj]
                     + (1.0 + sr) * a->G[ti] * a->iP[tj]);
}


/* R_i + R_j of pair t. */
static inline double pair_sum (const bl_wpoles *w, int t, const azp *a) {
  return a->R[w->pi[t]] + a->R[w->pj[t]];
}


/*
** On x86-64 with GCC the kernel is also compiled for AVX2 and the better
** of the two chosen once at load time (ifunc): the pole loop then takes
** four poles a step.  Without FMA (a separate target), so the rounding,
** and every value, is the same on every machine: only the lanes differ.
** Not under ThreadSanitizer: the resolver runs during relocation, before
** the sanitizer's runtime is up, and its instrumented code crashes there.
*/
#if defined(__GNUC__) && !defined(__clang__) && defined(__x86_64__) \
    && defined(__linux__) && !defined(__SANITIZE_THREAD__)
#define AZ_CLONES __attribute__((target_clones("avx2", "default")))
#else
#define AZ_CLONES
#endif

AZ_CLONES
double bl_bracket_azimuth (const bl_bracket *br, const bl_wpoles *w) {
  double T[BL_POLE_MAX], y[BL_TERM_MAX];
  azp a;
  azc k;
  const int n = w->npole, np = w->npair;
  int i, t;
  k.b = br->b;
  k.b2 = 2.0 * br->b;
  k.Q0 = br->Q0;
  k.Qb = br->Q0 + br->b;
  k.Qb2 = br->Q0 + k.b2;
  k.QQ = br->Q0 * k.Qb2;
  k.L0 = br->L0;
  k.L12 = 2.0 * br->L1;
  k.M0 = br->M0;
  k.M1 = br->M1;
  k.M12 = 2.0 * br->M1;
  if (n < FEW_POLES) {
    double s0 = 0.0, s1 = 0.0;
    for (i = 0; i < n; i++)
      s0 += pole_value(&k, w, i, &a);
    for (t = 0; t < np; t++)
      s1 += pair_value(&k, w, t, &a, 1.0 / pair_sum(w, t, &a));
    return BL_PI * (s0 + s1);
  }
  for (i = 0; i < n; i++)      /* vectorized */
    T[i] = pole_value(&k, w, i, &a);
  for (t = 0; t < np; t++)     /* independent: the divisions overlap */
    y[t] = pair_value(&k, w, t, &a, 1.0 / pair_sum(w, t, &a));
  return BL_PI * (sum4(T, n) + sum4(y, np));
}


/*
** The same at the n nodes of one inner panel (issue 14).  The nodes are
** independent, so their sqrt and divisions overlap and the loops over
** nodes vectorize (kin.c is built at -O3); each node's arithmetic is that
** of bl_bracket_set and bl_bracket_azimuth, operation for operation, so
** the values are the same to the last bit.  With FEW_POLES or more the
** poles of one node are the lanes instead (bl_bracket_azimuth itself).
*/
/* The lane functions run over whole steps of BL_LANES points (n rounded
** up by BL_LANES_UP, born/internal.h): no scalar remainder, whose chain of
** dependent operations would come after the vector loop's. */
#define LANES_UP(n) BL_LANES_UP(n)

AZ_CLONES
void bl_bracket_set_n (const bl_kin *kn, const bl_polar *g, int n,
                       const double *h, const double *dh, bl_brackets *br) {
  double D0 = kn->p0 * (g->h0 + kn->hc0), pt0 = kn->p0 * g->s0;
  double a0 = pt0 / D0, qz[BL_NODE_MAX], dt[BL_NODE_MAX], s[BL_NODE_MAX];
  double D[BL_NODE_MAX], a[BL_NODE_MAX];
  int i, m = LANES_UP(n);
  for (i = 0; i < m; i++) {
    s[i] = sqrt(h[i] * (2.0 - h[i]));
    D[i] = kn->p * (h[i] + kn->hc);
    a[i] = kn->p * s[i] / D[i];
  }
  if (g->ridge)
    for (i = 0; i < m; i++) {
      qz[i] = g->qzs + kn->p * dh[i];
      dt[i] = -kn->p * dh[i] * (2.0 - h[i] - g->hs) / (s[i] + g->ss);
    }
  else
    for (i = 0; i < m; i++) {
      qz[i] = kn->delta - kn->p0 * g->h0 + kn->p * h[i];
      dt[i] = pt0 - kn->p * s[i];
    }
  for (i = 0; i < m; i++) {
    double d0 = kn->E0 * a[i] - kn->E * a0;
    br->b[i] = 2.0 * pt0 * (kn->p * s[i]);
    br->Q0[i] = qz[i] * qz[i] + dt[i] * dt[i];
    br->L0[i] = 4.0 * d0 * d0;
    br->L1[i] = 8.0 * kn->E0 * kn->E * a[i] * a0;
  }
  if (kn->spin > 0.25)
    for (i = 0; i < m; i++) {
      double c = 2.0 * kn->k * kn->k / (D[i] * D0);
      double du = a[i] - a0;
      br->L0[i] += c * dt[i] * dt[i];
      br->L1[i] += c * br->b[i];
      br->M0[i] = du * du;
      br->M1[i] = 2.0 * a[i] * a0;
    }
  else
    for (i = 0; i < m; i++)
      br->M0[i] = br->M1[i] = 0.0;
}


AZ_CLONES
void bl_bracket_azimuth_n (const bl_brackets *br, int n, const bl_wpoles *w,
                           double *out) {
  double m[BL_POLE_MAX][BL_NODE_MAX], R[BL_POLE_MAX][BL_NODE_MAX];
  double iR[BL_POLE_MAX][BL_NODE_MAX], iP[BL_POLE_MAX][BL_NODE_MAX];
  double F[BL_POLE_MAX][BL_NODE_MAX], G[BL_POLE_MAX][BL_NODE_MAX];
  double s0[BL_NODE_MAX], s1[BL_NODE_MAX];
  const int np = w->npole;
  int i, j, t, nl = LANES_UP(n);
  double B2[BL_NODE_MAX], QB[BL_NODE_MAX], QB2[BL_NODE_MAX], QQ[BL_NODE_MAX];
  double L12[BL_NODE_MAX], M12[BL_NODE_MAX];
  for (i = 0; i < nl; i++) {   /* what azc holds, per node */
    double b = br->b[i], Q0 = br->Q0[i];
    B2[i] = 2.0 * b;
    QB[i] = Q0 + b;
    QB2[i] = Q0 + B2[i];
    QQ[i] = Q0 * QB2[i];
    L12[i] = 2.0 * br->L1[i];
    M12[i] = 2.0 * br->M1[i];
    s0[i] = s1[i] = 0.0;
  }
  for (j = 0; j < np; j++) {   /* pole_value, node by node */
    double p = w->pole[j], sq = w->square[j], se = w->single[j];
    double sc = w->second[j];
    for (i = 0; i < nl; i++) {
      double b = br->b[i], b2 = B2[i], Q0 = br->Q0[i];
      double Qb = QB[i], Qb2 = QB2[i];
      double L0 = br->L0[i];
      double M0 = br->M0[i], M1 = br->M1[i];
      double mi = p + Q0, Ri = sqrt(mi * (mi + b2));
      double Pi = mi + b2 + Ri, S = Ri + p;
      double inv = 1.0 / (Ri * Pi * S), iRi = Pi * S * inv;
      double iPi = Ri * S * inv;
      double rp = (2.0 * p * Qb + QQ[i]) * (Ri * Pi * inv);
      double Fi = (L0 + p * M0) * iRi, Gi = (L12[i] + p * M12[i]) * iPi;
      double sr = (mi + b) * iRi;
      m[j][i] = mi;
      R[j][i] = Ri;
      iR[j][i] = iRi;
      iP[j][i] = iPi;
      F[j][i] = Fi;
      G[j][i] = Gi;
      s0[i] += (se * (L0 - M0 * rp) + sq * sr * Fi - sc * M0) * iRi
               + (se * (L12[i] - M1 * (Qb2 + rp)) + sq * (1.0 + sr) * Gi
                  - sc * M12[i]) * iPi;
    }
  }
  for (t = 0; t < w->npair; t++) {   /* pair_value, node by node */
    int ti = w->pi[t], tj = w->pj[t];
    double pc = w->pc[t];
    for (i = 0; i < nl; i++) {
      double ir = 1.0 / (R[ti][i] + R[tj][i]);
      double sr = (m[ti][i] + m[tj][i] + B2[i]) * ir;
      s1[i] += pc * (sr * F[ti][i] * iR[tj][i]
                     + (1.0 + sr) * G[ti][i] * iP[tj][i]);
    }
  }
  for (i = 0; i < nl; i++)
    out[i] = BL_PI * (s0[i] + s1[i]);
}


/*
** exp and expm1 at n points (the inner maps, issue 14; libm's, one value at
** a time, cost 30 % (expm1) and 15 % (exp) of a screened point-nucleus
** point).  Branch-free loops over the points, vectorized:
** exp: x = k ln 2 + r, k the nearest integer (the 1.5 2^52 rounding),
** ln 2 in two parts (Cody & Waite 1980; k ln2_hi exact for |k| < 2^20),
** e^r by its Taylor series to r^13 (|r| <= 0.347: truncation below
** 5e-18 relative), times 2^k made from the bits of k; for
** -708 <= x <= 709, else libm's exp.
** expm1: for |x| < 1/2 the Taylor series to x^15 (truncation below 1.5e-18
** relative); elsewhere exp(x) - 1, which loses nothing there
** (|expm1(x)| > 0.39).
** Measured against expl and expm1l on 10^7 random points each: exp on
** [-40, 709] at most 1.0 ulp, expm1 at most 0.95 ulp on |x| < 1/2 and
** 1.0 ulp on 1/2 <= |x| < 40 (libm's: 0.5 ulp).
*/
static const double em1c[14] = {
  0.5, 0.16666666666666666, 0.041666666666666664, 0.0083333333333333332,
  0.0013888888888888889, 0.00019841269841269841, 2.4801587301587302e-05,
  2.7557319223985893e-06, 2.7557319223985888e-07, 2.505210838544172e-08,
  2.08767569878681e-09, 1.6059043836821613e-10, 1.1470745597729725e-11,
  7.6471637318198164e-13
};
#define EXP_SHIFT 6755399441055744.0        /* 1.5 2^52 */
#define LN2_HI 6.93147180369123816490e-01   /* 0x3fe62e42fee00000 */
#define LN2_LO 1.90821492927058770002e-10
#define INV_LN2 1.4426950408889634

/* Taylor coefficients 1/2! ... 1/15!; Estrin's scheme (pairs, then
** pairs of pairs): a chain of 5 operations instead of Horner's 24, which
** is what a panel of 7 to 21 nodes waits for. */
#define EM1C(j) em1c[(j) - 2]
static inline double exp_tail (double r) {   /* (e^r - 1 - r)/r^2 to r^11 */
  double r2 = r * r, r4 = r2 * r2;
  double p0 = EM1C(2) + EM1C(3) * r, p1 = EM1C(4) + EM1C(5) * r;
  double p2 = EM1C(6) + EM1C(7) * r, p3 = EM1C(8) + EM1C(9) * r;
  double p4 = EM1C(10) + EM1C(11) * r, p5 = EM1C(12) + EM1C(13) * r;
  return (p0 + r2 * p1) + r4 * ((p2 + r2 * p3) + r4 * (p4 + r2 * p5));
}

static inline double em1_tail (double x) {   /* the same to x^13 */
  double x2 = x * x, x4 = x2 * x2;
  double p0 = EM1C(2) + EM1C(3) * x, p1 = EM1C(4) + EM1C(5) * x;
  double p2 = EM1C(6) + EM1C(7) * x, p3 = EM1C(8) + EM1C(9) * x;
  double p4 = EM1C(10) + EM1C(11) * x, p5 = EM1C(12) + EM1C(13) * x;
  double p6 = EM1C(14) + EM1C(15) * x;
  return (p0 + x2 * p1)
         + x4 * ((p2 + x2 * p3) + x4 * ((p4 + x2 * p5) + x4 * p6));
}

AZ_CLONES
void bl_exp_n (const double *x, int n, double *out) {
  int i, m = LANES_UP(n), far = 0;
  for (i = 0; i < m; i++) {
    double xi = x[i] < -708.0 ? -708.0 : x[i];
    double ti, k, r, sc;
    uint64_t kb;
    far |= !(x[i] >= -708.0 && x[i] <= 709.0);
    xi = xi > 709.0 ? 709.0 : xi;
    ti = xi * INV_LN2 + EXP_SHIFT;
    k = ti - EXP_SHIFT;
    r = (xi - k * LN2_HI) - k * LN2_LO;
    memcpy(&kb, &ti, sizeof kb);   /* 2^k: k + 1023 in the exponent */
    kb = (kb - UINT64_C(0x4338000000000000) + 1023) << 52;
    memcpy(&sc, &kb, sizeof sc);
    out[i] = (1.0 + (r + (r * r) * exp_tail(r))) * sc;
  }
  if (far)
    for (i = 0; i < n; i++)
      if (!(x[i] >= -708.0 && x[i] <= 709.0))
        out[i] = exp(x[i]);
}


AZ_CLONES
void bl_expm1_n (const double *x, int n, double *out) {
  double e[BL_NODE_MAX], xp[BL_NODE_MAX] = {0};   /* zeroed: bl_ridge_map_n */
  int i, m = LANES_UP(n);
  if (n < 1 || n > BL_NODE_MAX)
    return;
  for (i = 0; i < m; i++)
    xp[i] = i < n ? x[i] : 0.0;
  bl_exp_n(xp, m, e);
  for (i = 0; i < m; i++) {   /* the series, at every point */
    double p = xp[i] + (xp[i] * xp[i]) * em1_tail(xp[i]);
    out[i] = fabs(xp[i]) < 0.5 ? p : e[i] - 1.0;
  }
}


/*
** The inner map of a ridge side at n points u >= 0 (dcs.c, inner_fv):
** sigma = sstar + ds, ds = sw sinh(u) (sw = side w); near the ridge
** (|ds| < 1/2) dh = (hs + hc) expm1(ds) and h = hs + dh, elsewhere
** h = hc expm1(sigma) and dh = h - hs; jac = dh/du = (h + hc) w cosh(u).
** sinh(u) = (e^u - e^-u)/2, below u = 1e-3 its series to u^5 (truncation
** below 1e-22 relative).
*/
AZ_CLONES
void bl_ridge_map_n (const double *u, int n, double sw, double w,
                     double sstar, double hs, double hc, double *h,
                     double *dh, double *jac) {
  double eu[BL_NODE_MAX], x[BL_NODE_MAX], ds[BL_NODE_MAX], em[BL_NODE_MAX];
  /* zeroed: no static analyzer sees that the lanes of bl_exp_n and
  ** bl_expm1_n (n rounded up again) are the ones set here */
  double up[BL_NODE_MAX] = {0};
  int i, m = LANES_UP(n);
  if (n < 1 || n > BL_NODE_MAX)
    return;
  for (i = 0; i < m; i++)
    up[i] = i < n ? u[i] : 0.0;
  bl_exp_n(up, m, eu);
  for (i = 0; i < m; i++) {
    double ie = 1.0 / eu[i], sh = 0.5 * (eu[i] - ie), u2 = up[i] * up[i];
    jac[i] = sh + ie;   /* cosh */
    if (up[i] < 1e-3)
      sh = up[i] + up[i] * u2 * (1.0 / 6.0 + u2 / 120.0);
    ds[i] = sw * sh;
    x[i] = fabs(ds[i]) < 0.5 ? ds[i] : sstar + ds[i];
  }
  bl_expm1_n(x, m, em);
  for (i = 0; i < m; i++) {
    int near = fabs(ds[i]) < 0.5;
    double d = (hs + hc) * em[i], hf = hc * em[i];
    h[i] = near ? hs + d : hf;
    dh[i] = near ? d : hf - hs;
    jac[i] = (h[i] + hc) * w * jac[i];
  }
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
