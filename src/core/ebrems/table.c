/*
** table.c -- the bound electron term of electrons, positrons and muons from
** the generated ratio tables (eb_table.c: e-, e+; eb_table_mu.c: mu-, mu+):
** grid nodes and interpolation
** See Copyright Notice in LICENSE
**
** R(kind, Z, T, u) = [bound electron term, bl_ebrems_dk_e with the
** Hartree-Fock S(q)/Z] / [static-charge electron term of the Born target
** factor, S(q)/(Z^2 q^4)], per atomic electron, at u = y / y_max, y = k/T,
** y_max the end point on a free electron at rest.  Interpolation: linear
** in ln Z between the Z nodes (held outside 1..82), of ln R four-point
** Lagrange in ln T and in a variable of u.  e-/e+: held below 1 keV; above
** 1 GeV blended linearly in ln T to 1 at 100 GeV, then 1; in ln(1 - u),
** held below the first node, from the last to R = 0 at u = 1 by tip().
** mu-/mu+: held below 1 MeV; above 10 TeV blended linearly in ln T to 1 at
** 100 TeV; in ln(u / (1 - u)), held below the first node (1e-4), from the
** last node to R = 0 at u = 1 by the power law in 1 - u of the last two
** nodes (tip_mu()).  Never below 0.  Every piece is continuous, so R is
** continuous in Z, T and k (DEVELOPERS.md, "Electron-target
** bremsstrahlung", "Wired in", "Muons").
*/

#include <math.h>
#include <pthread.h>

#include "brakelight/bl_const.h"
#include "brakelight/bl_dcs.h"
#include "ebrems/table.h"

const int bl_ebt_z[EBT_NZ] = {1, 4, 8, 20, 82};
const double bl_ebt_u[EBT_NU] = {0.005, 0.02, 0.04, 0.08, 0.18, 0.3, 0.45,
                                 0.6, 0.75, 0.87, 0.95, 0.985, 0.997};
/* muons: about uniform in ln(u / (1 - u)), steps 1-1.6 (DEVELOPERS.md,
** "Muons": R falls by 10^4-10^8 from the first node to the last) */
const double bl_ebm_u[EBM_NU] = {1e-4, 4e-4, 1.5e-3, 5e-3, 0.015, 0.04, 0.1,
                                 0.2, 0.35, 0.5, 0.65, 0.78, 0.88, 0.95,
                                 0.985, 0.997};

/* other projectiles: the muons' nodes from 1e-3 (DEVELOPERS.md, "Other
** projectiles") */
const int bl_ebh_z[EBH_NZ] = {1, 8, 82};
const double bl_ebh_u[EBH_NU] = {1e-3, 4e-3, 0.015, 0.04, 0.1, 0.2, 0.35,
                                 0.5, 0.65, 0.78, 0.88, 0.95, 0.985, 0.997};

/* ln R of the tables and the interpolation variable of the u nodes, made
** once (thread-safe) */
static double lnr[2][EBT_NZ][EBT_NT][EBT_NU], lnu[EBT_NU];
static double lnm[2][EBT_NZ][EBM_NT][EBM_NU], lgm[EBM_NU];
/* other projectiles: ln R_P, ln R_E - 2 ln(M / EBH_M0), c_I = R_I / (2
** sqrt(R_P R_E)) (in [-1, 1] by Cauchy-Schwarz) at the nodes */
static double lnh[EBH_NS][EBH_NM][EBH_NZ][EBH_NT][EBH_NU][3], lgh[EBH_NU];
typedef char ebt_row_fits[EBT_NU <= BL_EBT_ROW ? 1 : -1];
typedef char ebm_row_fits[EBM_NU <= BL_EBT_ROW ? 1 : -1];
static pthread_once_t once = PTHREAD_ONCE_INIT;

