/*
** amp.c -- tree-level amplitudes of a(p1) e-(p2) -> a(p3) e-(p4) photon(k)
** and the kinematics of one phase-space point
** See Copyright Notice in LICENSE
**
** Units m_e = 1, metric (+, -, -, -), Dirac representation of the gamma
** matrices, spinors u = (sqrt(E+m) chi, sigma.p chi / sqrt(E+m)),
** v = (sigma.p eta / sqrt(E+m), sqrt(E+m) eta), chi and eta the two unit
** spinors along z (any orthonormal pair serves: the spins are summed).
**
** A charged line with fermion-flow momenta pin -> pout, mass m, charge Q
** (the field's charge: -1 for both the electron and the positron lines)
** and the virtual photon index mu gives two currents (the common factor
** -i Q e of a vertex, i of a propagator, and -i g/q^2 of the virtual photon
** taken out: every diagram carries the same i e^3):
**
**   j^mu     = ubar(out) gamma^mu u(in)                    (no emission)
**   R^mu(e)  = ubar(out) [ e/ (pout/ + k/ + m) gamma^mu / (2 pout.k)
**                        + gamma^mu (pin/ - k/ + m) e/ / (-2 pin.k) ] u(in)
**
** and for a scalar line (scalar QED: vertex -i Q e (p + p')^mu, seagull
** 2 i Q^2 e^2 g^{mu nu})
**
**   j^mu     = (pin + pout)^mu
**   R^mu(e)  = (2 pout + k).e (pin + pout + k)^mu / (2 pout.k)
**            + (2 pin - k).e (pin + pout - k)^mu / (-2 pin.k) - 2 e^mu .
**
** A pair of lines X, Y (radiation from either) gives
**
**   A = e^3 QX QY [ QX R_X . j_Y / qY^2 + QY j_X . R_Y / qX^2 ],
**   q^2 = (pout - pin)^2 of the other line (the virtual photon).
**
** Projectile distinguishable from the electron: M = A(1 -> 3, 2 -> 4).
** Electron: M = A(1 -> 3, 2 -> 4) - A(1 -> 4, 2 -> 3) (Fermi statistics).
** Positron (lines vbar(p1) ... v(p3), flow momenta -p1, -p3):
** M = A(vbar1 v3, ubar4 u2) - A(vbar1 u2, ubar4 v3) (the annihilation
** channel, q^2 = s or (p3 + p4)^2).  Heavier antiparticles are taken as
** particles of their charge: the same spin-summed |M|^2 by charge
** conjugation.  Each A is gauge invariant on its own
** (tests/test_ebrems.c, suite ebamp).
*/

#include <math.h>
#include <string.h>

#include "brakelight.h"
#include "ebrems/internal.h"

typedef double complex cmat[4][4];

/* The axial form of the struck line's current (add_pair) is used from a
** projectile Lorentz factor E0/m of AXIAL_GAMMA up, where it keeps more
** digits than the plain one (measured against tests/ref/ebquad.c: e- at
** 1 GeV 1e-10 against 2e-8, e- at 1 TeV 1e-5 against 3e-4); below, the
** plain form is the better one (a 10 keV proton: 4e-14 against 2e-9).
** AXIAL_MIN: the least |q.n| relative to the size of its terms. */
#ifndef AXIAL_GAMMA
#define AXIAL_GAMMA 100.0
#endif
#ifndef AXIAL_MIN
#define AXIAL_MIN 1e-3
#endif

static double dot (const double a[4], const double b[4]) {
  return a[0] * b[0] - a[1] * b[1] - a[2] * b[2] - a[3] * b[3];
}

/* a/ + c 1 for a real four-vector a (contravariant components). */
static void slash (const double a[4], double c, cmat g) {
  double complex am = a[1] - I * a[2], ap = a[1] + I * a[2];
  g[0][0] = a[0] + c; g[0][1] = 0; g[0][2] = -a[3]; g[0][3] = -am;
  g[1][0] = 0; g[1][1] = a[0] + c; g[1][2] = -ap; g[1][3] = a[3];
  g[2][0] = a[3]; g[2][1] = am; g[2][2] = -a[0] + c; g[2][3] = 0;
  g[3][0] = ap; g[3][1] = -a[3]; g[3][2] = 0; g[3][3] = -a[0] + c;
}

