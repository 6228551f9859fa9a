/*
** nucsize.c -- nuclear-size correction of the high-energy method, read
** from the table calibrated on the exact Born integral (nuc_table.c)
** See Copyright Notice in LICENSE
**
** A uniform nucleus of radius R cuts the momentum transfers beyond
** q_N = hbar c / R; for a projectile with m R > hbar c that is inside
** the range q ~ m where the small-angle kernels are not exact (the
** constants 4 and 10/3 of phi1, phi2 stand for it).  The correction N1,
** N2 to phi1, phi2 is therefore taken from the exact Born integral itself,
** as the difference uniform - point of the bare nucleus (no screening: the
** two act at momenta 1e4 apart), at high energy where it depends only on
** delta = Delta/m, the spin and x = ln(m R / hbar c):
**   [Born_uniform - Born_point] k / norm = w1(v) N1(delta) - w2(v) N2(delta)
** at two v for spin 1/2 (0.5 and 0.1) and one for spin 0 (whose weights
** are proportional: only N1 - N2/3 enters; N2 = 0).  scripts/fit-nucsize.c
** computes these once per grid node of x (step 0.25, from m R = 1e-3 to
** 1.3e6 hbar c, a probe particle of the node's m R on a nucleus of
** A = 100) at delta = q_N 10^(-3 + j/8) (from NUC_DMIN = 1e-4 where that
** is lower) up to q_N and NUC_TOP, and writes
** them into nuc_table.c (`make nuc-table`) with the interpolation error it
** measured at the midpoints; nothing is integrated at run time.  Between
** the nodes N is cubic in ln delta, outside them constant (below the first
** node, delta <= 1e-3 q_N and <= 1e-4, the change is O(delta/q_N) and
** O(delta) < 1e-3 of N; above the last one, delta >
** q_N, the high-energy form does not hold and says so: bl_he_valid).  A
** case takes four grid nodes around its x with cubic Lagrange weights.
** Below m R = 1e-3 hbar c (electrons on hydrogen are at 3e-3) the effect
** is below 1e-5 and left out; beyond the grid (m R > 1.3e6 hbar c) the
** last cubic is extrapolated and bl_he_valid refuses the method.
** With the nucleus's incoherent part (BL_NUCLEUS_INCOHERENT) the Born
** target factor is (1 - 1/Z) times the uniform one plus 1/Z times the
** point one (up to the screening of the incoherent part, O(F/Z) where
** 1 - F_N is O(q^2 R^2): nothing at these transfers), so N is scaled by
** 1 - 1/Z: Kelner, Kokoulin & Petrukhin's D_n^(1 - 1/Z).
*/

#include <math.h>

#include "methods/internal.h"


/* Cubic Lagrange weights on the nodes 0..3 at s. */
static void lagrange4 (double s, double w[4]) {
  int i, j;
  for (i = 0; i < 4; i++) {
    w[i] = 1.0;
    for (j = 0; j < 4; j++)
      if (j != i)
        w[i] *= (s - j) / (double)(i - j);
  }
}


void bl_nucsize_get (const bl_case *c, bl_he *h) {
  double x = log(c->R * c->particle.mass / BL_HBARC_MEVFM);
  double u = (x - NUC_X0) / NUC_DX, err = 0.0;
  int i0, i, sp = c->particle.spin > 0.25;
  h->nnuc = 0;
  if (!(u >= 0.0))
    return;
  i0 = (int)floor(u) - 1;
  if (i0 < 0)
    i0 = 0;
  if (i0 > NUC_NX - 4)
    i0 = NUC_NX - 4;   /* beyond the grid: its last cubic */
  lagrange4(u - i0, h->nucw);
  for (i = 0; i < 4; i++) {
    h->nuc[i] = &bl_nuc_table[sp][i0 + i];
    err += fabs(h->nucw[i]) * h->nuc[i]->err;
  }
  h->nnuc = 4;
  if (c->opts.nucleus == BL_NUCLEUS_INCOHERENT)
    for (i = 0; i < 4; i++)   /* (1 - 1/Z) uniform + (1/Z) point */
      h->nucw[i] *= 1.0 - 1.0 / c->Z;
  err *= c->opts.nucleus == BL_NUCLEUS_INCOHERENT ? 1.0 - 1.0 / c->Z : 1.0;
  /* maxerr is that of H, which enters phi four times */
  h->maxerr = fmax(h->maxerr, 0.25 * err);
}


/* N1, N2 at delta: cubic in ln delta, constant outside the nodes. */
void bl_nucsize_at (const bl_nuctab *t, double delta, double *N1,
                    double *N2) {
  double s = (log(delta) - t->lnd0) / NUC_DLN, w[4];
  int i0, i;
  if (t->n == 1 || s <= 0.0) {
    *N1 = t->N1[0];
    *N2 = t->N2[0];
    return;
  }
  if (s >= t->n - 1) {
    *N1 = t->N1[t->n - 1];
    *N2 = t->N2[t->n - 1];
    return;
  }
  if (t->n < 4) {   /* two or three nodes: linear */
    i0 = (int)s;
    s -= i0;
    *N1 = t->N1[i0] + s * (t->N1[i0 + 1] - t->N1[i0]);
    *N2 = t->N2[i0] + s * (t->N2[i0 + 1] - t->N2[i0]);
    return;
  }
  i0 = (int)floor(s) - 1;
  if (i0 < 0)
    i0 = 0;
  if (i0 > t->n - 4)
    i0 = t->n - 4;
  lagrange4(s - i0, w);
  *N1 = *N2 = 0.0;
  for (i = 0; i < 4; i++) {
    *N1 += w[i] * t->N1[i0 + i];
    *N2 += w[i] * t->N2[i0 + i];
  }
}