static void make_logs (void) {
  int k, z, t, u;
  for (k = 0; k < 2; k++)
    for (z = 0; z < EBT_NZ; z++) {
      for (t = 0; t < EBT_NT; t++)
        for (u = 0; u < EBT_NU; u++)
          lnr[k][z][t][u] = log(bl_ebt_r[k][z][t][u]);
      for (t = 0; t < EBM_NT; t++)
        for (u = 0; u < EBM_NU; u++)
          lnm[k][z][t][u] = log(bl_ebm_r[k][z][t][u]);
    }
  for (u = 0; u < EBT_NU; u++)
    lnu[u] = log1p(-bl_ebt_u[u]);
  for (u = 0; u < EBM_NU; u++)
    lgm[u] = log(bl_ebm_u[u]) - log1p(-bl_ebm_u[u]);
  for (u = 0; u < EBH_NU; u++)
    lgh[u] = log(bl_ebh_u[u]) - log1p(-bl_ebh_u[u]);
  for (k = 0; k < EBH_NS; k++) {
    int m;
    for (m = 0; m < EBH_NM; m++) {
      double sc = 2.0 * (EBH_LM0 + EBH_DLM * m - log(EBH_M0));
      for (z = 0; z < EBH_NZ; z++)
        for (t = 0; t < EBH_NT; t++)
          for (u = 0; u < EBH_NU; u++) {
            const double *r = bl_ebh_r[k][m][z][t][u];
            double P = fmax(r[0], 1e-300), E = fmax(r[2], 1e-300);
            double *o = lnh[k][m][z][t][u];
            o[0] = log(P);
            o[1] = log(E) - sc;
            o[2] = fmax(-1.0, fmin(1.0, r[1] / (2.0 * sqrt(P * E))));
          }
    }
  }
}


/* One table: its T grid, u nodes and ln R [Z][T][u]. */
typedef struct grid {
  int nt, nu;
  double lt0, dlt, lblend;
  const double *u, *x;   /* the u nodes and their interpolation variable */
  const double *lr;      /* ln R of the kind, [EBT_NZ][nt][nu] */
} grid;

static void get_grid (int kind, grid *g) {
  if (kind == BL_EBT_MUON || kind == BL_EBT_ANTIMUON) {
    g->nt = EBM_NT;
    g->nu = EBM_NU;
    g->lt0 = EBM_LT0;
    g->dlt = EBM_DLT;
    g->lblend = EBM_LBLEND;
    g->u = bl_ebm_u;
    g->x = lgm;
    g->lr = &lnm[kind - BL_EBT_MUON][0][0][0];
  }
  else {
    kind = kind == BL_EBT_POSITRON;
    g->nt = EBT_NT;
    g->nu = EBT_NU;
    g->lt0 = EBT_LT0;
    g->dlt = EBT_DLT;
    g->lblend = EBT_LBLEND;
    g->u = bl_ebt_u;
    g->x = lnu;
    g->lr = &lnr[kind][0][0][0];
  }
}

double bl_ebt_ulast (int kind) {
  return kind == BL_EBT_OTHER ? bl_ebh_u[EBH_NU - 1]
         : kind == BL_EBT_MUON || kind == BL_EBT_ANTIMUON
         ? bl_ebm_u[EBM_NU - 1] : bl_ebt_u[EBT_NU - 1];
}


/* Four-point Lagrange weights at x on nodes xs[0..3]. */
static void lagrange4 (const double *xs, double x, double w[4]) {
  int i, j;
  for (i = 0; i < 4; i++) {
    w[i] = 1.0;
    for (j = 0; j < 4; j++)
      if (j != i)
        w[i] *= (x - xs[j]) / (xs[i] - xs[j]);
  }
}


/*
** Beyond the last node u_l, to the end point: R(u_l) g(u), g = h(x)/h(x_l),
** h(x) = sqrt(x / (1 + x)), x = (1 - u)/delta, delta = EBT_TIPW m_e / T.
** The pair p3 + p4 closes there (its phase space p* ~ sqrt of the distance
** to the end point) over a width in y of order m_e / T; EBT_TIPW = 5
** matches the table's own fall from u = 0.985 to 0.997 at 0.1-1 GeV to
** 30 %.  A model of the last 0.3 % of k_max, continuous, 0 at u = 1.
*/
static double tip (double T, double u) {
  double d = EBT_TIPW * BL_ME_MEV / T, x = (1.0 - u) / d;
  double xl = (1.0 - bl_ebt_u[EBT_NU - 1]) / d;
  return sqrt(x / (1.0 + x)) / sqrt(xl / (1.0 + xl));
}