static void mat_col (const cmat A, const double complex x[4],
                     double complex y[4]) {
  int i;
  for (i = 0; i < 4; i++)
    y[i] = A[i][0] * x[0] + A[i][1] * x[1] + A[i][2] * x[2] + A[i][3] * x[3];
}

static void row_mat (const double complex x[4], const cmat A,
                     double complex y[4]) {
  int j;
  for (j = 0; j < 4; j++)
    y[j] = x[0] * A[0][j] + x[1] * A[1][j] + x[2] * A[2][j] + x[3] * A[3][j];
}

static double complex row_col (const double complex x[4],
                               const double complex y[4]) {
  return x[0] * y[0] + x[1] * y[1] + x[2] * y[2] + x[3] * y[3];
}

/* gamma^mu x (column) and x gamma^mu (row), Dirac representation */
static void gam_col (int mu, const double complex x[4], double complex y[4]) {
  switch (mu) {
  case 0: y[0] = x[0]; y[1] = x[1]; y[2] = -x[2]; y[3] = -x[3]; break;
  case 1: y[0] = x[3]; y[1] = x[2]; y[2] = -x[1]; y[3] = -x[0]; break;
  case 2: y[0] = -I * x[3]; y[1] = I * x[2]; y[2] = I * x[1];
          y[3] = -I * x[0]; break;
  default: y[0] = x[2]; y[1] = -x[3]; y[2] = -x[0]; y[3] = x[1]; break;
  }
}

static void row_gam (int mu, const double complex x[4], double complex y[4]) {
  switch (mu) {
  case 0: y[0] = x[0]; y[1] = x[1]; y[2] = -x[2]; y[3] = -x[3]; break;
  case 1: y[0] = -x[3]; y[1] = -x[2]; y[2] = x[1]; y[3] = x[0]; break;
  case 2: y[0] = -I * x[3]; y[1] = I * x[2]; y[2] = I * x[1];
          y[3] = -I * x[0]; break;
  default: y[0] = -x[2]; y[1] = x[3]; y[2] = x[0]; y[3] = -x[1]; break;
  }
}

/* u (anti = 0) or v (anti = 1) of momentum p, mass m, spin s, as a column;
** its Dirac adjoint as a row. */
static void spinor (const double p[4], double m, int s, int anti,
                    double complex col[4], double complex row[4]) {
  double n = sqrt(p[0] + m), ch[2] = {s == 0, s == 1};
  double complex sp[2];
  int i;
  sp[0] = p[3] * ch[0] + (p[1] - I * p[2]) * ch[1];
  sp[1] = (p[1] + I * p[2]) * ch[0] - p[3] * ch[1];
  if (!anti) {
    col[0] = n * ch[0]; col[1] = n * ch[1];
    col[2] = sp[0] / n; col[3] = sp[1] / n;
  } else {
    col[0] = sp[0] / n; col[1] = sp[1] / n;
    col[2] = n * ch[0]; col[3] = n * ch[1];
  }
  for (i = 0; i < 4; i++)
    row[i] = (i < 2 ? 1.0 : -1.0) * conj(col[i]);
}

/* One charged line: flow momenta, mass, the spinors at its two ends. */
typedef struct line {
  int scalar;
  double m;
  double pin[4], pout[4];
  double complex a[2][4];   /* adjoint spinors at the outgoing end */
  double complex b[2][4];   /* spinors at the incoming end */
} line;

/* Its currents j[mu][so][si], R[pol][mu][so][si]. */
typedef struct cur {
  int nso, nsi;
  double complex j[4][2][2];
  double complex r[2][4][2][2];
} cur;

