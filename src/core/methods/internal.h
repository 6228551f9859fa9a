/*
** methods/internal.h -- declarations shared by the files of the methods
** (tables.c, nucsize.c, highenergy.c, complete.c, dispatch.c), not public
** See Copyright Notice in LICENSE
*/

#ifndef BL_METHODS_INTERNAL_H
#define BL_METHODS_INTERNAL_H

#include "corrections/internal.h"

/* What a screening table integrates: the nuclear (elastic) part,
** h = f (2 - f) with f = F/Z, or the atomic electrons, h = 1 - S/Z. */
enum { BL_HETAB_ELASTIC, BL_HETAB_ELECTRONS };

/*
** Screening tables (tables.c).
** bl_hetab_get: the cached table of (kind, y), built on first use (about
**   10 ms) under the cache lock; NULL on allocation failure.
** bl_hetab_lookup: H1 and H2 at u = ln Delta (Delta in MeV).
** bl_hetab_maxerr: the worst interpolation error measured when built.
** bl_hetab_tails: the four moments of h beyond q = m that replace the
**   step at q = m by the exact small-angle kernels (m in MeV).
*/
const bl_hetab *bl_hetab_get (int kind, const bl_yukawa *y);
void bl_hetab_lookup (const bl_hetab *t, double u, double *H1, double *H2);
double bl_hetab_maxerr (const bl_hetab *t);
void bl_hetab_tails (int kind, const bl_yukawa *y, double m, double out[4]);

/*
** Nuclear size (nucsize.c).
** bl_nucsize_get: the four grid nodes of case c and their weights into h
**   (h->nnuc = 0 below the grid), calibrating missing nodes with the Born
**   integral on workspace q; BL_SUCCESS, BL_ENOMEM or a Born failure.
** bl_nucsize_at: N1, N2 of one node at delta = Delta/m.
*/
int bl_nucsize_get (const bl_case *c, bl_quad *q, bl_he *h);
void bl_nucsize_at (const bl_nuctab *t, double delta, double *N1,
                    double *N2);

/* A cleared result of `method` (dispatch.c). */
void bl_method_clear (bl_result *out, int method);

#endif