/* First node of the four-point stencil around interval [i, i+1] of n. */
static int stencil (int i, int n) {
  int s = i - 1;
  if (s < 0)
    s = 0;
  if (s > n - 4)
    s = n - 4;
  return s;
}


/* ln R at every u node for Z node iz at ln T (held outside the table). */
static void row_t (const grid *g, int iz, double lt, double *row) {
  double x = (lt - g->lt0) / g->dlt, xs[4], wt[4];
  int it, st, a, j;
  if (x < 0.0)
    x = 0.0;
  if (x > g->nt - 1)
    x = g->nt - 1;
  it = (int)x;
  if (it > g->nt - 2)
    it = g->nt - 2;
  st = stencil(it, g->nt);
  for (a = 0; a < 4; a++)
    xs[a] = st + a;
  lagrange4(xs, x, wt);
  for (j = 0; j < g->nu; j++) {
    row[j] = 0.0;
    for (a = 0; a < 4; a++)
      row[j] += wt[a] * g->lr[((size_t)iz * g->nt + st + a) * g->nu + j];
  }
}


void bl_ebt_rows (int kind, int Z, double T, double rows[2][BL_EBT_ROW],
                  double *wz, double *wb) {
  double lt = log(T), top;
  grid g;
  int iz;
  pthread_once(&once, make_logs);
  if (kind < 0 || kind >= BL_EBT_NKIND)
    kind = BL_EBT_ELECTRON;
  get_grid(kind, &g);
  top = g.lt0 + g.dlt * (g.nt - 1);
  if (Z <= bl_ebt_z[0] || Z >= bl_ebt_z[EBT_NZ - 1]) {
    iz = Z <= bl_ebt_z[0] ? 0 : EBT_NZ - 1;
    row_t(&g, iz, lt, rows[0]);
    row_t(&g, iz, lt, rows[1]);
    *wz = 0.0;
  }
  else {
    for (iz = 0; Z > bl_ebt_z[iz + 1]; iz++)
      ;
    row_t(&g, iz, lt, rows[0]);
    row_t(&g, iz + 1, lt, rows[1]);
    *wz = (log((double)Z) - log((double)bl_ebt_z[iz]))
          / (log((double)bl_ebt_z[iz + 1]) - log((double)bl_ebt_z[iz]));
  }
  *wb = lt > top ? fmin((lt - top) / g.lblend, 1.0) : 0.0;
}


/*
** Muons, beyond the last node u_l: R(u_l) ((1 - u)/(1 - u_l))^p, p the
** slope of ln R against ln(1 - u) between the last two nodes (at least
** EBM_PMIN).  Measured against fresh integrals (DEVELOPERS.md, "Muons"):
** within 36 % at u = 0.999 and a factor 2.3 at 0.9997 (1 MeV ... 1 TeV),
** where R is 1e-7 ... 1e-2 of its value at small u.
*/
#define EBM_PMIN 0.25
static double tip_mu (const double *row, double u) {
  double p = (row[EBM_NU - 1] - row[EBM_NU - 2])
             / (log1p(-bl_ebm_u[EBM_NU - 1]) - log1p(-bl_ebm_u[EBM_NU - 2]));
  if (!(p > EBM_PMIN))
    p = EBM_PMIN;
  return pow((1.0 - u) / (1.0 - bl_ebm_u[EBM_NU - 1]), p);
}