/* Particle label -> momentum p[label], spinor kind. */
static void set_end (line *L, const double p[5][4], int out, int label,
                     double m, int anti, int scalar) {
  double complex col[2][4] = {{0}}, row[2][4] = {{0}};
  int s, i;
  for (i = 0; i < 4; i++) {
    double v = anti ? -p[label][i] : p[label][i];
    if (out) L->pout[i] = v; else L->pin[i] = v;
  }
  L->scalar = scalar;
  L->m = m;
  if (scalar)
    return;
  for (s = 0; s < 2; s++)
    spinor(p[label], m, s, anti, col[s], row[s]);
  /* outgoing particle: ubar(p); incoming antiparticle: vbar(p) (adjoint of
  ** its column); incoming particle: u(p); outgoing antiparticle: v(p) */
  for (s = 0; s < 2; s++)
    for (i = 0; i < 4; i++) {
      if (out) L->a[s][i] = row[s][i];
      else L->b[s][i] = col[s][i];
    }
}

static void currents (const line *L, const double k[4], const double eps[2][4],
                      cur *C) {
  double da = 2.0 * dot(L->pout, k), db = -2.0 * dot(L->pin, k);
  int mu, pol, so, si;
  if (L->scalar) {
    double s3[4], sa[4], sb[4], oa[4], ob[4];
    C->nso = C->nsi = 1;
    for (mu = 0; mu < 4; mu++) {
      s3[mu] = L->pin[mu] + L->pout[mu];
      sa[mu] = s3[mu] + k[mu];
      sb[mu] = s3[mu] - k[mu];
      oa[mu] = 2.0 * L->pout[mu] + k[mu];
      ob[mu] = 2.0 * L->pin[mu] - k[mu];
      C->j[mu][0][0] = s3[mu];
    }
    for (pol = 0; pol < 2; pol++) {
      double ca = dot(oa, eps[pol]) / da, cb = dot(ob, eps[pol]) / db;
      for (mu = 0; mu < 4; mu++) {
        C->r[pol][mu][0][0] = ca * sa[mu] + cb * sb[mu] - 2.0 * eps[pol][mu];
      }
    }
    return;
  }
  {
    cmat so_m = {{0}}, si_m = {{0}}, E = {{0}};
    double complex gb[4][2][4], ag[4][2][4], tmp[4], rowa[2][4], colb[2][4];
    double vo[4], vi[4];
    C->nso = C->nsi = 2;
    for (mu = 0; mu < 4; mu++) {
      for (si = 0; si < 2; si++)
        gam_col(mu, L->b[si], gb[mu][si]);
      for (so = 0; so < 2; so++)
        row_gam(mu, L->a[so], ag[mu][so]);
      for (so = 0; so < 2; so++)
        for (si = 0; si < 2; si++)
          C->j[mu][so][si] = row_col(L->a[so], gb[mu][si]);
      vo[mu] = L->pout[mu] + k[mu];
      vi[mu] = L->pin[mu] - k[mu];
    }
    slash(vo, L->m, so_m);
    slash(vi, L->m, si_m);
    for (pol = 0; pol < 2; pol++) {
      slash(eps[pol], 0.0, E);
      for (so = 0; so < 2; so++) {
        row_mat(L->a[so], E, tmp);
        row_mat(tmp, so_m, rowa[so]);
        for (mu = 0; mu < 4; mu++)
          rowa[so][mu] /= da;
      }
      for (si = 0; si < 2; si++) {
        mat_col(E, L->b[si], tmp);
        mat_col(si_m, tmp, colb[si]);
        for (mu = 0; mu < 4; mu++)
          colb[si][mu] /= db;
      }
      for (mu = 0; mu < 4; mu++)
        for (so = 0; so < 2; so++)
          for (si = 0; si < 2; si++) {
            C->r[pol][mu][so][si] = row_col(rowa[so], gb[mu][si])
                                    + row_col(ag[mu][so], colb[si]);
          }
    }
  }
}

static double qsq (const line *L) {
  /* (pout - pin)^2 from the differences of the components, exact for
  ** nearby momenta (not 2 m^2 - 2 pout.pin, which cancels for a heavy
  ** projectile: 1e-3 of the value lost on a 10 keV proton) */
  double d[4];
  int i;
  for (i = 0; i < 4; i++)
    d[i] = L->pout[i] - L->pin[i];
  return dot(d, d);
}

