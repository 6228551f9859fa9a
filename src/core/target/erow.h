/*
** erow.h -- the exact bound electron term of a projectile outside the
** other-projectile table (c->ebexact) on a row of photon energies, made
** once per integral over k and interpolated there
** See Copyright Notice in LICENSE
*/

#ifndef BL_EROW_H
#define BL_EROW_H

#include "brakelight/bl_dcs.h"
#include "brakelight/bl_quad.h"

#define BL_EROW_MAX 48   /* most nodes of a row */

/* One element's row: Z times bl_ebrems_dk_e at the nodes. */
typedef struct bl_erow {
  int n;                  /* nodes; 0: no row (the per-point path) */
  double ekmax;           /* the case's end point k_max (MeV) */
  double x[BL_EROW_MAX];  /* ln(u / (1 - u)), u = k / k_max, increasing */
  double y[BL_EROW_MAX];  /* ln of the electron part there (mb/MeV) */
  double r[BL_EROW_MAX];  /* the nodes' relative errors */
  double est[2];          /* estimated relative error of the interpolated
                          ** electron part of the integral, moment 0, 1 */
  double part[2];         /* estimate of that part (mb MeV^moment) */
  unsigned warn;          /* the nodes' warnings (BL_WARN_TOLERANCE) */
} bl_erow;

/*
** The row of case c for the moment (0, 1) of dsigma/dk over (kmin, kmax),
** into *w: none (w->n = 0) unless c takes the exact electron term per
** point (bl_method_dk_e: c->ebexact, electrons on, k_max > 0) and the
** range reaches into (1e-6, 1 - 1e-4) k_max.  Nodes refined until the
** estimated interpolation error of the electron part of the integral is
** at most tol (or BL_EROW_MAX nodes); each node at rtol 1e-3 with q (its
** tolerance restored), the heaviest again at 3e-4 (erow.c).  Status: BL_SUCCESS,
** a hard failure of a node, or BL_EINTR.
*/
int bl_erow_build (const bl_case *c, double kmin, double kmax, int moment,
                   double tol, bl_quad *q, bl_erow *w);

/* The electron part at k from the row into *val (its error *err): 1 where
** the row covers k, 0 where it does not (the per-point path, *val = 0). */
int bl_erow_eval (const bl_erow *w, double k, double *val, double *err);

#endif