double bl_ebt_eval (int kind, const double rows[2][BL_EBT_ROW], double wz,
                    double wb, double T, double u) {
  double wu[4], v[2], lim[2] = {1.0, 1.0}, r;
  int iu, su, b, z;
  if (!(u < 1.0))
    return 0.0;
  if (kind == BL_EBT_MUON || kind == BL_EBT_ANTIMUON) {
    if (u > bl_ebm_u[EBM_NU - 1]) {   /* the last stretch: tip_mu() */
      for (z = 0; z < 2; z++) {
        lim[z] = tip_mu(rows[z], u);
        v[z] = exp(rows[z][EBM_NU - 1]) * lim[z];
      }
    }
    else {
      double x, uu = u < bl_ebm_u[0] ? bl_ebm_u[0] : u;
      x = log(uu) - log1p(-uu);
      for (iu = 0; iu < EBM_NU - 2 && u > bl_ebm_u[iu + 1]; iu++)
        ;
      su = stencil(iu, EBM_NU);
      lagrange4(lgm + su, x, wu);   /* in ln(u / (1 - u)) */
      for (z = 0; z < 2; z++) {
        double s = 0.0;
        for (b = 0; b < 4; b++)
          s += wu[b] * rows[z][su + b];
        v[z] = exp(s);
      }
    }
    for (z = 0; z < 2; z++)   /* the blend above the top: to 1, or the tip */
      v[z] += wb * (lim[z] - v[z]);
    r = (1.0 - wz) * v[0] + wz * v[1];
    return fmax(r, 0.0);
  }
  if (u > bl_ebt_u[EBT_NU - 1]) {   /* the last stretch: tip() */
    lim[0] = lim[1] = tip(T, u);
    for (z = 0; z < 2; z++)
      v[z] = exp(rows[z][EBT_NU - 1]) * lim[z];
  }
  else {
    double x = log1p(-(u < bl_ebt_u[0] ? bl_ebt_u[0] : u));
    for (iu = 0; iu < EBT_NU - 2 && u > bl_ebt_u[iu + 1]; iu++)
      ;
    su = stencil(iu, EBT_NU);
    lagrange4(lnu + su, x, wu);   /* in ln(1 - u): ln R ~ p ln(1 - u) */
    for (z = 0; z < 2; z++) {
      double s = 0.0;
      for (b = 0; b < 4; b++)
        s += wu[b] * rows[z][su + b];
      v[z] = exp(s);
    }
  }
  for (z = 0; z < 2; z++)   /* the blend above the top: to 1, or tip() */
    v[z] += wb * (lim[z] - v[z]);
  r = (1.0 - wz) * v[0] + wz * v[1];
  return fmax(r, 0.0);
}


/*
** Other projectiles (DEVELOPERS.md, "Other projectiles").  Per case: the
** three parts at every u node, four-point Lagrange in ln M (held outside
** the mass nodes) and in ln tau (held below the first node; T held at
** BL_EBREMS_T_MAX above it), linear in ln Z (held outside 1..82): rows[0]
** ln R_P, rows[1] ln R_E (the mass scaling (M / EBH_M0)^2 put back),
** rows[2] c_I.
*/
/*
** The tau stencil of mass row m at xt (units of EBH_DLT from EBH_LT0):
** its first node *st and weights wt.  The row's first tau node whose T =
** M tau reaches BL_EBREMS_T_MAX holds the values at T = BL_EBREMS_T_MAX
** (those above it copy it), so that node stands at its true abscissa
** xcut = ln(T_MAX / M) and the interpolation uses no node above it; xt
** beyond xcut is held there.  (Interpolating that node as if it stood at
** its own tau put R 3-21 % off between about 4 and 10 TeV: DEVELOPERS.md,
** "Other projectiles".)
*/
static void tau_stencil (int m, double xt, int *st, double wt[4]) {
  double lm = EBH_LM0 + EBH_DLM * m, xs[4];
  double xcut = (log(BL_EBREMS_T_MAX) - lm - EBH_LT0) / EBH_DLT;
  int tc = EBH_NT - 1, it, a;
  while (tc > 0 && xcut <= tc - 1 + 1e-9)
    tc--;                      /* the first node at or above the cut */
  if (xcut > tc)
    xcut = tc;                 /* the cut lies beyond the table */
  if (xt > xcut)
    xt = xcut;
  it = (int)xt < tc - 1 ? (int)xt : tc - 1;
  *st = stencil(it, tc + 1);
  for (a = 0; a < 4; a++)
    xs[a] = *st + a < tc ? *st + a : xcut;
  lagrange4(xs, xt, wt);
}