static double complex mdot (const double complex a[4][2][2],
                            const double complex b[4][2][2], int a1, int a2,
                            int b1, int b2) {
  return a[0][a1][a2] * b[0][b1][b2] - a[1][a1][a2] * b[1][b1][b2]
       - a[2][a1][a2] * b[2][b1][b2] - a[3][a1][a2] * b[3][b1][b2];
}

/* Add sign * A(X, Y) to M; lab[4]: particle labels (0..3) of X out, X in,
** Y out, Y in. */
static void add_pair (const line *X, double qx, const line *Y, double qy,
                      double tyv, const double *qvy, int axial,
                      const int lab[4], double sign, double rx, double ry,
                      const double k[4],
                      const double eps[2][4], double complex M[2][BL_EB_NAMP]) {
  static const int wt[4] = {8, 4, 2, 1};
  cur cx, cy;
  double complex cyj[4][2][2];
  double tx, ty;
  int pol, a1, a2, b1, b2;
  currents(X, k, eps, &cx);
  currents(Y, k, eps, &cy);
  tx = qsq(X);
  ty = tyv != 0.0 ? tyv : qsq(Y);
  if (axial) {
    /* the struck line's current in the axial gauge n = X's incoming
    ** momentum: j' = j - (j.n / q.n) q, q = Y's momentum transfer; by the
    ** Ward identity of X's radiating current R_X.q = 0, R_X.j' = R_X.j */
    double qv[4], n[4], qn;
    int mu;
    for (mu = 0; mu < 4; mu++) {
      qv[mu] = qvy != NULL ? qvy[mu] : Y->pout[mu] - Y->pin[mu];
      n[mu] = X->pin[mu];
    }
    qn = dot(qv, n);
    if (fabs(qn) >= AXIAL_MIN * (fabs(qv[0] * n[0])
                                + sqrt((qv[1] * qv[1] + qv[2] * qv[2]
                                        + qv[3] * qv[3])
                                       * (n[1] * n[1] + n[2] * n[2]
                                          + n[3] * n[3])))) {
      for (b1 = 0; b1 < cy.nso; b1++)
        for (b2 = 0; b2 < cy.nsi; b2++) {
          double complex jn = cy.j[0][b1][b2] * n[0]
                              - cy.j[1][b1][b2] * n[1]
                              - cy.j[2][b1][b2] * n[2]
                              - cy.j[3][b1][b2] * n[3];
          for (mu = 0; mu < 4; mu++)
            cyj[mu][b1][b2] = cy.j[mu][b1][b2] - jn / qn * qv[mu];
        }
    } else
      memcpy(cyj, cy.j, sizeof cyj);
  } else
    memcpy(cyj, cy.j, sizeof cyj);
  for (pol = 0; pol < 2; pol++)
    for (a1 = 0; a1 < cx.nso; a1++)
      for (a2 = 0; a2 < cx.nsi; a2++)
        for (b1 = 0; b1 < cy.nso; b1++)
          for (b2 = 0; b2 < cy.nsi; b2++) {
            int s = a1 * wt[lab[0]] + a2 * wt[lab[1]] + b1 * wt[lab[2]]
                    + b2 * wt[lab[3]];
            M[pol][s] += sign * qx * qy
                         * (rx * qx * mdot(cx.r[pol], cyj, a1, a2, b1, b2) / ty
                            + ry * qy * mdot(cx.j, cy.r[pol], a1, a2, b1, b2)
                              / tx);
          }
}

void bl_eb_amplitudes (const bl_ebrems *c, const double p[5][4],
                       const double eps[2][4],
                       double complex M[2][BL_EB_NAMP]) {
  bl_eb_amplitudes_q(c, p, eps, NULL, M);
}

