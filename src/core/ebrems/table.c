/*
** table.c -- the bound electron term of electrons and positrons from the
** generated ratio table (eb_table.c): grid nodes and interpolation
** See Copyright Notice in LICENSE
**
** R(kind, Z, T, u) = [bound electron term, bl_ebrems_dk_e with the
** Hartree-Fock S(q)/Z] / [static-charge electron term of the Born target
** factor, S(q)/(Z^2 q^4)], per atomic electron, at u = y / y_max, y = k/T,
** y_max the end point on a free electron at rest.  Interpolation: linear
** in ln Z between the Z nodes (held outside 1..82), of ln R four-point
** Lagrange in ln T (held below 1 keV; above 1 GeV blended linearly in ln T
** to 1 at 100 GeV, then 1) and in ln(1 - u) (held below the first node;
** from the last to R = 0 at u = 1 by tip()); never below 0.  Every piece is
** continuous, so R is continuous in Z, T and k
** (DEVELOPERS.md, "Electron-target bremsstrahlung", "Wired in").
*/

#include <math.h>
#include <pthread.h>

#include "brakelight/bl_const.h"
#include "brakelight/bl_dcs.h"
#include "ebrems/table.h"

const int bl_ebt_z[EBT_NZ] = {1, 4, 8, 20, 82};
const double bl_ebt_u[EBT_NU] = {0.005, 0.02, 0.04, 0.08, 0.18, 0.3, 0.45,
                                 0.6, 0.75, 0.87, 0.95, 0.985, 0.997};


/* ln R of the table and ln(1 - u) of the nodes, made once (thread-safe) */
static double lnr[2][EBT_NZ][EBT_NT][EBT_NU], lnu[EBT_NU];
typedef char ebt_row_fits[EBT_NU <= BL_EBT_ROW ? 1 : -1];
static pthread_once_t once = PTHREAD_ONCE_INIT;

static void make_logs (void) {
  int k, z, t, u;
  for (k = 0; k < 2; k++)
    for (z = 0; z < EBT_NZ; z++)
      for (t = 0; t < EBT_NT; t++)
        for (u = 0; u < EBT_NU; u++)
          lnr[k][z][t][u] = log(bl_ebt_r[k][z][t][u]);
  for (u = 0; u < EBT_NU; u++)
    lnu[u] = log1p(-bl_ebt_u[u]);
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
static void row_t (int kind, int iz, double lt, double *row) {
  double x = (lt - EBT_LT0) / EBT_DLT, xs[4], wt[4];
  int it, st, a, j;
  if (x < 0.0)
    x = 0.0;
  if (x > EBT_NT - 1)
    x = EBT_NT - 1;
  it = (int)x;
  if (it > EBT_NT - 2)
    it = EBT_NT - 2;
  st = stencil(it, EBT_NT);
  for (a = 0; a < 4; a++)
    xs[a] = st + a;
  lagrange4(xs, x, wt);
  for (j = 0; j < EBT_NU; j++) {
    row[j] = 0.0;
    for (a = 0; a < 4; a++)
      row[j] += wt[a] * lnr[kind][iz][st + a][j];
  }
}


void bl_ebt_rows (int kind, int Z, double T, double rows[2][BL_EBT_ROW],
                  double *wz, double *wb) {
  double lt = log(T), top = EBT_LT0 + EBT_DLT * (EBT_NT - 1);
  int iz;
  pthread_once(&once, make_logs);
  if (kind < 0 || kind > 1)
    kind = 0;
  if (Z <= bl_ebt_z[0] || Z >= bl_ebt_z[EBT_NZ - 1]) {
    iz = Z <= bl_ebt_z[0] ? 0 : EBT_NZ - 1;
    row_t(kind, iz, lt, rows[0]);
    row_t(kind, iz, lt, rows[1]);
    *wz = 0.0;
  }
  else {
    for (iz = 0; Z > bl_ebt_z[iz + 1]; iz++)
      ;
    row_t(kind, iz, lt, rows[0]);
    row_t(kind, iz + 1, lt, rows[1]);
    *wz = (log((double)Z) - log((double)bl_ebt_z[iz]))
          / (log((double)bl_ebt_z[iz + 1]) - log((double)bl_ebt_z[iz]));
  }
  *wb = lt > top ? fmin((lt - top) / EBT_LBLEND, 1.0) : 0.0;
}


double bl_ebt_eval (const double rows[2][BL_EBT_ROW], double wz, double wb,
                    double T, double u) {
  double wu[4], v[2], lim = 1.0, r;
  int iu, su, b, z;
  if (!(u < 1.0))
    return 0.0;
  if (u > bl_ebt_u[EBT_NU - 1]) {   /* the last stretch: tip() */
    lim = tip(T, u);
    for (z = 0; z < 2; z++)
      v[z] = exp(rows[z][EBT_NU - 1]) * lim;
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
    v[z] += wb * (lim - v[z]);
  r = (1.0 - wz) * v[0] + wz * v[1];
  return fmax(r, 0.0);
}