void bl_ebh_rows (int spin2, double M, int Z, double T,
                  double rows[3][BL_EBT_ROW]) {
  double xm = (log(M) - EBH_LM0) / EBH_DLM, xt, xs[4], wm[4], wt[4][4], wz;
  int im, sm, st[4], iz, a, b, j, q, zz;
  typedef char ebh_row_fits[EBH_NU <= BL_EBT_ROW ? 1 : -1];
  (void)sizeof(ebh_row_fits);
  pthread_once(&once, make_logs);
  spin2 = spin2 != 0;
  if (T > BL_EBREMS_T_MAX)
    T = BL_EBREMS_T_MAX;
  xt = (log(T / M) - EBH_LT0) / EBH_DLT;
  xm = fmax(0.0, fmin(xm, EBH_NM - 1.0));
  xt = fmax(0.0, fmin(xt, EBH_NT - 1.0));
  im = (int)xm < EBH_NM - 2 ? (int)xm : EBH_NM - 2;
  sm = stencil(im, EBH_NM);
  for (a = 0; a < 4; a++) {
    xs[a] = sm + a;
    tau_stencil(sm + a, xt, &st[a], wt[a]);
  }
  lagrange4(xs, xm, wm);
  if (Z <= bl_ebh_z[0] || Z >= bl_ebh_z[EBH_NZ - 1]) {
    iz = Z <= bl_ebh_z[0] ? 0 : EBH_NZ - 2;
    wz = Z <= bl_ebh_z[0] ? 0.0 : 1.0;
  }
  else {
    for (iz = 0; Z > bl_ebh_z[iz + 1]; iz++)
      ;
    wz = (log((double)Z) - log((double)bl_ebh_z[iz]))
         / (log((double)bl_ebh_z[iz + 1]) - log((double)bl_ebh_z[iz]));
  }
  for (j = 0; j < EBH_NU; j++)
    for (q = 0; q < 3; q++) {
      double v[2];
      for (zz = 0; zz < 2; zz++) {
        v[zz] = 0.0;
        for (a = 0; a < 4; a++)
          for (b = 0; b < 4; b++)
            v[zz] += wm[a] * wt[a][b]
                     * lnh[spin2][sm + a][iz + zz][st[a] + b][j][q];
      }
      rows[q][j] = (1.0 - wz) * v[0] + wz * v[1];
    }
  for (j = 0; j < EBH_NU; j++) {
    rows[1][j] += 2.0 * log(M / EBH_M0);
    rows[2][j] = fmax(-1.0, fmin(1.0, rows[2][j]));
  }
}


/* R of charge z from the three parts' interpolated values a = ln R_P,
** b = ln R_E, c = c_I: |sqrt(R_P) + sqrt(R_E)/z|^2 with the cosine c,
** never below 0 for |c| <= 1. */
static double combine (double a, double b, double c, double z) {
  double p = exp(a), e = exp(b);
  return fmax(p + 2.0 * fmax(-1.0, fmin(1.0, c)) * sqrt(p * e) / z
              + e / (z * z), 0.0);
}


double bl_ebh_eval (const double rows[3][BL_EBT_ROW], double z, double u) {
  double wu[4], x, uu, s[3];
  int iu, su, b, q;
  if (!(u < 1.0))
    return 0.0;
  if (u > bl_ebh_u[EBH_NU - 1]) {   /* the last stretch: the power law */
    double rl = combine(rows[0][EBH_NU - 1], rows[1][EBH_NU - 1],
                        rows[2][EBH_NU - 1], z);
    double rp = combine(rows[0][EBH_NU - 2], rows[1][EBH_NU - 2],
                        rows[2][EBH_NU - 2], z);
    double p = (log(rl) - log(rp)) / (log1p(-bl_ebh_u[EBH_NU - 1])
                                      - log1p(-bl_ebh_u[EBH_NU - 2]));
    if (!(p > EBM_PMIN))
      p = EBM_PMIN;
    return rl * pow((1.0 - u) / (1.0 - bl_ebh_u[EBH_NU - 1]), p);
  }
  uu = u < bl_ebh_u[0] ? bl_ebh_u[0] : u;
  x = log(uu) - log1p(-uu);
  for (iu = 0; iu < EBH_NU - 2 && u > bl_ebh_u[iu + 1]; iu++)
    ;
  su = stencil(iu, EBH_NU);
  lagrange4(lgh + su, x, wu);   /* in ln(u / (1 - u)), as for muons */
  for (q = 0; q < 3; q++) {
    s[q] = 0.0;
    for (b = 0; b < 4; b++)
      s[q] += wu[b] * rows[q][su + b];
  }
  return combine(s[0], s[1], s[2], z);
}