void bl_eb_amplitudes_q (const bl_ebrems *c, const double p[5][4],
                         const double eps[2][4], const bl_ebq *qy,
                         double complex M[2][BL_EB_NAMP]) {
  double q24 = qy != NULL ? qy->t[0] : 0.0, q23 = qy != NULL ? qy->t[1] : 0.0;
  const double *v24 = qy != NULL && qy->nv >= 1 ? qy->v[0] : NULL;
  const double *v23 = qy != NULL && qy->nv >= 2 ? qy->v[1] : NULL;
  int ax = c->e0 >= AXIAL_GAMMA * c->m;
  const double e2 = 4.0 * BL_PI * BL_ALPHA, e3 = e2 * sqrt(e2);
  line X = {0}, Y = {0};
  int pol, s, sc = c->spin2 == 0;
  memset(M, 0, 2 * BL_EB_NAMP * sizeof M[0][0]);
  if (c->kind == BL_EBREMS_POSITRON) {
    static const int lt[4] = {0, 2, 3, 1}, ls[4] = {0, 1, 3, 2};
    /* scattering channel: vbar(p1) ... v(p3), ubar(p4) ... u(p2) */
    set_end(&X, p, 1, 0, 1.0, 1, 0);
    set_end(&X, p, 0, 2, 1.0, 1, 0);
    set_end(&Y, p, 1, 3, 1.0, 0, 0);
    set_end(&Y, p, 0, 1, 1.0, 0, 0);
    add_pair(&X, -1.0, &Y, -1.0, q24, v24, ax, lt, 1.0, 1.0, 1.0, p[4], eps,
             M);
    /* annihilation channel: vbar(p1) ... u(p2), ubar(p4) ... v(p3) */
    set_end(&X, p, 1, 0, 1.0, 1, 0);
    set_end(&X, p, 0, 1, 1.0, 0, 0);
    set_end(&Y, p, 1, 3, 1.0, 0, 0);
    set_end(&Y, p, 0, 2, 1.0, 1, 0);
    add_pair(&X, -1.0, &Y, -1.0, 0.0, NULL, ax, ls, -1.0, 1.0, 1.0, p[4], eps,
             M);
  } else {
    static const int ld[4] = {2, 0, 3, 1}, lx[4] = {3, 0, 2, 1};
    set_end(&X, p, 1, 2, c->m, 0, sc);
    set_end(&X, p, 0, 0, c->m, 0, sc);
    set_end(&Y, p, 1, 3, 1.0, 0, 0);
    set_end(&Y, p, 0, 1, 1.0, 0, 0);
    add_pair(&X, c->z, &Y, -1.0, q24, v24, ax, ld, 1.0,
             c->kind != BL_EBREMS_OTHER
             || c->radiate != BL_EBREMS_RAD_ELECTRON ? 1.0 : 0.0,
             c->kind != BL_EBREMS_OTHER
             || c->radiate != BL_EBREMS_RAD_PROJECTILE ? 1.0 : 0.0,
             p[4], eps, M);
    if (c->kind == BL_EBREMS_ELECTRON) {
      set_end(&X, p, 1, 3, 1.0, 0, 0);
      set_end(&X, p, 0, 0, 1.0, 0, 0);
      set_end(&Y, p, 1, 2, 1.0, 0, 0);
      set_end(&Y, p, 0, 1, 1.0, 0, 0);
      add_pair(&X, -1.0, &Y, -1.0, q23, v23, ax, lx, -1.0, 1.0, 1.0, p[4], eps,
               M);
    }
  }
  for (pol = 0; pol < 2; pol++)
    for (s = 0; s < BL_EB_NAMP; s++)
      M[pol][s] *= e3;
}

void bl_eb_polarisations (const double k[4], double eps[2][4]) {
  double n[3], a[3] = {0, 0, 0}, e1[3], e2[3], kk, d, nn;
  int i, j = 0;
  kk = sqrt(k[1] * k[1] + k[2] * k[2] + k[3] * k[3]);
  for (i = 0; i < 3; i++)
    n[i] = k[i + 1] / kk;
  for (i = 1; i < 3; i++)
    if (fabs(n[i]) < fabs(n[j]))
      j = i;
  a[j] = 1.0;
  d = n[j];
  for (i = 0; i < 3; i++)
    e1[i] = a[i] - d * n[i];
  nn = sqrt(e1[0] * e1[0] + e1[1] * e1[1] + e1[2] * e1[2]);
  for (i = 0; i < 3; i++)
    e1[i] /= nn;
  e2[0] = n[1] * e1[2] - n[2] * e1[1];
  e2[1] = n[2] * e1[0] - n[0] * e1[2];
  e2[2] = n[0] * e1[1] - n[1] * e1[0];
  eps[0][0] = eps[1][0] = 0.0;
  for (i = 0; i < 3; i++) {
    eps[0][i + 1] = e1[i];
    eps[1][i + 1] = e2[i];
  }
}

double bl_eb_msq (const bl_ebrems *c, const double p[5][4]) {
  return bl_eb_msq_q(c, p, NULL);
}

double bl_eb_msq_q (const bl_ebrems *c, const double p[5][4],
                    const bl_ebq *qy) {
  double eps[2][4], sum = 0.0;
  double complex M[2][BL_EB_NAMP];
  int pol, s;
  bl_eb_polarisations(p[4], eps);
  bl_eb_amplitudes_q(c, p, eps, qy, M);
  for (pol = 0; pol < 2; pol++)
    for (s = 0; s < BL_EB_NAMP; s++)
      sum += creal(M[pol][s]) * creal(M[pol][s])
             + cimag(M[pol][s]) * cimag(M[pol][s]);
  return sum;
}

/* ---- kinematics of one point ---------------------------------------- */

int bl_eb_frame_set (const bl_ebrems *c, double k, double hk, double sk,
                     bl_ebframe *f) {
  double m = c->m, ck = 1.0 - hk, D, kap, kpar, kz, r, dc;
  int i;
  /* kappa = p1.k = k (E0 - p0 + p0 h_k), E0 - p0 = m^2 / (E0 + p0) */
  kap = k * (m * m / (c->e0 + c->p0) + c->p0 * hk);
  /* W^2 - (m + 1)^2 = 2 T - 2 k - 2 kappa */
  D = 2.0 * (c->t0 - k - kap);
  if (!(D > 0.0))
    return -1;
  f->k = k; f->hk = hk; f->sk = sk; f->ck = ck;
  f->kap = kap;
  f->w2 = (m + 1.0) * (m + 1.0) + D;
  f->w = sqrt(f->w2);
  f->ps = sqrt(D * (D + 4.0 * m)) / (2.0 * f->w);
  f->e3s = (2.0 * m * m + 2.0 * m + D) / (2.0 * f->w);
  f->e4s = (2.0 + 2.0 * m + D) / (2.0 * f->w);
  f->P0 = c->e0 + 1.0 - k;
  f->ez[0] = -k * sk;
  f->ez[1] = 0.0;
  f->ez[2] = c->p0 - k * ck;
  f->Pn = sqrt(f->ez[0] * f->ez[0] + f->ez[2] * f->ez[2]);
  for (i = 0; i < 3; i++)
    f->ez[i] /= f->Pn;
  f->g = f->P0 / f->w;
  f->gb = f->Pn / f->w;
  /* x axis in the (P, k) plane, towards the photon: k has the transverse
  ** component k sk p0 / |P| >= 0 along it */
  f->ex[0] = f->ez[2]; f->ex[1] = 0.0; f->ex[2] = -f->ez[0];
  if (sk * f->ex[0] + ck * f->ex[2] < 0.0)
    for (i = 0; i < 3; i++)
      f->ex[i] = -f->ex[i];
  f->ey[0] = f->ez[1] * f->ex[2] - f->ez[2] * f->ex[1];
  f->ey[1] = f->ez[2] * f->ex[0] - f->ez[0] * f->ex[2];
  f->ey[2] = f->ez[0] * f->ex[1] - f->ez[1] * f->ex[0];
  /* the photon in the pair frame: energy P.k / W = (kappa + k) / W, the
  ** transverse part unchanged, the longitudinal one from the mass shell
  ** (its sign from the boost) */
  f->kT = k * sk * c->p0 / f->Pn;
  f->k0s = (kap + k) / f->w;
  kpar = k * (c->p0 * ck - k) / f->Pn;
  kz = sqrt(fmax((f->k0s - f->kT) * (f->k0s + f->kT), 0.0));
  f->kzs = copysign(kz, f->g * kpar - f->gb * k);
  f->sks = f->kT / f->k0s;
  f->cks = f->kzs / f->k0s;
  f->E1s = (m * m + c->e0 - kap) / f->w;
  /* The smallest recoil T4 (struck electron; hs = 0): with cosh a = g,
  ** cosh b = e4s, g - e4s = kappa / W exactly and
  ** tanh((a - b) / 2) = (g - e4s) / (gb + p*), so
  ** T4min = cosh(a - b) - 1 = 2 r / (1 - r), r = tanh^2: no cancellation. */
  dc = kap / f->w;
  r = dc / (f->gb + f->ps);
  r *= r;
  f->t4min = 2.0 * r / (1.0 - r);
  /* the same for the projectile's smallest kinetic energy (hs = 2) when it
  ** has the electron's mass: e3s = e4s */
  f->t3min = c->m == 1.0 ? f->t4min
             : f->g * f->e3s - f->gb * f->ps - m;   /* not used then */
  return 0;
}

void bl_eb_point_at (const bl_ebrems *c, const bl_ebframe *f, double hs,
                     double hs2, double tx, double ty, bl_ebpoint *x) {
  double m = c->m, cz = hs < 1.0 ? 1.0 - hs : hs2 - 1.0, pl3, pl4, t[3];
  double t4 = f->t4min + f->gb * f->ps * hs, t3;
  int i;
  for (i = 0; i < 3; i++)
    t[i] = f->ps * (tx * f->ex[i] + ty * f->ey[i]);
  pl3 = f->gb * f->e3s + f->g * f->ps * cz;
  pl4 = f->gb * f->e4s - f->g * f->ps * cz;
  x->p[0][0] = c->e0; x->p[0][1] = 0.0; x->p[0][2] = 0.0; x->p[0][3] = c->p0;
  x->p[1][0] = 1.0; x->p[1][1] = 0.0; x->p[1][2] = 0.0; x->p[1][3] = 0.0;
  /* E3 = m + T3min + gamma beta p* (2 - hs), E4 = 1 + T4 */
  t3 = f->t3min + f->gb * f->ps * hs2;
  x->p[2][0] = c->m == 1.0 ? m + t3 : f->g * f->e3s + f->gb * f->ps * cz;
  /* E4 = gamma E4* - gamma beta p* cos: its smallest value (cos = 1) is
  ** (E4*^2 W^2 + |P|^2) / (W (P0 E4* + |P| p*)), free of cancellation */
  x->p[3][0] = (f->e4s * f->e4s * f->w2 + f->Pn * f->Pn)
               / (f->w * (f->P0 * f->e4s + f->Pn * f->ps))
               + f->gb * f->ps * hs;
  for (i = 0; i < 3; i++) {
    x->p[2][i + 1] = pl3 * f->ez[i] + t[i];
    x->p[3][i + 1] = pl4 * f->ez[i] - t[i];
  }
  x->p[4][0] = f->k; x->p[4][1] = f->k * f->sk; x->p[4][2] = 0.0;
  x->p[4][3] = f->k * f->ck;
  /* the same point in the pair frame, axes (ex, ey, ez) */
  x->f[0][0] = f->E1s; x->f[0][1] = f->kT; x->f[0][2] = 0.0;
  x->f[0][3] = f->kzs + f->gb;
  x->f[1][0] = f->g; x->f[1][1] = 0.0; x->f[1][2] = 0.0; x->f[1][3] = -f->gb;
  x->f[2][0] = f->e3s; x->f[2][1] = f->ps * tx; x->f[2][2] = f->ps * ty;
  x->f[2][3] = f->ps * cz;
  x->f[3][0] = f->e4s; x->f[3][1] = -f->ps * tx; x->f[3][2] = -f->ps * ty;
  x->f[3][3] = -f->ps * cz;
  x->f[4][0] = f->k0s; x->f[4][1] = f->kT; x->f[4][2] = 0.0;
  x->f[4][3] = f->kzs;
  /* the virtual photons of the struck electron line, exactly */
  x->q24 = -2.0 * t4;
  x->q23 = c->m == 1.0 ? -2.0 * t3 : m * m + 1.0 - 2.0 * x->p[2][0];
  /* and their vectors in the pair frame: with g - E4* = kappa / W = dc
  ** and gb^2 - p*^2 = g^2 - E4*^2 (both of mass m_e), gb - p* =
  ** dc (g + E4*) / (gb + p*), so the longitudinal part near its pole,
  ** gb - p* cos = (gb - p*) + p* (1 - cos), keeps its digits */
  {
    double dc = f->kap / f->w;
    double gmp = dc * (f->g + f->e4s) / (f->gb + f->ps);
    x->q.t[0] = x->q24;
    x->q.t[1] = x->q23;
    x->q.v[0][0] = -dc;
    x->q.v[0][1] = -f->ps * tx;
    x->q.v[0][2] = -f->ps * ty;
    x->q.v[0][3] = hs < 1.0 ? gmp + f->ps * hs : f->gb - f->ps * cz;
    x->q.nv = 1;
    if (c->m == 1.0) {
      /* p3 - p2: E3* = E4*; near hs = 2, cos = hs2 - 1 */
      x->q.v[1][0] = -dc;
      x->q.v[1][1] = f->ps * tx;
      x->q.v[1][2] = f->ps * ty;
      x->q.v[1][3] = hs > 1.0 ? gmp + f->ps * hs2 : f->gb + f->ps * cz;
      x->q.nv = 2;
    }
  }
  x->pstar = f->ps;
  x->w = f->w;
}

int bl_eb_point_set (const bl_ebrems *c, double k, double hk, double sk,
                     double hs, double ss, double phis, bl_ebpoint *x) {
  bl_ebframe f;
  if (bl_eb_frame_set(c, k, hk, sk, &f) != 0)
    return -1;
  bl_eb_point_at(c, &f, hs, 2.0 - hs, ss * cos(phis), ss * sin(phis), x);
  return 0;
}

double bl_eb_unit (void) {
  double lam = BL_HBARC_MEVFM / BL_ME_MEV;   /* fm */
  return lam * lam / BL_FM2_PER_MB / BL_ME_MEV;
}

/* S(q)/Z = sum_i alpha_i q^2 / (b_i^2 + q^2), q^2 = |p4|^2 = T4 (T4 + 2)
** from the exact T4 = -q24 / 2 of the point (lab = atom rest frame); for
** e- e- the slower final electron's, T3 = -q23 / 2 (bl_ebrems.h).  A
** fitted form (the Hartree-Fock one has terms of both signs) is not let
** below 0. */
double bl_eb_binding (const bl_ebrems *c, const bl_ebpoint *x) {
  double t = -0.5 * x->q24, q2, w = 0.0;
  int i;
  if (c->Z == 0)
    return 1.0;
  if (c->kind == BL_EBREMS_ELECTRON && -0.5 * x->q23 < t)
    t = -0.5 * x->q23;
  q2 = t * (t + 2.0);
  for (i = 0; i < c->inc.n; i++)
    w += c->inc.alpha[i] * q2 / (c->inc.b[i] * c->inc.b[i] + q2);
  return w > 0.0 ? w : 0.0;
}

double bl_eb_d5 (const bl_ebrems *c, const bl_ebpoint *x) {
  /* S / (4 m_e p0) * k / (2 (2 pi)^3) * p* / (16 pi^2 W) * msq / (g_a g_e) */
  double S = c->kind == BL_EBREMS_ELECTRON ? 0.5 : 1.0;
  double ga = c->spin2 + 1.0, k = x->p[4][0];
  double ph = k / (2.0 * 8.0 * BL_PI * BL_PI * BL_PI)
              * x->pstar / (16.0 * BL_PI * BL_PI * x->w);

  /* |M|^2 is invariant: evaluated in the pair frame, where no particle is
  ** faster than ~ sqrt(E0) (the lab's propagators lose ~ 1e-16 gamma^2) */
  return S / (4.0 * c->p0) * ph
         * bl_eb_msq_q(c, (const double (*)[4])x->f, &x->q) / (ga * 2.0)
         * bl_eb_binding(c, x);
}
